import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize } from '../models/index.ts';

/** What search knows about a piece: the indexed text and the facet values. */
export type PieceDoc = {
  id: number;
  accessionNumber: string;
  title: string;
  objectName: string;
  description: string;
  provenance: string;
  place: string;
  dateText: string;
  /** These lists are shared between documents with the same values (see `shared`): never mutate them. */
  techniques: string[];
  dyestuffs: string[];
  historicalMordants: string[];
  modernMordants: string[];
  fibres: string[];
  centuries: number[];
  status: 'draft' | 'published';
  /** Facet values, lower-cased and de-duplicated once here so facet counting does no string work per query. */
  keys: Record<FacetKey, readonly string[]>;
};
export type FacetKey =
  'dyestuff' | 'historicalMordant' | 'modernMordant' | 'fibre' | 'technique' | 'century' | 'place' | 'status';

// Most pieces share a few value lists ("madder", "cotton"…): one shared array per distinct list keeps the
// documents' heap, and so garbage-collection work, smaller (about 120 MB at 170,000 pieces). Never mutate them.
const pool = new Map<string, unknown[]>();
function shared<T>(list: T[]): T[] {
  const key = JSON.stringify(list);
  const hit = pool.get(key);
  if (hit) return hit as T[];
  // Bounded: free-text values (places) could otherwise grow it for ever; documents keep the arrays they have.
  if (pool.size >= 50_000) pool.clear();
  pool.set(key, list);
  return list;
}
const keyList = (xs: Array<string | number>): readonly string[] =>
  shared([...new Set(xs.map((x) => String(x).trim().toLowerCase()).filter(Boolean))]);
export function facetKeys(d: Omit<PieceDoc, 'keys'>): Record<FacetKey, readonly string[]> {
  return {
    dyestuff: keyList(d.dyestuffs),
    historicalMordant: keyList(d.historicalMordants),
    modernMordant: keyList(d.modernMordants),
    fibre: keyList(d.fibres),
    technique: keyList(d.techniques),
    century: keyList(d.centuries),
    place: keyList(d.place ? [d.place] : []),
    status: keyList([d.status]),
  };
}

/** A reproduction trial: its code, notes and the modern mordants of its substitutions and recipe. */
export type TrialDoc = {
  id: number;
  code: string;
  pieceId: number | null;
  notes: string;
  modernMordants: string[];
  dyestuffs: string[];
};

// MariaDB's JSON is LONGTEXT: raw rows may bring it as a string.
const json = <T>(v: unknown, fallback: T): T => {
  if (v == null) return fallback;
  if (typeof v === 'string') {
    try {
      return JSON.parse(v) as T;
    } catch {
      return fallback;
    }
  }
  return v as T;
};
const names = (v: unknown) =>
  json<Array<{ name?: string } | string>>(v, [])
    .map((x) => (typeof x === 'string' ? x : (x?.name ?? '')))
    .filter(Boolean);

/** Centuries touched by a date range, numbered as 18 for 1700–1799. */
export function centuriesOf(earliest: number | null, latest: number | null): number[] {
  const lo = earliest ?? latest;
  const hi = latest ?? earliest;
  if (lo == null || hi == null) return [];
  const out: number[] = [];
  for (
    let c = Math.floor(Math.min(lo, hi) / 100) + 1;
    c <= Math.floor(Math.max(lo, hi) / 100) + 1 && out.length < 40;
    c++
  )
    out.push(c);
  return out;
}

type PieceRow = Record<string, unknown> & { id: number };

function pieceDoc(r: PieceRow, modern: string[]): PieceDoc {
  const doc = {
    id: r.id,
    accessionNumber: String(r.accessionNumber),
    title: String(r.title),
    objectName: String(r.objectName ?? ''),
    description: String(r.description ?? ''),
    provenance: String(r.provenance ?? ''),
    place: String(r.place ?? ''),
    dateText: String(r.dateText ?? ''),
    techniques: shared(json<string[]>(r.techniques, [])),
    dyestuffs: shared(names(r.dyestuffs)),
    historicalMordants: shared(names(r.historicalMordants)),
    modernMordants: shared(modern),
    fibres: shared(json<string[]>(r.fibres, [])),
    centuries: shared(centuriesOf(r.earliestYear as number | null, r.latestYear as number | null)),
    status: r.status === 'published' ? ('published' as const) : ('draft' as const),
  };
  return { ...doc, keys: facetKeys(doc) };
}

const PIECE_COLS =
  'id, accessionNumber, title, objectName, description, provenance, place, dateText, techniques, dyestuffs, historicalMordants, fibres, earliestYear, latestYear, status';

/** Modern mordants and dyestuffs per trial, from substitutions and recipe ingredients. */
async function trialDocs(where: string, params: unknown[], transaction?: Transaction): Promise<TrialDoc[]> {
  const trials = await sequelize.query<{ id: number; code: string; pieceId: number | null; notes: string | null }>(
    `SELECT id, code, pieceId, notes FROM trials ${where}`,
    { replacements: params, type: QueryTypes.SELECT, transaction },
  );
  if (!trials.length) return [];
  const ids = trials.map((t) => t.id);
  const subs = await sequelize.query<{ trialId: number; name: string | null; practice: string | null }>(
    `SELECT s.trialId, c.name, s.modernPractice AS practice FROM substitutions s LEFT JOIN chemicals c ON c.id = s.modernChemicalId WHERE s.trialId IN (?)`,
    { replacements: [ids], type: QueryTypes.SELECT, transaction },
  );
  const steps = await sequelize.query<{
    trialId: number;
    operation: string;
    ingredients: unknown;
    notes: string | null;
  }>(`SELECT trialId, operation, ingredients, notes FROM recipe_steps WHERE trialId IN (?)`, {
    replacements: [ids],
    type: QueryTypes.SELECT,
    transaction,
  });
  const mordantIds = new Set(
    (
      await sequelize.query<{ id: number }>(`SELECT id FROM chemicals WHERE role = 'mordant'`, {
        type: QueryTypes.SELECT,
        transaction,
      })
    ).map((c) => c.id),
  );
  const byId = new Map(
    trials.map((t) => [
      t.id,
      {
        id: t.id,
        code: t.code,
        pieceId: t.pieceId,
        notes: t.notes ?? '',
        modernMordants: new Set<string>(),
        dyestuffs: new Set<string>(),
      },
    ]),
  );
  for (const s of subs) {
    const d = byId.get(s.trialId)!;
    if (s.name) d.modernMordants.add(s.name);
  }
  for (const s of steps) {
    const d = byId.get(s.trialId)!;
    for (const ing of json<Array<{ kind: string; refId: number; name: string }>>(s.ingredients, [])) {
      if (ing.kind === 'dyestuff') d.dyestuffs.add(ing.name);
      else if (ing.kind === 'chemical' && (mordantIds.has(ing.refId) || s.operation === 'mordant-bath'))
        d.modernMordants.add(ing.name);
    }
    if (s.notes) d.notes += `\n${s.notes}`;
  }
  return [...byId.values()].map((d) => ({ ...d, modernMordants: [...d.modernMordants], dyestuffs: [...d.dyestuffs] }));
}

function attachModern(rows: PieceRow[], trials: TrialDoc[]): PieceDoc[] {
  const modern = new Map<number, Set<string>>();
  for (const t of trials)
    if (t.pieceId != null)
      for (const m of t.modernMordants)
        (modern.get(t.pieceId) ?? modern.set(t.pieceId, new Set()).get(t.pieceId)!).add(m);
  return rows.map((r) => pieceDoc(r, [...(modern.get(r.id) ?? [])]));
}

/** Every live (not soft-deleted) piece and every trial, read once at start. */
export async function loadAll(): Promise<{ pieces: PieceDoc[]; trials: TrialDoc[] }> {
  // Keyset-paged: one huge result set can stall past the server's net_write_timeout.
  const rows: PieceRow[] = [];
  for (let after = 0; ;) {
    const chunk = await sequelize.query<PieceRow>(
      `SELECT ${PIECE_COLS} FROM pieces WHERE deletedAt IS NULL AND id > ? ORDER BY id LIMIT 20000`,
      {
        replacements: [after],
        type: QueryTypes.SELECT,
      },
    );
    for (const r of chunk) rows.push(r);
    if (chunk.length < 20_000) break;
    after = chunk[chunk.length - 1].id;
  }
  const trials = await trialDocs('', []);
  return { pieces: attachModern(rows, trials), trials };
}

/** One piece as it stands now (null when deleted or gone), with its trials. */
export async function loadPiece(id: number): Promise<{ piece: PieceDoc | null; trials: TrialDoc[] }> {
  const rows = await sequelize.query<PieceRow>(`SELECT ${PIECE_COLS} FROM pieces WHERE id = ? AND deletedAt IS NULL`, {
    replacements: [id],
    type: QueryTypes.SELECT,
  });
  const trials = await trialDocs('WHERE pieceId = ?', [id]);
  return { piece: rows[0] ? attachModern(rows, trials)[0] : null, trials };
}

/** One trial as it stands now (null when gone). */
export async function loadTrial(id: number): Promise<TrialDoc | null> {
  return (await trialDocs('WHERE id = ?', [id]))[0] ?? null;
}

/** Several pieces as they stand now (absent from the map when deleted or gone), for applying the change log. */
export async function loadPieces(ids: number[]): Promise<Map<number, PieceDoc>> {
  const out = new Map<number, PieceDoc>();
  if (!ids.length) return out;
  const rows = await sequelize.query<PieceRow>(
    `SELECT ${PIECE_COLS} FROM pieces WHERE id IN (?) AND deletedAt IS NULL`,
    { replacements: [ids], type: QueryTypes.SELECT },
  );
  const trials = rows.length ? await trialDocs('WHERE pieceId IN (?)', [rows.map((r) => r.id)]) : [];
  for (const d of attachModern(rows, trials)) out.set(d.id, d);
  return out;
}

/** Several trials as they stand now (absent when gone). */
export async function loadTrials(ids: number[]): Promise<Map<number, TrialDoc>> {
  const out = new Map<number, TrialDoc>();
  if (ids.length) for (const t of await trialDocs('WHERE id IN (?)', [ids])) out.set(t.id, t);
  return out;
}

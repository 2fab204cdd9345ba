import type { Connection } from 'mariadb';
import { QueryTypes, type Transaction } from 'sequelize';
import { sequelize } from '../models/index.ts';
import { eachPage, readFirst, withConnection } from './read.ts';
import { prepareLoad } from './text-index.ts';

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
  /** Methods of the analyses its identified dyestuffs and mordants point at (issue 19: "identified by"). */
  identifiedBy: string[];
  /** Facet values, lower-cased and de-duplicated once here so facet counting does no string work per query. */
  keys: Record<FacetKey, readonly string[]>;
};
export type FacetKey =
  | 'dyestuff'
  | 'historicalMordant'
  | 'modernMordant'
  | 'fibre'
  | 'technique'
  | 'century'
  | 'place'
  | 'status'
  | 'identifiedBy';

// Most pieces share a few value lists ("madder", "cotton"…): one shared array per distinct list keeps the
// documents' heap, and so garbage-collection work, smaller (about 120 MB at 170,000 pieces). Never mutate them.
const pool = new Map<string, unknown[]>();
function shared<T>(list: T[]): T[] {
  // Most lists hold one string: keyed without JSON (no clash: JSON keys start with "[").
  const key = list.length === 1 && typeof list[0] === 'string' ? `s${list[0]}` : JSON.stringify(list);
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
    identifiedBy: keyList(d.identifiedBy),
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

/** Analyses by id: the piece each belongs to and its method (the "identified by" facet reads these). */
type AnalysisMethods = Map<number, { pieceId: number; method: string }>;

/**
 * The methods behind a piece's identified dyestuffs and mordants: each "identified" entry carries the id of an
 * analysis of this piece (server/services/records/evidence.ts); an analysis of another piece or one gone counts not.
 * The same rule as IDENTIFIED_BY_SQL (server/services/records/identified-by.ts), worked out on the row already read.
 */
function identifiedBy(r: PieceRow, analyses: AnalysisMethods): string[] {
  const out = new Set<string>();
  for (const list of [r.dyestuffs, r.historicalMordants])
    for (const t of json<Array<{ evidence?: string; analysisId?: number | null }>>(list, [])) {
      if (t?.evidence !== 'identified' || t.analysisId == null) continue;
      const a = analyses.get(t.analysisId);
      if (a && a.pieceId === r.id) out.add(a.method);
    }
  return [...out].sort();
}

/** The analyses of the named pieces (or of every piece), by id. */
async function analysisMethods(pieceIds: number[], transaction?: Transaction): Promise<AnalysisMethods> {
  const out: AnalysisMethods = new Map();
  if (!pieceIds.length) return out;
  const rows = await sequelize.query<{ id: number; pieceId: number; method: string }>(
    'SELECT id, pieceId, method FROM analyses WHERE pieceId IN (?)',
    { replacements: [pieceIds], type: QueryTypes.SELECT, transaction },
  );
  for (const a of rows) out.set(a.id, { pieceId: a.pieceId, method: a.method });
  return out;
}

function pieceDoc(r: PieceRow, modern: string[], analyses: AnalysisMethods): PieceDoc {
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
    identifiedBy: shared(identifiedBy(r, analyses)),
  };
  return { ...doc, keys: facetKeys(doc) };
}

const PIECE_COLS =
  'id, accessionNumber, title, objectName, description, provenance, place, dateText, techniques, dyestuffs, historicalMordants, fibres, earliestYear, latestYear, status';

type TrialRow = { id: number; code: string; pieceId: number | null; notes: string | null };
type SubRow = { trialId: number; name: string | null };
type StepRow = { trialId: number; operation: string; ingredients: unknown; notes: string | null };

/** Modern mordants and dyestuffs per trial, from substitutions and recipe ingredients. */
async function trialDocs(where: string, params: unknown[], transaction?: Transaction): Promise<TrialDoc[]> {
  const trials = await sequelize.query<TrialRow>(`SELECT id, code, pieceId, notes FROM trials ${where} ORDER BY id`, {
    replacements: params,
    type: QueryTypes.SELECT,
    transaction,
  });
  if (!trials.length) return [];
  const ids = trials.map((t) => t.id);
  const subs = await sequelize.query<SubRow>(
    `SELECT s.trialId, c.name FROM substitutions s LEFT JOIN chemicals c ON c.id = s.modernChemicalId WHERE s.trialId IN (?) ORDER BY s.trialId, s.id`,
    { replacements: [ids], type: QueryTypes.SELECT, transaction },
  );
  // In recipe order (a trial's notes are its own, then each step's).
  const steps = await sequelize.query<StepRow>(
    `SELECT trialId, operation, ingredients, notes FROM recipe_steps WHERE trialId IN (?) ORDER BY trialId, position, id`,
    { replacements: [ids], type: QueryTypes.SELECT, transaction },
  );
  const mordantIds = new Set(
    (
      await sequelize.query<{ id: number }>(`SELECT id FROM chemicals WHERE role = 'mordant'`, {
        type: QueryTypes.SELECT,
        transaction,
      })
    ).map((c) => c.id),
  );
  return buildTrials(trials, subs, steps, mordantIds);
}

function buildTrials(trials: TrialRow[], subs: SubRow[], steps: StepRow[], mordantIds: Set<number>): TrialDoc[] {
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
    const d = byId.get(s.trialId);
    if (d && s.name) d.modernMordants.add(s.name);
  }
  for (const s of steps) {
    const d = byId.get(s.trialId);
    if (!d) continue;
    for (const ing of json<Array<{ kind: string; refId: number; name: string }>>(s.ingredients, [])) {
      if (ing.kind === 'dyestuff') d.dyestuffs.add(ing.name);
      else if (ing.kind === 'chemical' && (mordantIds.has(ing.refId) || s.operation === 'mordant-bath'))
        d.modernMordants.add(ing.name);
    }
    if (s.notes) d.notes += `\n${s.notes}`;
  }
  return [...byId.values()].map((d) => ({ ...d, modernMordants: [...d.modernMordants], dyestuffs: [...d.dyestuffs] }));
}

/**
 * Every trial, read for a full load: each table once, in keyset-paged chunks over one connection (read.ts), with no
 * list of ids; the same rows, in the same order per trial, as `trialDocs`.
 */
async function allTrialDocs(conn: Connection): Promise<TrialDoc[]> {
  const trials: TrialRow[] = [];
  await eachPage(
    conn,
    'SELECT id, code, pieceId, notes FROM trials WHERE id > ? ORDER BY id LIMIT ?',
    50_000,
    (rows) => {
      for (const r of rows)
        trials.push({
          id: r[0] as number,
          code: r[1] as string,
          pieceId: r[2] as number | null,
          notes: r[3] as string | null,
        });
    },
  );
  if (!trials.length) return [];
  const subs: Array<SubRow & { id: number }> = [];
  await eachPage(
    conn,
    'SELECT s.id, s.trialId, c.name FROM substitutions s LEFT JOIN chemicals c ON c.id = s.modernChemicalId WHERE s.id > ? ORDER BY s.id LIMIT ?',
    50_000,
    (rows) => {
      for (const r of rows) subs.push({ id: r[0] as number, trialId: r[1] as number, name: r[2] as string | null });
    },
  );
  subs.sort((x, y) => x.trialId - y.trialId || x.id - y.id);
  const steps: Array<StepRow & { id: number; position: number }> = [];
  await eachPage(
    conn,
    'SELECT id, trialId, position, operation, ingredients, notes FROM recipe_steps WHERE id > ? ORDER BY id LIMIT ?',
    20_000,
    (rows) => {
      for (const r of rows)
        steps.push({
          id: r[0] as number,
          trialId: r[1] as number,
          position: r[2] as number,
          operation: r[3] as string,
          ingredients: r[4],
          notes: r[5] as string | null,
        });
    },
  );
  steps.sort((x, y) => x.trialId - y.trialId || x.position - y.position || x.id - y.id);
  const mordants: unknown[][] = await conn.execute({
    sql: `SELECT id FROM chemicals WHERE role = 'mordant'`,
    rowsAsArray: true,
    typeCast: undefined,
  });
  return buildTrials(trials, subs, steps, new Set(mordants.map((r) => r[0] as number)));
}

/** Each piece's modern mordants, from its trials (in trial order). */
function modernOf(trials: TrialDoc[]): Map<number, Set<string>> {
  const modern = new Map<number, Set<string>>();
  for (const t of trials)
    if (t.pieceId != null)
      for (const m of t.modernMordants)
        (modern.get(t.pieceId) ?? modern.set(t.pieceId, new Set()).get(t.pieceId)!).add(m);
  return modern;
}

function attachModern(rows: PieceRow[], trials: TrialDoc[], analyses: AnalysisMethods): PieceDoc[] {
  const modern = modernOf(trials);
  return rows.map((r) => pieceDoc(r, [...(modern.get(r.id) ?? [])], analyses));
}

/** Every live (not soft-deleted) piece and every trial, read once at start (on one connection: read.ts). */
export async function loadAll(): Promise<{ pieces: PieceDoc[]; trials: TrialDoc[] }> {
  const { pieces, trials } = await readFirst(() =>
    withConnection(async (conn) => {
      // Trials first: each page of pieces then becomes documents as it arrives, between the reads.
      const trials = await allTrialDocs(conn);
      const modern = modernOf(trials);
      // Every analysis's piece and method (a small table beside pieces), for the "identified by" facet.
      const analyses: AnalysisMethods = new Map();
      await eachPage(
        conn,
        'SELECT id, pieceId, method FROM analyses WHERE id > ? ORDER BY id LIMIT ?',
        50_000,
        (rows) => {
          for (const r of rows) analyses.set(r[0] as number, { pieceId: r[1] as number, method: r[2] as string });
        },
      );
      const pieces: PieceDoc[] = [];
      const cols = PIECE_COLS.split(', ');
      await eachPage(
        conn,
        `SELECT ${PIECE_COLS} FROM pieces WHERE deletedAt IS NULL AND id > ? ORDER BY id LIMIT ?`,
        5_000,
        (page) => {
          for (const r of page) {
            const row: PieceRow = { id: r[0] as number };
            for (let k = 1; k < cols.length; k++) row[cols[k]] = r[k];
            pieces.push(pieceDoc(row, [...(modern.get(row.id) ?? [])], analyses));
          }
        },
      );
      return { pieces, trials };
    }),
  );
  // Tokenised here, in slices that let other requests through, rather than all at once inside TextIndex.load.
  await prepareLoad(pieces, trials);
  return { pieces, trials };
}

/** One piece as it stands now (null when deleted or gone), with its trials. */
export async function loadPiece(id: number): Promise<{ piece: PieceDoc | null; trials: TrialDoc[] }> {
  const rows = await sequelize.query<PieceRow>(`SELECT ${PIECE_COLS} FROM pieces WHERE id = ? AND deletedAt IS NULL`, {
    replacements: [id],
    type: QueryTypes.SELECT,
  });
  const trials = await trialDocs('WHERE pieceId = ?', [id]);
  const analyses = await analysisMethods(rows.map((r) => r.id));
  return { piece: rows[0] ? attachModern(rows, trials, analyses)[0] : null, trials };
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
  const analyses = await analysisMethods(rows.map((r) => r.id));
  for (const d of attachModern(rows, trials, analyses)) out.set(d.id, d);
  return out;
}

/** Several trials as they stand now (absent when gone). */
export async function loadTrials(ids: number[]): Promise<Map<number, TrialDoc>> {
  const out = new Map<number, TrialDoc>();
  if (ids.length) for (const t of await trialDocs('WHERE id IN (?)', [ids])) out.set(t.id, t);
  return out;
}

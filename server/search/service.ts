import type { Actor } from '../policies/index.ts';
import { can } from '../policies/index.ts';
import type { FacetCounts, FacetName, SearchFilters, SearchItem, SearchQuery, SearchResponse, ShadeItem, ShadeQuery, ShadeResponse } from '../../shared/schemas/search.ts';
import { hexToLab, labToHex } from '../../shared/search/lab.ts';
import type { PieceDoc } from './docs.ts';
import { searchEngine } from './engine.ts';
import { highlights } from './highlight.ts';
import { selectTop } from './top.ts';

const collator = new Intl.Collator('en', { numeric: true });

/**
 * Text, facets and shade combined. Visitors only ever see published pieces;
 * signed-in users see drafts too; soft-deleted pieces are not in the index.
 * Trial text counts for its piece only for users who may read trials.
 */
const FACETS: FacetName[] = ['dyestuff', 'historicalMordant', 'modernMordant', 'fibre', 'technique', 'century', 'place', 'status'];
// Pieces carry several of these at once: choosing two narrows (AND). The rest hold one value per piece
// (a century is one of a few): choosing two widens (OR), and their counts ignore their own choice.
const NARROWING = new Set<FacetName>(['dyestuff', 'historicalMordant', 'modernMordant', 'fibre', 'technique']);

const ordinal = (n: number) => `${n}${n % 100 >= 11 && n % 100 <= 13 ? 'th' : ['th', 'st', 'nd', 'rd'][n % 10] ?? 'th'}`;
const centuryLabel = (c: number) => `${ordinal(c)} century (${(c - 1) * 100}–${(c - 1) * 100 + 99})`;
const norm = (s: string) => s.trim().toLowerCase();

type Selected = Partial<Record<FacetName, Set<string>>> & { mordant?: Set<string> };

function selected(f: SearchFilters): Selected {
  const s: Selected = {};
  const put = (k: FacetName | 'mordant', v?: Array<string | number>) => {
    if (v?.length) s[k] = new Set(v.map((x) => norm(String(x))));
  };
  put('dyestuff', f.dyestuff);
  put('historicalMordant', f.historicalMordant);
  put('modernMordant', f.modernMordant);
  put('fibre', f.fibre);
  put('technique', f.technique);
  put('century', f.century);
  put('place', f.place);
  put('status', f.status);
  put('mordant', f.mordant);
  return s;
}

function passes(doc: PieceDoc, sel: Selected, skip?: FacetName): boolean {
  for (const f of FACETS) {
    const want = sel[f];
    if (!want || f === skip) continue;
    const have = doc.keys[f];
    if (NARROWING.has(f)) {
      for (const w of want) if (!have.includes(w)) return false;
    } else if (!have.some((h) => want.has(h))) return false;
  }
  if (sel.mordant) {
    for (const w of sel.mordant) if (!doc.keys.historicalMordant.includes(w) && !doc.keys.modernMordant.includes(w)) return false;
  }
  return true;
}

function visibleDocs(actor: Actor, ids?: Iterable<number>): PieceDoc[] {
  const drafts = can(actor, 'piece:list-drafts');
  const out: PieceDoc[] = [];
  const { pieces, byId } = searchEngine.text;
  if (ids) {
    for (const id of ids) {
      const d = byId[id];
      if (d && (drafts || d.status === 'published')) out.push(d);
    }
  } else for (const d of pieces.values()) if (drafts || d.status === 'published') out.push(d);
  return out;
}

/** Pieces passing visibility, text and every filter; with the text hits for ranking and highlights. */
function candidates(actor: Actor, f: SearchFilters) {
  const hits = f.q ? searchEngine.text.search(f.q, can(actor, 'trial:read')) : null;
  const docs = visibleDocs(actor, hits?.ids);
  const sel = selected(f);
  return { textMatched: docs, matched: Object.keys(sel).length ? docs.filter((d) => passes(d, sel)) : docs, hits, sel };
}

// Display labels: the first spelling met for each lower-cased value.
function labelFor(d: PieceDoc, f: FacetName, key: string): string {
  if (f === 'century') return centuryLabel(Number(key));
  if (f === 'status') return key;
  const src = { dyestuff: d.dyestuffs, historicalMordant: d.historicalMordants, modernMordant: d.modernMordants, fibre: d.fibres, technique: d.techniques, place: [d.place] }[f];
  return src.find((v) => norm(v) === key) ?? key;
}

/**
 * Every piece's facet values as small integers in one flat array (facet index in the top byte), built once per
 * index version: counting tens of thousands of hits is then array increments, not string work.
 */
type FacetTable = { version: number; start: Int32Array; vals: Int32Array; keys: string[][]; labels: string[][] };
let table: FacetTable | null = null;
function facetTable(): FacetTable {
  if (table?.version === searchEngine.version) return table;
  const { byId } = searchEngine.text;
  const intern = FACETS.map(() => new Map<string, number>());
  const keys: string[][] = FACETS.map(() => []);
  const labels: string[][] = FACETS.map(() => []);
  const start = new Int32Array(byId.length + 1);
  const vals: number[] = [];
  for (let id = 0; id < byId.length; id++) {
    start[id] = vals.length;
    const d = byId[id];
    if (!d) continue;
    FACETS.forEach((f, fi) => {
      for (const k of d.keys[f]) {
        let i = intern[fi].get(k);
        if (i === undefined) {
          intern[fi].set(k, (i = keys[fi].length));
          keys[fi].push(k);
          labels[fi].push(labelFor(d, f, k));
        }
        vals.push((fi << 24) | i);
      }
    });
  }
  start[byId.length] = vals.length;
  return (table = { version: searchEngine.version, start, vals: Int32Array.from(vals), keys, labels });
}

function facetCounts(docs: PieceDoc[], sel: Selected): FacetCounts {
  const t = facetTable();
  const counts = FACETS.map((_, fi) => new Int32Array(t.keys[fi].length));
  const anySel = Object.keys(sel).length > 0;
  // A widening (OR) facet's own counts ignore its own choice.
  const ownRule = FACETS.map((f) => !NARROWING.has(f) && Boolean(sel[f]));
  const anyOwn = ownRule.some(Boolean);
  const { start, vals } = t;
  for (const d of docs) {
    const all = !anySel || passes(d, sel);
    if (!all && !anyOwn) continue;
    for (let k = start[d.id], end = start[d.id + 1]; k < end; k++) {
      const v = vals[k];
      const fi = v >>> 24;
      if (ownRule[fi] ? !passes(d, sel, FACETS[fi]) : !all) continue;
      counts[fi][v & 0xffffff]++;
    }
  }
  const out = {} as FacetCounts;
  FACETS.forEach((f, fi) => {
    const rows: Array<{ value: string; label: string; count: number }> = [];
    t.keys[fi].forEach((key, i) => {
      const n = counts[fi][i];
      if (n) rows.push({ value: f === 'century' ? key : t.labels[fi][i], label: t.labels[fi][i], count: n });
    });
    out[f] = rows.sort((x, y) => (f === 'century' ? Number(x.value) - Number(y.value) : y.count - x.count || x.label.localeCompare(y.label))).slice(0, 100);
  });
  return out;
}

export async function runSearch({ actor, input }: { actor: Actor; input: SearchQuery }): Promise<SearchResponse> {
  await searchEngine.settled();
  const { textMatched, matched, hits, sel } = candidates(actor, input);
  const score = (d: PieceDoc) => hits?.score(d.id) ?? 0;
  // Rank only as far as the page asked for (bounded heap), not the whole match list.
  const before = hits
    ? (x: PieceDoc, y: PieceDoc) => score(x) > score(y) || (score(x) === score(y) && x.id < y.id)
    : (x: PieceDoc, y: PieceDoc) => collator.compare(x.accessionNumber, y.accessionNumber) < 0;
  const page = selectTop(matched, input.page * input.pageSize, before).slice((input.page - 1) * input.pageSize);
  const photos = searchEngine.shade.firstPhotoOf(page.map((d) => d.id));
  const items: SearchItem[] = page.map((d) => {
    const hit = hits?.detail(d.id);
    return {
      id: d.id,
      accessionNumber: d.accessionNumber,
      title: d.title,
      objectName: d.objectName,
      place: d.place,
      dateText: d.dateText,
      status: d.status,
      dyestuffs: d.dyestuffs,
      photoId: photos.get(d.id) ?? null,
      score: hit ? Number(hit.score.toFixed(4)) : null,
      highlights: hit ? highlights(d, hit.terms, hit.fields) : [],
      viaTrials: hit?.viaTrials.filter(Boolean) ?? [],
    };
  });
  return { items, facets: facetCounts(textMatched, sel), total: matched.length, page: input.page, pageSize: input.pageSize };
}

// Unfiltered shade queries reuse one allow-list per audience until a piece changes.
const allowCache = new Map<string, { version: number; allow: Uint8Array }>();

function allowList(actor: Actor, f: SearchFilters): Uint8Array {
  const filtered = Boolean(f.q) || Object.keys(selected(f)).length > 0;
  const audience = can(actor, 'piece:list-drafts') ? 'all' : 'published';
  const cached = allowCache.get(audience);
  if (!filtered && cached?.version === searchEngine.version) return cached.allow;
  const docs = filtered ? candidates(actor, f).matched : visibleDocs(actor);
  let max = 0;
  for (const d of docs) if (d.id > max) max = d.id;
  const allow = new Uint8Array(max + 1);
  for (const d of docs) allow[d.id] = 1;
  if (!filtered) allowCache.set(audience, { version: searchEngine.version, allow });
  return allow;
}

export async function runShade({ actor, input }: { actor: Actor; input: ShadeQuery }): Promise<ShadeResponse> {
  await searchEngine.settled();
  const lab = input.hex ? hexToLab(input.hex) : { L: input.L!, a: input.a!, b: input.b! };
  const offset = (input.page - 1) * input.limit;
  const res = searchEngine.shade.query({ ...lab, maxDeltaE: input.maxDeltaE, limit: input.limit, offset, allow: allowList(actor, input) });
  const items: ShadeItem[] = res.items.map((m) => {
    const doc = searchEngine.text.pieces.get(m.pieceId)!;
    return {
      pieceId: m.pieceId,
      accessionNumber: doc.accessionNumber,
      title: doc.title,
      photoId: m.photoId,
      colour: { hex: m.hex, lab: { L: round(m.L, 2), a: round(m.a, 2), b: round(m.b, 2) }, share: round(m.share, 4) },
      deltaE00: round(m.deltaE00, 3),
    };
  });
  const hex = input.hex ? `#${input.hex.replace('#', '').toLowerCase()}` : labToHex(lab);
  return { items, total: res.total, page: input.page, pageSize: input.limit, query: { ...lab, hex, maxDeltaE: input.maxDeltaE } };
}

const round = (x: number, d: number) => Number(x.toFixed(d));

import { accessionSortKey } from '../../shared/accession.ts';
import type { FacetName } from '../../shared/schemas/search.ts';
import type { PieceDoc } from './docs.ts';
import type { TextIndex } from './text-index.ts';

export const FACETS: FacetName[] = [
  'dyestuff',
  'historicalMordant',
  'modernMordant',
  'fibre',
  'technique',
  'century',
  'place',
  'status',
  'identifiedBy',
];

const ordinal = (n: number) =>
  `${n}${n % 100 >= 11 && n % 100 <= 13 ? 'th' : (['th', 'st', 'nd', 'rd'][n % 10] ?? 'th')}`;
const centuryLabel = (c: number) => `${ordinal(c)} century (${(c - 1) * 100}–${(c - 1) * 100 + 99})`;
export const norm = (s: string) => s.trim().toLowerCase();

// Display labels: the first spelling met for each lower-cased value.
function labelFor(d: PieceDoc, f: FacetName, key: string): string {
  if (f === 'century') return centuryLabel(Number(key));
  if (f === 'status') return key;
  const src = {
    dyestuff: d.dyestuffs,
    historicalMordant: d.historicalMordants,
    modernMordant: d.modernMordants,
    fibre: d.fibres,
    technique: d.techniques,
    place: [d.place],
    identifiedBy: d.identifiedBy,
  }[f];
  return src.find((v) => norm(v) === key) ?? key;
}

/**
 * Per index version, built once: every piece's facet values as small integers in one flat array (facet index in
 * the top byte), which pieces are published, and each piece's rank by accession number. Filtering, counting and
 * ranking tens of thousands of hits are then array reads over piece ids, not string work or document objects.
 */
export type FacetTable = {
  version: number;
  start: Int32Array;
  vals: Int32Array;
  keys: string[][];
  labels: string[][];
  intern: Array<Map<string, number>>;
  /** The same values numbered densely across facets (facet fi's value i is base[fi] + i), so counting is one array increment. */
  dense: Int32Array;
  base: Int32Array;
  exists: Uint8Array;
  published: Uint8Array;
  accessionRank: Int32Array;
  all: Int32Array;
};
let table: FacetTable | null = null;

// The archive list's natural order (shared/accession.ts), so search and archive agree.
const sortKeys = new Map<string, string>(); // filled while ordering, emptied after
const sortKey = (n: string) => {
  let k = sortKeys.get(n);
  if (k === undefined) sortKeys.set(n, (k = accessionSortKey(n)));
  return k;
};
const byAccession = (x: PieceDoc, y: PieceDoc) => {
  const a = sortKey(x.accessionNumber);
  const b = sortKey(y.accessionNumber);
  return a < b ? -1 : a > b ? 1 : x.id - y.id;
};
// The previous build's order. Sorting 170,000 accession numbers takes most of a second, so
// after an edit the unchanged pieces keep their order and only the added or renumbered ones are sorted in.
let lastOrder: { ids: number[]; acc: Array<string | undefined> } | null = null;

function accessionOrder(byId: ReadonlyArray<PieceDoc | undefined>, present: PieceDoc[]): PieceDoc[] {
  const prev = lastOrder;
  const changed = prev ? present.filter((d) => prev.acc[d.id] !== d.accessionNumber) : [...present];
  let order: PieceDoc[];
  if (!prev || changed.length > 2000) order = changed.sort(byAccession);
  else {
    const kept: PieceDoc[] = [];
    for (const id of prev.ids) {
      const d = byId[id];
      if (d && d.accessionNumber === prev.acc[id]) kept.push(d);
    }
    changed.sort(byAccession);
    order = [];
    let i = 0;
    let j = 0;
    while (i < kept.length || j < changed.length)
      order.push(
        j >= changed.length || (i < kept.length && byAccession(kept[i], changed[j]) < 0) ? kept[i++] : changed[j++],
      );
  }
  const acc: Array<string | undefined> = Array.from({ length: byId.length });
  for (const d of present) acc[d.id] = d.accessionNumber;
  lastOrder = { ids: order.map((d) => d.id), acc };
  sortKeys.clear();
  return order;
}
/** The table for this index version: built once per version (the engine builds it right after a load). */
export function facetTableFor(text: TextIndex, version: number): FacetTable {
  if (table?.version === version) return table;
  const { byId } = text;
  const intern = FACETS.map(() => new Map<string, number>());
  const keys: string[][] = FACETS.map(() => []);
  const labels: string[][] = FACETS.map(() => []);
  const start = new Int32Array(byId.length + 1);
  const exists = new Uint8Array(byId.length);
  const published = new Uint8Array(byId.length);
  const vals: number[] = [];
  const present: PieceDoc[] = [];
  // Plain loops, no callbacks: this runs over every piece after every edit.
  for (let id = 0; id < byId.length; id++) {
    start[id] = vals.length;
    const d = byId[id];
    if (!d) continue;
    present.push(d);
    exists[id] = 1;
    published[id] = d.status === 'published' ? 1 : 0;
    for (let fi = 0; fi < FACETS.length; fi++) {
      for (const k of d.keys[FACETS[fi]]) {
        let i = intern[fi].get(k);
        if (i === undefined) {
          intern[fi].set(k, (i = keys[fi].length));
          keys[fi].push(k);
          labels[fi].push(labelFor(d, FACETS[fi], k));
        }
        vals.push((fi << 24) | i);
      }
    }
  }
  start[byId.length] = vals.length;
  const accessionRank = new Int32Array(byId.length);
  const order = accessionOrder(byId, present);
  for (let r = 0; r < order.length; r++) accessionRank[order[r].id] = r;
  // `present` is in id order.
  const all = new Int32Array(present.length);
  for (let i = 0; i < present.length; i++) all[i] = present[i].id;
  const base = new Int32Array(FACETS.length + 1);
  for (let fi = 0; fi < FACETS.length; fi++) base[fi + 1] = base[fi] + keys[fi].length;
  const packed = new Int32Array(vals.length);
  const dense = new Int32Array(vals.length);
  for (let k = 0; k < vals.length; k++) {
    packed[k] = vals[k];
    dense[k] = base[vals[k] >>> 24] + (vals[k] & 0xffffff);
  }
  return (table = {
    version,
    start,
    vals: packed,
    dense,
    base,
    keys,
    labels,
    intern,
    exists,
    published,
    accessionRank,
    all,
  });
}

/** Values counted per facet over `ids` (one flat array, facet fi's value i at base[fi] + i). */
export function countAll(ids: Int32Array, t: FacetTable): Int32Array {
  const counts = new Int32Array(t.base[FACETS.length]);
  const { start, dense } = t;
  for (let i = 0; i < ids.length; i++) {
    const id = ids[i];
    for (let k = start[id], end = start[id + 1]; k < end; k++) counts[dense[k]]++;
  }
  return counts;
}

// Per table (so per index version), for visitors [0] and for users who see drafts [1]: every visible piece's counts.
let totals: { t: FacetTable; of: Array<{ n: number; counts: Int32Array } | undefined> } | null = null;
let seen = new Uint32Array(0);
let seenStamp = 0;

/**
 * Facet counts of `ids`, all visible to the audience. A query matching most of the archive (a common word)
 * starts from the counts of every visible piece and takes away the few pieces it did not match.
 */
export function countMatched(ids: Int32Array, t: FacetTable, drafts: boolean): Int32Array {
  if (ids.length * 2 < t.all.length) return countAll(ids, t);
  const { all, published, start, dense } = t;
  if (totals?.t !== t) totals = { t, of: [] };
  const audience = drafts ? 1 : 0;
  let total = totals.of[audience];
  if (!total) {
    const visible = drafts ? all : all.filter((id) => published[id]);
    total = totals.of[audience] = { n: visible.length, counts: countAll(visible, t) };
  }
  if (ids.length * 2 < total.n) return countAll(ids, t);
  if (seen.length < published.length) seen = new Uint32Array(published.length + 1024);
  const stamp = ++seenStamp;
  for (let i = 0; i < ids.length; i++) seen[ids[i]] = stamp;
  const counts = total.counts.slice();
  for (let i = 0; i < all.length; i++) {
    const id = all[i];
    if (seen[id] === stamp || !(drafts || published[id])) continue;
    for (let k = start[id], end = start[id + 1]; k < end; k++) counts[dense[k]]--;
  }
  return counts;
}

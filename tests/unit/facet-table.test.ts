import { describe, expect, it } from 'vitest';
import { facetKeys, type PieceDoc } from '../../server/search/docs.ts';
import { countMatched, FACETS, facetTableFor } from '../../server/search/facet-table.ts';
import { TextIndex } from '../../server/search/text-index.ts';

let seed = 4242;
const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
const some = (xs: string[]) => xs.filter(() => rnd() < 0.4);

function piece(id: number): PieceDoc {
  const d: Omit<PieceDoc, 'keys'> = {
    id,
    accessionNumber: `F.${id}`,
    title: 'panel',
    objectName: 'panel',
    description: '',
    provenance: '',
    place: ['Calderwick', 'market town', ''][id % 3],
    dateText: '',
    techniques: some(['resist', 'block printing', 'pencilling']),
    dyestuffs: some(['madder', 'Madder', 'weld', 'indigo']),
    historicalMordants: some(['potash alum', 'iron(II) acetate']),
    modernMordants: [],
    fibres: some(['cotton', 'linen']),
    centuries: rnd() < 0.5 ? [18] : [18, 19],
    status: rnd() < 0.3 ? 'draft' : 'published',
    identifiedBy: some(['HPLC-DAD', 'XRF']),
  };
  return { ...d, keys: facetKeys(d) };
}

describe('facet counts (facet-table.ts)', () => {
  it('counts a query matching most pieces (all counts less the pieces missed) exactly as a plain count over the documents', () => {
    const idx = new TextIndex();
    // Gaps in the ids, as deletions leave them.
    const docs = Array.from({ length: 500 }, (_, i) => piece(i + 1)).filter((d) => d.id % 7 !== 0);
    idx.load(docs, []);
    const t = facetTableFor(idx, 1_000_001);
    // The oracle: a plain count of each document's lower-cased facet values.
    const plain = (ids: number[]) => {
      const out = new Map<string, number>();
      for (const id of ids)
        for (const f of FACETS)
          for (const k of idx.byId[id]!.keys[f]) out.set(`${f}:${k}`, (out.get(`${f}:${k}`) ?? 0) + 1);
      return out;
    };
    const asMap = (counts: Int32Array) => {
      const out = new Map<string, number>();
      FACETS.forEach((f, fi) =>
        t.keys[fi].forEach((k, i) => counts[t.base[fi] + i] && out.set(`${f}:${k}`, counts[t.base[fi] + i])),
      );
      return out;
    };
    let checked = 0;
    for (const drafts of [false, true, false]) {
      const visible = docs.filter((d) => drafts || d.status === 'published').map((d) => d.id);
      // Few, about half, most, all but one and all of the visible pieces: both ways of counting are taken.
      for (const share of [0.05, 0.5, 0.9, 0.99, 1]) {
        const ids = share === 1 ? visible : visible.filter(() => rnd() < share);
        expect(asMap(countMatched(Int32Array.from(ids), t, drafts)), `${drafts} ${share}`).toEqual(plain(ids));
        checked++;
      }
    }
    expect(checked).toBe(15);
  });

  it('ranks by accession number after edits exactly as a full sort does (only the changed pieces are sorted in)', () => {
    const idx = new TextIndex();
    idx.load(
      Array.from({ length: 300 }, (_, i) => ({ ...piece(i + 1), accessionNumber: `F.${(i * 37) % 300}.${i % 4}` })),
      [],
    );
    facetTableFor(idx, 2_000_001);
    // Renumbered, removed and added pieces.
    for (const id of [3, 50, 51, 299]) idx.setPiece(id, { ...idx.byId[id]!, accessionNumber: `F.${id % 9}.9` });
    for (const id of [10, 11]) idx.setPiece(id, null);
    for (const id of [301, 302, 400]) idx.setPiece(id, { ...piece(id), accessionNumber: `F.${id % 5}` });
    const t = facetTableFor(idx, 2_000_002);
    // The oracle: every present piece sorted afresh by localeCompare with numeric collation, ties by id.
    const present = idx.byId.filter((d) => d !== undefined);
    const want = [...present]
      .sort((x, y) => x.accessionNumber.localeCompare(y.accessionNumber, 'en', { numeric: true }) || x.id - y.id)
      .map((d) => d.id);
    const got = [...present].sort((x, y) => t.accessionRank[x.id] - t.accessionRank[y.id]).map((d) => d.id);
    expect(got).toEqual(want);
    expect(got).toHaveLength(301);
  });
});

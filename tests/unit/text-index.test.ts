import { describe, expect, it } from 'vitest';
import { facetKeys, type PieceDoc, type TrialDoc } from '../../server/search/docs.ts';
import { prepareLoad, scanAscii, TextIndex, tokenize } from '../../server/search/text-index.ts';

let seed = 777;
const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
// A skewed vocabulary: a few words in most documents, many rare ones (so prefix and fuzzy neighbours exist).
const VOCAB = [
  'madder',
  'mader',
  'madders',
  'indigo',
  'indigos',
  'weld',
  'welds',
  'alum',
  'alumina',
  'iron',
  'ironed',
  'chintz',
  'chints',
  'resist',
  'calico',
];
for (let i = 0; i < 300; i++)
  VOCAB.push(
    ['ka', 'lo', 'mer', 'tin', 'va', 'dre'][i % 6] +
      ['sol', 'pa', 'ri', 'gon'][i % 4] +
      String.fromCharCode(97 + (i % 26)) +
      (i > 150 ? 'e' : ''),
  );
const word = () => VOCAB[Math.min(VOCAB.length - 1, Math.floor(VOCAB.length * rnd() ** 3))];
const words = (n: number) => Array.from({ length: n }, word).join(' ');

function piece(id: number): PieceDoc {
  const d: Omit<PieceDoc, 'keys'> = {
    id,
    accessionNumber: `T.${id}`,
    title: words(3),
    objectName: 'panel',
    description: words(20),
    provenance: words(3),
    place: 'market town',
    dateText: '',
    techniques: ['resist'],
    dyestuffs: [word()],
    historicalMordants: ['potash alum'],
    modernMordants: [],
    fibres: ['cotton'],
    centuries: [18],
    status: 'published',
    identifiedBy: [],
  };
  return { ...d, keys: facetKeys(d) };
}
const trial = (id: number, pieceId: number): TrialDoc => ({
  id,
  code: `TR-${id}`,
  pieceId,
  notes: words(8),
  modernMordants: [],
  dyestuffs: [word()],
});

describe('text index scorer (text-index.ts) = minisearch search() (the library itself as oracle)', () => {
  it('gives the same documents and scores for exact, prefix, fuzzy and multi-word queries, through edits and removals', () => {
    const idx = new TextIndex();
    idx.load(
      Array.from({ length: 600 }, (_, i) => piece(i + 1)),
      [],
    );
    for (let i = 1; i <= 40; i++) idx.setPiece(i, i % 2 ? piece(i) : null);
    const queries = [
      'madder',
      'madd',
      'maxder',
      'indigo weld',
      'al',
      'chintz iron',
      'kasola',
      'T.77',
      'madder madder',
      'zzzz',
      'lopa merri',
    ];
    let compared = 0;
    for (const q of queries) {
      // The fast scorer first: minisearch's search() turns the terms it reads into minisearch's own Maps
      // (postings.ts, TermPostings), so asking it first would test only that path.
      const got = idx.search(q, true);
      const want = idx.searchWithMinisearch(q);
      expect(got.ids.length, q).toBe(want.length);
      for (const r of want) {
        expect(got.score(r.pieceId as number), `${q} piece ${r.pieceId}`).toBeCloseTo(r.score, 9);
        // Matched words and fields (for highlights) as minisearch reports them.
        const d = got.detail(r.pieceId as number);
        expect([...d.terms].sort(), q).toEqual(Object.keys(r.match).sort());
        expect([...d.fields].sort(), q).toEqual([...new Set(Object.values(r.match).flat())].sort());
        compared++;
      }
    }
    expect(compared).toBeGreaterThan(1000);
    // Postings cached by the queries above are dropped when the index changes: an edit after a query still scores as minisearch does.
    idx.setPiece(77, { ...piece(77), description: 'quercitron quercitron madder' });
    idx.setPiece(78, null);
    for (const q of ['madder', 'quercitron', 'madd']) {
      const want = idx.searchWithMinisearch(q);
      const got = idx.search(q, true);
      expect(got.ids.length, q).toBe(want.length);
      for (const r of want) expect(got.score(r.pieceId as number), `${q} piece ${r.pieceId}`).toBeCloseTo(r.score, 9);
    }
    expect([...idx.search('quercitron', true).ids]).toEqual([77]);
    // The removed pieces match nothing.
    expect(idx.search('T.2', true).score(2)).toBeUndefined();
  });

  it('scans ASCII text into the same tokens as tokenize (the bulk load reads them as ranges)', () => {
    const alphabet = 'ab Z9 .,;:-()[]"\'$+<=>^`|~_!?@#%&*/\\{}\t\n\r\v\f\x00\x01\x1f\x7f';
    const out = new Int32Array(2000);
    for (let n = 0; n < 3000; n++) {
      const len = Math.floor(rnd() * 40);
      let text = '';
      for (let i = 0; i < len; i++) text += alphabet[Math.floor(rnd() * alphabet.length)];
      const k = scanAscii(text, out);
      const got = Array.from({ length: k }, (_, i) => text.slice(out[2 * i], out[2 * i + 1]));
      expect(got, JSON.stringify(text)).toEqual(tokenize(text));
    }
    for (const text of ['1931.4.12 iron(II) acetate', '  --a--  b.c.d ', 'iron(II)', 'x']) {
      const k = scanAscii(text, out);
      expect(Array.from({ length: k }, (_, i) => text.slice(out[2 * i], out[2 * i + 1]))).toEqual(tokenize(text));
    }
    // Not ASCII: the caller falls back to tokenize.
    expect(scanAscii('Zürich', out)).toBe(-1);
  });

  it('loads exactly what minisearch addAll builds (postings.ts, bulkLoad): same ids, field lengths, averages, stored fields, terms in the same order', async () => {
    const pieces = Array.from({ length: 400 }, (_, i) => piece(i + 1));
    // Mixed case (field lengths count distinct tokens before lower-casing), punctuation, non-ASCII, empty fields.
    pieces[3] = {
      ...pieces[3],
      title: 'Madder madder MADDER',
      description: 'iron(II) "alum," 1931.4.12 -- Zürich ÉCRU écru ς',
    };
    pieces[4] = { ...pieces[4], description: '', provenance: '  ' };
    const trials = [
      ...Array.from({ length: 50 }, (_, i) => trial(i + 1, (i % 40) + 1)),
      { ...trial(51, 0), pieceId: null },
    ];
    const fast = new TextIndex();
    fast.load(pieces, trials);
    const slow = new TextIndex();
    slow.load(pieces, trials, { viaAddAll: true });
    // toJSON lists every term (in the radix tree's order) with its postings, so it also turns every flat term into Maps.
    expect(JSON.stringify(fast.toJSON())).toBe(JSON.stringify(slow.toJSON()));
    // Tokenised ahead in slices (as docs.ts loadAll does), then loaded: the same again.
    await prepareLoad(pieces, trials);
    const sliced = new TextIndex();
    sliced.load(pieces, trials);
    expect(JSON.stringify(sliced.toJSON())).toBe(JSON.stringify(slow.toJSON()));
    // And both then answer and change alike.
    const edited = { ...piece(7), description: 'quercitron madder' };
    fast.setPiece(7, edited);
    slow.setPiece(7, edited);
    fast.setPiece(8, null);
    slow.setPiece(8, null);
    expect(JSON.stringify(fast.toJSON())).toBe(JSON.stringify(slow.toJSON()));
  });

  it('follows edits: cached postings and per-document tables stay exact through changed, removed and added pieces and trials', () => {
    const idx = new TextIndex();
    const trials = Array.from({ length: 60 }, (_, i) => trial(i + 1, (i % 30) + 1));
    idx.load(
      Array.from({ length: 300 }, (_, i) => piece(i + 1)),
      trials,
    );
    const queries = [
      'madder',
      'madd',
      'maxder',
      'indigo weld',
      'al',
      'chintz iron',
      'kasola',
      'T.77',
      'TR-7',
      'quercitron',
      'lopa merri',
      'resist',
    ];
    // minisearch answers per document: a piece's own and its trials' scores add up, their words join.
    const same = (q: string) => {
      // The fast scorer first (see above); its answer stays valid until the next idx.search.
      const got = idx.search(q, true);
      const want = new Map<number, { score: number; terms: Set<string> }>();
      for (const r of idx.searchWithMinisearch(q)) {
        const w = want.get(r.pieceId as number) ?? { score: 0, terms: new Set<string>() };
        w.score += r.score;
        for (const t of Object.keys(r.match)) w.terms.add(t);
        want.set(r.pieceId as number, w);
      }
      expect(got.ids.length, q).toBe(want.size);
      for (const [pid, w] of want) {
        expect(got.score(pid), `${q} piece ${pid}`).toBeCloseTo(w.score, 9);
        expect([...got.detail(pid).terms].sort(), q).toEqual([...w.terms].sort());
      }
      return want.size;
    };
    // Queried first, so every common term's postings are cached before the edits.
    for (const q of queries) same(q);
    // Changed text (a new word, common words gone), removals, and enough new pieces to outgrow the per-document tables.
    idx.setPiece(5, { ...piece(5), description: 'quercitron quercitron quercitron', title: 'quercitron' });
    for (let i = 10; i < 60; i += 3) idx.setPiece(i, null);
    for (let i = 301; i <= 2400; i++) idx.setPiece(i, piece(i));
    // A trial moved to another piece, one removed, one added with new words.
    idx.setTrial(7, { ...trial(7, 200), notes: 'quercitron madder' });
    idx.setTrial(8, null);
    idx.setTrial(61, { ...trial(61, 2300), notes: 'quercitron' });
    let compared = 0;
    for (const q of queries) compared += same(q);
    expect(compared).toBeGreaterThan(3000);
    // Trial 7 now counts for piece 200, not for piece 8 (its old piece); trial 8 counts for nothing.
    const moved = idx.search('TR-7', true);
    expect(moved.detail(200).viaTrials).toContain('TR-7');
    expect(moved.detail(8).viaTrials).not.toContain('TR-7');
    expect(idx.search('TR-8', true).detail(9).viaTrials).not.toContain('TR-8');
    expect([...idx.search('quercitron', true).ids].sort((x, y) => x - y)).toEqual([5, 200, 2300]);
  });

  it('reports words and fields only for the pieces asked about, and counts trial text for its piece only when allowed', () => {
    const idx = new TextIndex();
    idx.load([piece(1), piece(2)], [{ ...trial(9, 2), notes: 'overdyed with quercitron' }]);
    expect([...idx.search('quercitron', false).ids]).toEqual([]);
    const hits = idx.search('quercitro', true);
    expect([...hits.ids]).toEqual([2]);
    const d = hits.detail(2);
    expect(d.viaTrials).toEqual(['TR-9']);
    expect([...d.terms]).toEqual(['quercitron']);
    expect([...d.fields]).toEqual(['notes']);
  });
});

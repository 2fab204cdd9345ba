import MiniSearch from 'minisearch';
import type { PieceDoc, TrialDoc } from './docs.ts';
import { bulkLoad, bulkLoadInSlices, type MsInternals, type Postings, PostingStore } from './postings.ts';

/**
 * Full-text index over pieces and trials (minisearch), plus the documents
 * themselves so facets and results need no database round trip. Kept current by
 * the model hooks in hooks.ts; soft-deleted pieces are removed from it.
 */
type IndexedDoc = {
  id: string;
  kind: 'piece' | 'trial';
  refId: number;
  pieceId: number | null;
  accessionNumber?: string;
  title?: string;
  objectName?: string;
  description?: string;
  provenance?: string;
  place?: string;
  techniques?: string;
  dyestuffs?: string;
  historicalMordants?: string;
  modernMordants?: string;
  trialCode?: string;
  notes?: string;
};

export const TEXT_FIELDS = [
  'accessionNumber',
  'title',
  'objectName',
  'description',
  'provenance',
  'place',
  'techniques',
  'dyestuffs',
  'historicalMordants',
  'modernMordants',
  'trialCode',
  'notes',
] as const;
export type TextField = (typeof TEXT_FIELDS)[number];
const STORE_FIELDS = ['kind', 'refId', 'pieceId'] as const;

// Accession numbers and trial codes first, then titles; then what the object is made of.
const BOOST: Partial<Record<TextField, number>> = {
  accessionNumber: 6,
  trialCode: 5,
  title: 4,
  objectName: 2,
  dyestuffs: 2,
  historicalMordants: 1.5,
  modernMordants: 1.5,
  techniques: 1.5,
};

const EDGE = /^[\p{P}\p{S}]+|[\p{P}\p{S}]+$/gu;
const PARTS = /[\s\p{P}\p{S}]+/u;
const INNER = /[\p{P}\p{S}]/u;

/** Whole words (so "1931.4.12" and "iron(II)" match as typed) and their punctuation-free parts. */
export function tokenize(text: string): string[] {
  const out: string[] = [];
  for (const raw of text.split(/\s+/)) {
    const whole = raw.replace(EDGE, '');
    if (!whole) continue;
    out.push(whole);
    // Most words have no inner punctuation: test first rather than split every word (tokenising pages and loads).
    if (!INNER.test(whole)) continue;
    const parts = whole.split(PARTS).filter(Boolean);
    if (parts.length > 1) out.push(...parts);
  }
  return out;
}

// ASCII character classes as tokenize's regular expressions see them: 1 = whitespace (\s), 2 = punctuation or symbol
// (\p{P}, \p{S}: every printable ASCII character that is not a letter or digit), 0 = anything else (letters, digits
// and control characters, which are neither).
const ASCII_CLASS = new Uint8Array(128);
for (const c of [9, 10, 11, 12, 13, 32]) ASCII_CLASS[c] = 1;
for (let c = 33; c < 127; c++) if (!/[A-Za-z0-9]/.test(String.fromCharCode(c))) ASCII_CLASS[c] = 2;

/**
 * `tokenize` for all-ASCII text without regular expressions or substrings: writes each token as a [start, end) range
 * of `text` into `out` (two numbers a token, in tokenize's order) and returns how many tokens, or -1 when `text` is
 * not all ASCII (then use `tokenize`). The bulk load (postings.ts) looks tokens up by range. Checked against
 * `tokenize` in tests/unit/text-index.test.ts.
 */
export function scanAscii(text: string, out: Int32Array): number {
  const n = text.length;
  for (let i = 0; i < n; i++) if (text.charCodeAt(i) > 127) return -1;
  let k = 0;
  let i = 0;
  while (i < n) {
    while (i < n && ASCII_CLASS[text.charCodeAt(i)] === 1) i++;
    if (i >= n) break;
    let s = i;
    while (i < n && ASCII_CLASS[text.charCodeAt(i)] !== 1) i++;
    let e = i;
    while (s < e && ASCII_CLASS[text.charCodeAt(s)] === 2) s++;
    while (e > s && ASCII_CLASS[text.charCodeAt(e - 1)] === 2) e--;
    if (s === e) continue;
    out[k++] = s;
    out[k++] = e;
    let inner = false;
    for (let j = s + 1; j < e - 1 && !inner; j++) inner = ASCII_CLASS[text.charCodeAt(j)] === 2;
    if (!inner) continue;
    // The whole word's parts between punctuation (at least two, as its ends are not punctuation).
    for (let j = s; j < e;) {
      const ps = j;
      while (j < e && ASCII_CLASS[text.charCodeAt(j)] !== 2) j++;
      if (j > ps) {
        out[k++] = ps;
        out[k++] = j;
      }
      while (j < e && ASCII_CLASS[text.charCodeAt(j)] === 2) j++;
    }
  }
  return k / 2;
}
const queryTokens = (text: string) =>
  text
    .split(/\s+/)
    .map((w) => w.replace(EDGE, ''))
    .filter(Boolean);

export type TextHit = { score: number; terms: Set<string>; fields: Set<TextField>; viaTrials: string[] };

/** The pieces a text query matched: every score (for ranking and facets), details only when asked (for the page shown). */
export type TextMatches = {
  ids: Int32Array;
  /** Scores indexed by piece id; meaningful only for the ids matched. */
  scores: Float64Array;
  score: (pieceId: number) => number | undefined;
  detail: (pieceId: number) => TextHit;
};

// minisearch's defaults (7.2.0): prefix/fuzzy weights; postings.ts has its BM25+ parameters and formula.
const WEIGHT_PREFIX = 0.375;
const WEIGHT_FUZZY = 0.45;
const MAX_FUZZY = 2;
const prefixOk = (term: string) => term.length >= 2;
// 1 edit from 4 letters, 20 % of the length from 5 (at most MAX_FUZZY).
const fuzzyEdits = (term: string) =>
  term.length >= 5 ? Math.min(MAX_FUZZY, Math.round(term.length * 0.2)) : term.length >= 4 ? 1 : 0;

type Expansion = { term: string; weight: number; data: Postings };

const TOKENISE = { fields: TEXT_FIELDS, tokenize, scan: scanAscii };

// Indexes built ahead by prepareLoad, keyed by the pieces array handed to load() next.
const prepared = new WeakMap<PieceDoc[], { trials: TrialDoc[]; count: number; ms: MiniSearch<IndexedDoc> }>();

/**
 * The work of `TextIndex.load(pieces, trials)` (seconds at 166,667 pieces: tokenising, minisearch's tables), done
 * ahead into a new minisearch index in slices that yield to the event loop; `docs.ts` `loadAll` calls it, so the
 * engine's `load` with the same two arrays then only swaps that index in and builds the scorer's per-document tables,
 * and the process keeps answering meanwhile. The documents must not change in between (they never do: PieceDoc and
 * TrialDoc are not mutated).
 */
export async function prepareLoad(pieces: PieceDoc[], trials: TrialDoc[]): Promise<void> {
  const ms = freshMiniSearch();
  const entries = [...pieces.map(pieceEntry), ...trials.map(trialEntry)];
  await bulkLoadInSlices(ms as unknown as MsInternals, entries, STORE_FIELDS, TOKENISE);
  prepared.set(pieces, { trials, count: entries.length, ms });
}

function freshMiniSearch() {
  return new MiniSearch<IndexedDoc>({
    fields: [...TEXT_FIELDS],
    storeFields: [...STORE_FIELDS],
    tokenize,
    processTerm: (t) => t.toLowerCase(),
    searchOptions: { tokenize: queryTokens, processTerm: (t) => t.toLowerCase() },
  });
}

export class TextIndex {
  readonly pieces = new Map<number, PieceDoc>();
  /** The same documents in an array indexed by piece id, for lookups over tens of thousands of hits. */
  readonly byId: Array<PieceDoc | undefined> = [];
  readonly trials = new Map<number, TrialDoc>();
  private ms = freshMiniSearch();
  /**
   * Flat postings and per-document tables for the scorer, kept in step with minisearch by load/setPiece/setTrial.
   * This class reads minisearch's private fields through `MsInternals` (README.md, invariant 3).
   */
  private store = new PostingStore(this.ms as unknown as MsInternals, TEXT_FIELDS, BOOST);
  private scratch: Scratch | null = null;

  /** Replace everything (start-up). `viaAddAll`: build it with minisearch's own addAll instead (the tests' oracle). */
  load(pieces: PieceDoc[], trials: TrialDoc[], { viaAddAll = false } = {}) {
    const pre = prepared.get(pieces);
    prepared.delete(pieces);
    const ready = !viaAddAll && pre?.trials === trials && pre.count === pieces.length + trials.length ? pre : null;
    this.pieces.clear();
    this.byId.length = 0;
    this.trials.clear();
    for (const p of pieces) {
      this.pieces.set(p.id, p);
      this.byId[p.id] = p;
    }
    for (const t of trials) this.trials.set(t.id, t);
    if (ready) this.ms = ready.ms;
    else {
      this.ms = freshMiniSearch();
      const entries = [...pieces.map(pieceEntry), ...trials.map(trialEntry)];
      // What addAll would build, with the postings left flat (postings.ts, bulkLoad; about 25 s less at full size).
      if (viaAddAll) this.ms.addAll(entries);
      else bulkLoad(this.ms as unknown as MsInternals, entries, STORE_FIELDS, TOKENISE);
    }
    this.store = new PostingStore(this.ms as unknown as MsInternals, TEXT_FIELDS, BOOST);
    this.store.rebuild();
  }

  // remove() (not discard()) so the postings never hold stale documents and every score follows minisearch's formula exactly.
  setPiece(id: number, doc: PieceDoc | null) {
    const prev = this.pieces.get(id);
    if (prev) this.remove(pieceEntry(prev));
    this.pieces.delete(id);
    this.byId[id] = doc ?? undefined;
    if (doc) {
      this.pieces.set(id, doc);
      this.add(pieceEntry(doc));
    }
  }

  setTrial(id: number, doc: TrialDoc | null) {
    const prev = this.trials.get(id);
    if (prev) this.remove(trialEntry(prev));
    this.trials.delete(id);
    if (doc) {
      this.trials.set(id, doc);
      this.add(trialEntry(doc));
    }
  }

  private add(e: IndexedDoc) {
    this.ms.add(e);
    this.store.noteDoc((this.ms as unknown as MsInternals)._idToShortId.get(e.id)!);
    this.store.forget(termsOf(e));
  }

  private remove(e: IndexedDoc) {
    const doc = (this.ms as unknown as MsInternals)._idToShortId.get(e.id);
    this.ms.remove(e);
    if (doc !== undefined) this.store.dropDoc(doc);
    this.store.forget(termsOf(e));
  }

  /** minisearch's own serialisation of the index (tests compare a bulk load with addAll's). */
  toJSON() {
    return this.ms.toJSON();
  }

  /** The same query through minisearch's own search(): the oracle the fast scorer is tested against. */
  searchWithMinisearch(q: string) {
    return this.ms.search(q, {
      prefix: prefixOk,
      fuzzy: (term) => (term.length >= 5 ? 0.2 : term.length >= 4 ? 1 : 0),
      maxFuzzy: MAX_FUZZY,
      boost: BOOST,
      combineWith: 'AND',
    });
  }

  /** Each query word's index terms: itself, its prefix extensions and its fuzzy neighbours, weighted as minisearch does. */
  private expand(word: string): Expansion[] {
    const ms = this.ms as unknown as MsInternals;
    const out: Expansion[] = [];
    const exact = ms._index.get(word);
    if (exact) out.push({ term: word, weight: 1, data: exact });
    const prefixed = new Set<string>();
    if (prefixOk(word))
      for (const [term, data] of ms._index.atPrefix(word)) {
        const distance = term.length - word.length;
        if (!distance) continue;
        prefixed.add(term);
        out.push({ term, weight: (WEIGHT_PREFIX * term.length) / (term.length + 0.3 * distance), data });
      }
    const edits = fuzzyEdits(word);
    if (edits)
      for (const [term, [data, distance]] of ms._index.fuzzyGet(word, edits)) {
        if (!distance || prefixed.has(term)) continue;
        out.push({ term, weight: (WEIGHT_FUZZY * term.length) / (term.length + distance), data });
      }
    return out;
  }

  /**
   * Documents matching every word (prefix and fuzzy) with minisearch's BM25+
   * score and field boosts, summed per piece (trial hits count for their piece
   * when `withTrials`). Scores go into flat arrays indexed by minisearch's
   * short document id, so a word found in most documents costs one pass over
   * its postings, not an object per document; words, fields and trial codes are
   * worked out only for the pieces a page shows. The result lives in scratch
   * buffers reused by the next search: use it before searching again, with no `await` in between
   * (server/search/README.md, invariant 1).
   */
  search(q: string, withTrials: boolean): TextMatches {
    const ms = this.ms as unknown as MsInternals;
    const words = queryTokens(q).map((t) => t.toLowerCase());
    const perWord = words.map((w) => this.expand(w));
    const { piece, trial } = this.store;
    const s = this.scratchFor(ms._nextId, this.byId.length);
    const { score, hitCount, first, live, pieceScore, matched, own } = s;
    // Stamps mark this query's pieces, so the per-piece arrays need no clearing between queries.
    const stamp = ++s.stamp;
    let nFirst = 0;
    let nLive = 0;
    for (let w = 0; w < perWord.length; w++) {
      // The first word's documents are kept apart: every document scored is among them, which is how the scratch is cleared.
      const into = w === 0 ? first : live;
      let n = 0;
      for (const { term, weight, data } of perWord[w]) n = this.store.score(term, data, weight, w, s, into, n);
      if (w === 0) nFirst = n;
      nLive = n;
    }
    const liveDocs = perWord.length === 1 ? first : live;
    // minisearch multiplies by the number of distinct query words a document matched: all of them, under AND.
    const quality = new Set(words).size;
    const maxPiece = this.byId.length - 1;
    let nIds = 0;
    const trialsOf = new Map<number, number[]>();
    for (let i = 0; i < nLive; i++) {
      const doc = liveDocs[i];
      const pid = piece[doc];
      if (pid < 0 || pid > maxPiece || (trial[doc] && !withTrials)) continue;
      if (matched[pid] !== stamp) {
        matched[pid] = stamp;
        pieceScore[pid] = 0;
        s.ids[nIds++] = pid;
      }
      pieceScore[pid] += score[doc] * quality;
      if (!trial[doc]) own[pid] = stamp;
      else {
        const list = trialsOf.get(pid);
        if (list) list.push(doc);
        else trialsOf.set(pid, [doc]);
      }
    }
    clearDocs(first, nFirst, score, hitCount);
    const scoreOf = (pid: number) =>
      pid >= 0 && pid <= maxPiece && matched[pid] === stamp ? pieceScore[pid] : undefined;
    // Which expanded terms and fields a page's document holds: tokenise its own fields (as the index did) against the term set.
    const expanded = new Set(perWord.flatMap((exps) => exps.map((e) => e.term)));
    // A token equal to an expanded term is a substring of its lower-cased field (lower-casing works character by
    // character, except Greek final sigma: hence the guard), so a field holding none of them needs no tokenising.
    const termList = [...expanded];
    const shortcut = !termList.some((t) => t.includes('σ') || t.includes('ς'));
    const detail = (pieceId: number): TextHit => {
      const hit: TextHit = { score: scoreOf(pieceId) ?? 0, terms: new Set(), fields: new Set(), viaTrials: [] };
      const doc = this.pieces.get(pieceId);
      const entries: IndexedDoc[] = [];
      if (doc && pieceId <= maxPiece && own[pieceId] === stamp) entries.push(pieceEntry(doc));
      for (const t of trialsOf.get(pieceId) ?? []) {
        const tr = this.trials.get(ms._storedFields.get(t)!.refId);
        if (!tr) continue;
        hit.viaTrials.push(tr.code);
        entries.push(trialEntry(tr));
      }
      for (const e of entries)
        for (const f of TEXT_FIELDS) {
          const text = e[f];
          if (!text) continue;
          if (shortcut) {
            const lower = text.toLowerCase();
            if (!termList.some((t) => lower.includes(t))) continue;
          }
          for (const tok of tokenize(text)) {
            const term = tok.toLowerCase();
            if (expanded.has(term)) {
              hit.terms.add(term);
              hit.fields.add(f);
            }
          }
        }
      return hit;
    };
    return { ids: s.ids.subarray(0, nIds), scores: pieceScore, score: scoreOf, detail };
  }

  /** Scratch arrays sized to the documents and pieces, reused across queries (grown, never shrunk). */
  private scratchFor(docs: number, pieces: number): Scratch {
    let s = this.scratch;
    if (!s || s.score.length < docs) {
      const n = docs + 1024;
      s = {
        ...(s ?? emptyPieces(0)),
        score: new Float64Array(n),
        hitCount: new Uint16Array(n),
        first: new Int32Array(n),
        live: new Int32Array(n),
      };
    }
    if (s.pieceScore.length < pieces) s = { ...s, ...emptyPieces(pieces + 1024) };
    return (this.scratch = s);
  }
}

type Scratch = {
  score: Float64Array;
  hitCount: Uint16Array;
  first: Int32Array;
  live: Int32Array;
  pieceScore: Float64Array;
  matched: Uint32Array;
  own: Uint32Array;
  ids: Int32Array;
  stamp: number;
};
const emptyPieces = (n: number) => ({
  pieceScore: new Float64Array(n),
  matched: new Uint32Array(n),
  own: new Uint32Array(n),
  ids: new Int32Array(n),
  stamp: 0,
});

function clearDocs(docs: Int32Array, n: number, score: Float64Array, hitCount: Uint16Array) {
  for (let i = 0; i < n; i++) {
    score[docs[i]] = 0;
    hitCount[docs[i]] = 0;
  }
}

const list = (xs: string[]) => xs.join(' ; ');

/** The index terms of a document, as minisearch derives them (tokenize, then lower case). */
function termsOf(e: IndexedDoc): Set<string> {
  const out = new Set<string>();
  for (const f of TEXT_FIELDS) {
    const text = e[f];
    if (text) for (const tok of tokenize(text)) out.add(tok.toLowerCase());
  }
  return out;
}

function pieceEntry(p: PieceDoc): IndexedDoc {
  return {
    id: `p${p.id}`,
    kind: 'piece',
    refId: p.id,
    pieceId: p.id,
    accessionNumber: p.accessionNumber,
    title: p.title,
    objectName: p.objectName,
    description: p.description,
    provenance: p.provenance,
    place: p.place,
    techniques: list(p.techniques),
    dyestuffs: list(p.dyestuffs),
    historicalMordants: list(p.historicalMordants),
    modernMordants: list(p.modernMordants),
  };
}

function trialEntry(t: TrialDoc): IndexedDoc {
  return {
    id: `t${t.id}`,
    kind: 'trial',
    refId: t.id,
    pieceId: t.pieceId,
    trialCode: t.code,
    notes: t.notes,
    dyestuffs: list(t.dyestuffs),
    modernMordants: list(t.modernMordants),
  };
}

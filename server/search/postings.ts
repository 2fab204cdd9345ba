/**
 * Flat copies of minisearch's postings for the text scorer (text-index.ts): per index term, the documents and
 * term frequencies field by field in typed arrays, and per short document id its field lengths, piece and kind.
 * BM25+ is then worked out while scoring from these and minisearch's current document count and average field
 * lengths, so an edit only invalidates the terms of the documents it touched (not every cached term), and a
 * word found in most documents is one pass over typed arrays rather than over nested Maps.
 */

export type Postings = Map<number, Map<number, number>>;
/**
 * The parts of minisearch's index read here and by the scorer (pinned minisearch 7.2.0; checked against its own search in
 * tests/unit/text-index.test.ts). Private fields, read on purpose: why, and what an upgrade must re-check, in README.md (invariant 3).
 */
export type MsInternals = {
  _index: Iterable<[string, Postings]> & {
    get(t: string): Postings | undefined;
    atPrefix(t: string): Iterable<[string, Postings]>;
    fuzzyGet(t: string, d: number): Map<string, [Postings, number]>;
  };
  _fieldIds: Record<string, number>;
  _avgFieldLength: number[];
  _fieldLength: Map<number, number[]>;
  _documentCount: number;
  _storedFields: Map<number, { kind: 'piece' | 'trial'; refId: number; pieceId: number | null }>;
  _nextId: number;
  _idToShortId: Map<string, number>;
  /** Written (not only read) by `bulkLoad` below, which fills a fresh index exactly as `addAll` would. */
  _documentIds: Map<number, string>;
};

// minisearch's BM25+ defaults (7.2.0).
const BM25 = { k: 1.2, b: 0.7, d: 0.5 };
/** Terms in fewer postings are read from minisearch's Maps each time rather than cached (accession numbers, rare words). */
const MIN_CACHED = 32;
/** Cached postings at most (8 bytes each: about 130 MB); past it the least recently used terms go first. */
const MAX_CACHED = 16_000_000;
/** Loading flattens every term worth caching up front, commonest first, up to this many postings, so no query pays for them. */
const WARM_BUDGET = 10_000_000;

type FlatTerm = { docs: Int32Array; tf: Int32Array; start: Int32Array };

export class PostingStore {
  private readonly nf: number;
  private readonly fids: number[];
  private readonly boosts: Float64Array;
  /** Capacity of the per-document tables (short ids below it). */
  private cap = 0;
  /** Field lengths, field-major (field f of document d at f * cap + d), so one field's postings read them in order. */
  private fieldLen = new Float64Array(0);
  /** Piece id of each short document id (-1 when removed or not a piece's) and whether it is a trial. */
  piece = new Int32Array(0);
  trial = new Uint8Array(0);
  private cache = new Map<string, FlatTerm>();
  private cached = 0;

  constructor(
    private readonly ms: MsInternals,
    fields: readonly string[],
    boost: Partial<Record<string, number>>,
  ) {
    this.nf = fields.length;
    this.fids = fields.map((f) => ms._fieldIds[f]);
    this.boosts = Float64Array.from(fields, (f) => boost[f] ?? 1);
  }

  /** Build every table from minisearch's index (after a full load) and flatten the commonest terms not flat already. */
  rebuild() {
    this.cache.clear();
    this.cached = 0;
    this.grow(Math.ceil(this.ms._nextId * 1.25) + 1024, false);
    for (const doc of this.ms._storedFields.keys()) this.noteDoc(doc);
    const big: Array<[string, Postings, number]> = [];
    for (const [term, data] of this.ms._index) {
      // Terms from bulkLoad are flat already (and asking their size would build their Maps).
      if (data instanceof TermPostings && data.isFlat) continue;
      const size = sizeOf(data);
      if (size >= MIN_CACHED) big.push([term, data, size]);
    }
    let budget = WARM_BUDGET;
    for (const [term, data, size] of big.sort((x, y) => y[2] - x[2])) {
      if ((budget -= size) < 0) break;
      this.get(term, data);
    }
  }

  /** A document minisearch has just added: record its field lengths, piece and kind. */
  noteDoc(doc: number) {
    if (doc >= this.cap) this.grow(Math.max(doc + 1024, this.cap * 2), true);
    const lens = this.ms._fieldLength.get(doc);
    const st = this.ms._storedFields.get(doc);
    for (let f = 0; f < this.nf; f++) this.fieldLen[f * this.cap + doc] = lens?.[this.fids[f]] ?? 0;
    this.piece[doc] = st?.pieceId ?? -1;
    this.trial[doc] = st?.kind === 'trial' ? 1 : 0;
  }

  /** A document minisearch has just removed. */
  dropDoc(doc: number) {
    if (doc < this.cap) this.piece[doc] = -1;
  }

  /** Terms whose postings an added or removed document changed. */
  forget(terms: Iterable<string>) {
    for (const term of terms) {
      const hit = this.cache.get(term);
      if (!hit) continue;
      this.cache.delete(term);
      this.cached -= hit.docs.length;
    }
  }

  private grow(cap: number, keep: boolean) {
    const fieldLen = new Float64Array(cap * this.nf);
    const piece = new Int32Array(cap).fill(-1);
    const trial = new Uint8Array(cap);
    if (keep) {
      for (let f = 0; f < this.nf; f++) fieldLen.set(this.fieldLen.subarray(f * this.cap, (f + 1) * this.cap), f * cap);
      piece.set(this.piece);
      trial.set(this.trial);
    }
    Object.assign(this, { cap, fieldLen, piece, trial });
  }

  /** One term's postings, field by field (field f's run is start[f]..start[f + 1]). */
  private get(term: string, data: Postings): FlatTerm {
    // Straight from the bulk load's arrays while minisearch has not touched the term since.
    if (data instanceof TermPostings && data.isFlat) return data.flat();
    const hit = this.cache.get(term);
    if (hit) {
      // Re-inserting moves the term to the end of the Map's order: least recently used first out.
      this.cache.delete(term);
      this.cache.set(term, hit);
      return hit;
    }
    const size = sizeOf(data);
    const docs = new Int32Array(size);
    const tf = new Int32Array(size);
    const start = new Int32Array(this.nf + 1);
    let i = 0;
    for (let f = 0; f < this.nf; f++) {
      const freqs = data.get(this.fids[f]);
      if (freqs)
        for (const [doc, n] of freqs) {
          docs[i] = doc;
          tf[i++] = n;
        }
      start[f + 1] = i;
    }
    const out = { docs, tf, start };
    if (size < MIN_CACHED) return out;
    this.cached += size;
    for (const [old, { docs: d }] of this.cache) {
      if (this.cached <= MAX_CACHED) break;
      this.cache.delete(old);
      this.cached -= d.length;
    }
    this.cache.set(term, out);
    return out;
  }

  /**
   * Adds one expanded term of query word `w` (0-based), weighted by `weight` (prefix/fuzzy), to the documents
   * that matched every earlier word; appends the documents it reaches first for this word to `into` from `n`
   * and returns the new length. The BM25+ arithmetic is minisearch's, in its order, so scores come out identical.
   */
  score(term: string, data: Postings, weight: number, w: number, s: ScoreScratch, into: Int32Array, n: number): number {
    const ms = this.ms;
    const { docs, tf, start } = this.get(term, data);
    for (let f = 0; f < this.nf; f++) {
      const from = start[f];
      const to = start[f + 1];
      if (from === to) continue;
      const matching = to - from;
      const idf = Math.log(1 + (ms._documentCount - matching + 0.5) / (matching + 0.5));
      const k1 = BM25.k * (1 - BM25.b);
      const k2 = (BM25.k * BM25.b) / ms._avgFieldLength[this.fids[f]];
      const base = this.boosts[f] * idf;
      n = scoreRun(
        docs,
        tf,
        from,
        to,
        base,
        k1,
        k2,
        this.fieldLen,
        f * this.cap,
        weight,
        w,
        s.score,
        s.hitCount,
        into,
        n,
      );
    }
    return n;
  }
}

export type ScoreScratch = { score: Float64Array; hitCount: Uint16Array };

function sizeOf(data: Postings) {
  let size = 0;
  for (const freqs of data.values()) size += freqs.size;
  return size;
}

/**
 * The loop over every posting of one field of one term: a top-level function over typed arrays so the engine
 * optimises it. AND: only documents that matched every earlier word (hitCount ≥ w) are scored.
 */
function scoreRun(
  docs: Int32Array,
  tf: Int32Array,
  from: number,
  to: number,
  base: number,
  k1: number,
  k2: number,
  fieldLen: Float64Array,
  off: number,
  weight: number,
  w: number,
  score: Float64Array,
  hitCount: Uint16Array,
  into: Int32Array,
  n: number,
): number {
  const d = BM25.d;
  const kp1 = BM25.k + 1;
  for (let i = from; i < to; i++) {
    const doc = docs[i];
    const h = hitCount[doc];
    if (h < w) continue;
    const t = tf[i];
    score[doc] += weight * (base * (d + (t * kp1) / (t + k1 + k2 * fieldLen[off + doc])));
    if (h === w) {
      hitCount[doc] = w + 1;
      into[n++] = doc;
    }
  }
  return n;
}

/**
 * One term's postings as minisearch's index holds them (field id → document → term frequency), filled by `bulkLoad`
 * from flat arrays and turned into minisearch's own Maps only when something other than the scorer first reads or
 * writes them (an edit adding or removing a document with this term, or minisearch's `search()` in the tests).
 * Building minisearch's nested Maps for every posting was most of the load (about 25 s of a 30 s text load at
 * 166,667 pieces, measured 4 Dec 2026), and they were most of the heap; the scorer reads the flat arrays directly.
 * The Maps built on demand hold the same entries in the same order as `add()` would have made them.
 */
export class TermPostings implements Map<number, Map<number, number>> {
  private map: Map<number, Map<number, number>> | null = null;
  constructor(
    private readonly src: FlatIndex,
    private readonly t: number,
  ) {}

  get isFlat() {
    return this.map === null;
  }

  /** The postings field by field (FlatTerm's runs, offsets into the shared arrays); only while `isFlat`. */
  flat(): FlatTerm {
    const { nf, docs, tf, start } = this.src;
    return { docs, tf, start: start.subarray(this.t * nf, this.t * nf + nf + 1) };
  }

  private m(): Map<number, Map<number, number>> {
    if (this.map) return this.map;
    const { nf, fids, docs, tf, start } = this.src;
    const base = this.t * nf;
    // add() creates a field's Map when it first meets the term in that field: fields in order of their first
    // document, and by field order within one document. Documents within a field are in increasing order.
    const order: number[] = [];
    for (let f = 0; f < nf; f++) if (start[base + f + 1] > start[base + f]) order.push(f);
    order.sort((x, y) => docs[start[base + x]] - docs[start[base + y]] || x - y);
    const out = new Map<number, Map<number, number>>();
    for (const f of order) {
      const inner = new Map<number, number>();
      for (let i = start[base + f], end = start[base + f + 1]; i < end; i++) inner.set(docs[i], tf[i]);
      out.set(fids[f], inner);
    }
    return (this.map = out);
  }

  get size() {
    return this.m().size;
  }
  get(k: number) {
    return this.m().get(k);
  }
  set(k: number, v: Map<number, number>) {
    this.m().set(k, v);
    return this;
  }
  has(k: number) {
    return this.m().has(k);
  }
  delete(k: number) {
    return this.m().delete(k);
  }
  clear() {
    this.m().clear();
  }
  forEach(cb: (v: Map<number, number>, k: number, map: Map<number, Map<number, number>>) => void, thisArg?: unknown) {
    this.m().forEach((v, k) => cb.call(thisArg, v, k, this));
  }
  entries() {
    return this.m().entries();
  }
  keys() {
    return this.m().keys();
  }
  values() {
    return this.m().values();
  }
  [Symbol.iterator]() {
    return this.m()[Symbol.iterator]();
  }
  get [Symbol.toStringTag]() {
    return 'Map';
  }
}

/** Every posting of a bulk load: term t's field f (position in the fields list) is docs/tf[start[t·nf + f] .. start[t·nf + f + 1]). */
type FlatIndex = { nf: number; fids: number[]; docs: Int32Array; tf: Int32Array; start: Int32Array };

type BulkDoc = { id: string } & Record<string, unknown>;

function grown(a: Int32Array) {
  const b = new Int32Array(a.length * 2);
  b.set(a);
  return b;
}

/** The minisearch-independent part of a bulk load: every document tokenised into flat postings (see `bulkLoad`). */
type Tokenised = {
  docs: readonly BulkDoc[];
  terms: string[];
  /** Per document and field (d · nf + f): the field's length as add() counts it, -1 when the field is absent. */
  lengths: Int32Array;
  src: FlatIndex;
};

/**
 * Tokenises `docs` as minisearch's add() would (`tokenize`, then lower case), numbering terms in the order add() first
 * meets them, and gathers each term's postings field by field into flat arrays. A generator so it can run in slices
 * (`bulkLoadInSlices`): it yields every `slice` documents and returns the result.
 */
function* tokenise(
  docs: readonly BulkDoc[],
  fields: readonly string[],
  fids: readonly number[],
  tokenize: (text: string) => string[],
  scan: ((text: string, out: Int32Array) => number) | undefined,
  slice: number,
): Generator<void, Tokenised> {
  const nf = fields.length;
  const termIds = new Map<string, number>();
  const terms: string[] = [];
  const lengths = new Int32Array(docs.length * nf).fill(-1);
  // One row per (term, field, document): key = term · nf + field.
  let cap = 1 << 20;
  let key = new Int32Array(cap);
  let doc = new Int32Array(cap);
  let freq = new Int32Array(cap);
  let n = 0;
  let tfOf = new Int32Array(1 << 16);
  const touched: number[] = [];
  // Each distinct token as written, numbered once: its term (lower-cased; -1 when empty) and a stamp for counting the
  // distinct tokens of a field. Tokens are looked up by their range in the field's text (open addressing over a
  // hash of the characters), so the common case makes no string at all.
  let rawTerm = new Int32Array(1 << 16);
  let rawStamp = new Int32Array(1 << 16);
  let rawHash = new Int32Array(1 << 16);
  const rawStr: string[] = [];
  let table = new Int32Array(1 << 17); // token id + 1; 0 is empty
  let stamp = 0;
  let ranges = new Int32Array(1024);
  const rawId = (str: string, from: number, to: number): number => {
    let h = 0x811c9dc5 | 0;
    for (let i = from; i < to; i++) h = Math.imul(h ^ str.charCodeAt(i), 0x01000193);
    const mask = table.length - 1;
    for (let at = h & mask; ; at = (at + 1) & mask) {
      const slot = table[at];
      if (slot === 0) break;
      const id = slot - 1;
      if (rawHash[id] !== h) continue;
      const cand = rawStr[id];
      if (cand.length !== to - from) continue;
      let same = true;
      for (let i = 0; i < cand.length && same; i++) same = cand.charCodeAt(i) === str.charCodeAt(from + i);
      if (same) return id;
    }
    const id = rawStr.length;
    const tok = from === 0 && to === str.length ? str : str.slice(from, to);
    rawStr.push(tok);
    if (id >= rawTerm.length) {
      rawTerm = grown(rawTerm);
      rawStamp = grown(rawStamp);
      rawHash = grown(rawHash);
    }
    rawHash[id] = h;
    // A new term can only come with a new token: terms are numbered in the order add() first meets them.
    const term = tok.toLowerCase();
    let t = term ? termIds.get(term) : -1;
    if (t === undefined) {
      termIds.set(term, (t = terms.length));
      terms.push(term);
      if (t >= tfOf.length) tfOf = grown(tfOf);
    }
    rawTerm[id] = t;
    if (rawStr.length * 2 > table.length) {
      table = new Int32Array(table.length * 2);
      const m = table.length - 1;
      for (let j = 0; j < rawStr.length; j++) {
        let at = rawHash[j] & m;
        while (table[at] !== 0) at = (at + 1) & m;
        table[at] = j + 1;
      }
    } else {
      let at = h & mask;
      while (table[at] !== 0) at = (at + 1) & mask;
      table[at] = id + 1;
    }
    return id;
  };
  for (let short = 0; short < docs.length; short++) {
    if (short % slice === slice - 1) yield;
    const d = docs[short];
    for (let f = 0; f < nf; f++) {
      const value = d[fields[f]];
      if (value == null) continue;
      const text = String(value);
      if (ranges.length < 2 * text.length + 2) ranges = new Int32Array(2 * text.length + 2);
      let nTok = scan ? scan(text, ranges) : -1;
      const tokens = nTok < 0 ? tokenize(text) : null;
      if (tokens) nTok = tokens.length;
      stamp++;
      let distinct = 0;
      for (let k = 0; k < nTok; k++) {
        const r = tokens ? rawId(tokens[k], 0, tokens[k].length) : rawId(text, ranges[2 * k], ranges[2 * k + 1]);
        if (rawStamp[r] !== stamp) {
          rawStamp[r] = stamp;
          distinct++;
        }
        const t = rawTerm[r];
        if (t >= 0 && tfOf[t]++ === 0) touched.push(t);
      }
      // add() counts a field's length as its distinct tokens (before lower-casing).
      lengths[short * nf + f] = distinct;
      if (n + touched.length > cap) {
        cap = Math.max(cap * 2, n + touched.length);
        const grow = (a: Int32Array) => {
          const b = new Int32Array(cap);
          b.set(a.subarray(0, n));
          return b;
        };
        key = grow(key);
        doc = grow(doc);
        freq = grow(freq);
      }
      for (const t of touched) {
        key[n] = t * nf + f;
        doc[n] = short;
        freq[n++] = tfOf[t];
        tfOf[t] = 0;
      }
      touched.length = 0;
    }
  }
  yield;
  // Counting sort by (term, field); rows were made in document order, so each run's documents stay in order.
  const start = new Int32Array(terms.length * nf + 1);
  for (let i = 0; i < n; i++) start[key[i] + 1]++;
  for (let k = 0; k < terms.length * nf; k++) start[k + 1] += start[k];
  const next = start.slice(0, terms.length * nf);
  const docsOut = new Int32Array(n);
  const tfOut = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const at = next[key[i]]++;
    docsOut[at] = doc[i];
    tfOut[at] = freq[i];
  }
  return { docs, terms, lengths, src: { nf, fids: [...fids], docs: docsOut, tf: tfOut, start } };
}

type TokeniseArgs = {
  fields: readonly string[];
  tokenize: (text: string) => string[];
  /** Optional: the same tokens as ranges of the text (two numbers each; the count, or -1 to fall back to `tokenize`). */
  scan?: (text: string, out: Int32Array) => number;
};

/**
 * Fills a fresh minisearch index with `docs` exactly as `addAll(docs)` would (same short ids, stored fields, field
 * lengths, average field lengths computed with add()'s arithmetic in add()'s order, and terms entered into the radix
 * tree in the order add() first meets them, so its shape and iteration order are the same), but with each term's
 * postings in flat arrays behind a `TermPostings` rather than nested Maps. Assumes minisearch's default
 * `extractField` (document[field]) and `stringifyField` (toString), `tokenize` as given and `processTerm` lower-casing,
 * as `TextIndex` configures it, and that field i has id i. `tests/unit/text-index.test.ts` compares the result with
 * addAll's (`toJSON()`). Reads and writes minisearch's private fields (README.md, invariant 3).
 */
export function bulkLoad(ms: MsInternals, docs: readonly BulkDoc[], storeFields: readonly string[], a: TokeniseArgs) {
  const steps = bulkSteps(ms, docs, storeFields, a);
  while (!steps.next().done);
}

/**
 * `bulkLoad` in slices of about `budgetMs` milliseconds, yielding to the event loop in between, so a load of 166,667
 * pieces (seconds of work) does not stop the process answering other requests meanwhile. The index must not be
 * used until this resolves.
 */
export async function bulkLoadInSlices(
  ms: MsInternals,
  docs: readonly BulkDoc[],
  storeFields: readonly string[],
  a: TokeniseArgs,
  budgetMs = 40,
): Promise<void> {
  const steps = bulkSteps(ms, docs, storeFields, a);
  let until = performance.now() + budgetMs;
  while (!steps.next().done)
    if (performance.now() >= until) {
      await new Promise((resolve) => setImmediate(resolve));
      until = performance.now() + budgetMs;
    }
}

/** bulkLoad's work, yielding every few thousand documents or terms. */
function* bulkSteps(
  ms: MsInternals,
  docs: readonly BulkDoc[],
  storeFields: readonly string[],
  a: TokeniseArgs,
): Generator<void, void> {
  if (ms._documentCount || ms._nextId) throw new Error('bulkLoad needs an empty index');
  const { fields } = a;
  const nf = fields.length;
  const fids = fields.map((f) => ms._fieldIds[f]);
  if (fids.some((id, i) => id !== i)) throw new Error('bulkLoad expects field i to have id i');
  const { terms, lengths, src } = yield* tokenise(docs, fields, fids, a.tokenize, a.scan, 256);
  const avg = ms._avgFieldLength;
  for (const d of docs) {
    // addDocumentId
    const short = ms._nextId;
    if (short % 4096 === 4095) yield;
    ms._idToShortId.set(d.id, short);
    ms._documentIds.set(short, d.id);
    ms._documentCount += 1;
    ms._nextId += 1;
    // saveStoredFields
    const stored: Record<string, unknown> = {};
    for (const f of storeFields) if (d[f] !== undefined) stored[f] = d[f];
    ms._storedFields.set(short, stored as never);
    // addFieldLength, with its arithmetic
    const count = ms._documentCount - 1;
    let fieldLengths: number[] | undefined;
    for (let f = 0; f < nf; f++) {
      const len = lengths[short * nf + f];
      if (len < 0) continue;
      if (!fieldLengths) ms._fieldLength.set(short, (fieldLengths = []));
      fieldLengths[fids[f]] = len;
      avg[fids[f]] = ((avg[fids[f]] || 0) * count + len) / (count + 1);
    }
  }
  const index = ms._index as unknown as { set(term: string, data: Postings): void };
  for (let t = 0; t < terms.length; t++) {
    if (t % 8192 === 8191) yield;
    index.set(terms[t], new TermPostings(src, t));
  }
}

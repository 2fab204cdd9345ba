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

  /** Build every table from minisearch's index (after a full load) and flatten the commonest terms. */
  rebuild() {
    this.cache.clear();
    this.cached = 0;
    this.grow(Math.ceil(this.ms._nextId * 1.25) + 1024, false);
    for (const doc of this.ms._storedFields.keys()) this.noteDoc(doc);
    const big: Array<[string, Postings, number]> = [];
    for (const [term, data] of this.ms._index) {
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

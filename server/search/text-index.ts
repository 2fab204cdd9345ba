import MiniSearch from 'minisearch';
import type { PieceDoc, TrialDoc } from './docs.ts';

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
  'accessionNumber', 'title', 'objectName', 'description', 'provenance', 'place',
  'techniques', 'dyestuffs', 'historicalMordants', 'modernMordants', 'trialCode', 'notes',
] as const;
export type TextField = (typeof TEXT_FIELDS)[number];

// Accession numbers and trial codes first, then titles; then what the object is made of.
const BOOST: Partial<Record<TextField, number>> = { accessionNumber: 6, trialCode: 5, title: 4, objectName: 2, dyestuffs: 2, historicalMordants: 1.5, modernMordants: 1.5, techniques: 1.5 };

const EDGE = /^[\p{P}\p{S}]+|[\p{P}\p{S}]+$/gu;
const PARTS = /[\s\p{P}\p{S}]+/u;

/** Whole words (so "1931.4.12" and "iron(II)" match as typed) and their punctuation-free parts. */
export function tokenize(text: string): string[] {
  const out: string[] = [];
  for (const raw of text.split(/\s+/)) {
    const whole = raw.replace(EDGE, '');
    if (!whole) continue;
    out.push(whole);
    const parts = whole.split(PARTS).filter(Boolean);
    if (parts.length > 1) out.push(...parts);
  }
  return out;
}
const queryTokens = (text: string) => text.split(/\s+/).map((w) => w.replace(EDGE, '')).filter(Boolean);

export type TextHit = { score: number; terms: Set<string>; fields: Set<TextField>; viaTrials: string[] };

/** The pieces a text query matched: every score (for ranking and facets), details only when asked (for the page shown). */
export type TextMatches = {
  ids: number[];
  /** Scores indexed by piece id; meaningful only for the ids matched. */
  scores: Float64Array;
  score: (pieceId: number) => number | undefined;
  detail: (pieceId: number) => TextHit;
};

// minisearch's defaults (7.2.0): prefix/fuzzy weights and BM25+ parameters; the scorer below reproduces its formula.
const WEIGHT_PREFIX = 0.375;
const WEIGHT_FUZZY = 0.45;
const BM25 = { k: 1.2, b: 0.7, d: 0.5 };
const MAX_FUZZY = 2;
const prefixOk = (term: string) => term.length >= 2;
// 1 edit from 4 letters, 20 % of the length from 5 (at most MAX_FUZZY).
const fuzzyEdits = (term: string) => (term.length >= 5 ? Math.min(MAX_FUZZY, Math.round(term.length * 0.2)) : term.length >= 4 ? 1 : 0);

type Postings = Map<number, Map<number, number>>;
/** The parts of minisearch's index the scorer reads (pinned minisearch 7.2.0; checked against its own search in tests/unit/text-index.test.ts). */
type MsInternals = {
  _index: { get(t: string): Postings | undefined; atPrefix(t: string): Iterable<[string, Postings]>; fuzzyGet(t: string, d: number): Map<string, [Postings, number]> };
  _fieldIds: Record<string, number>;
  _avgFieldLength: number[];
  _fieldLength: Map<number, number[]>;
  _documentCount: number;
  _documentIds: Map<number, string>;
  _storedFields: Map<number, { kind: 'piece' | 'trial'; refId: number; pieceId: number | null }>;
  _nextId: number;
  _idToShortId: Map<string, number>;
};
type Expansion = { term: string; weight: number; data: Postings };

export class TextIndex {
  readonly pieces = new Map<number, PieceDoc>();
  /** The same documents in an array indexed by piece id, for lookups over tens of thousands of hits. */
  readonly byId: Array<PieceDoc | undefined> = [];
  readonly trials = new Map<number, TrialDoc>();
  private ms = this.fresh();
  /** Per short document id: field lengths (NF per document), piece id and kind, in typed arrays; rebuilt lazily after a change. */
  private flat: { fieldLen: Float64Array; piece: Int32Array; trial: Uint8Array } | null = null;
  /** Flattened postings per index term, valid while `flat` is (both are dropped on every change). */
  private posted = new Map<string, { docs: Int32Array; contrib: Float64Array }>();
  private postedSize = 0;
  private scratch: { score: Float64Array; hitCount: Uint16Array; seen: Uint16Array } | null = null;

  private flatten() {
    if (this.flat) return this.flat;
    this.posted.clear();
    this.postedSize = 0;
    const ms = this.ms as unknown as MsInternals;
    const n = ms._nextId;
    const nf = TEXT_FIELDS.length;
    const fieldLen = new Float64Array(n * nf);
    const piece = new Int32Array(n).fill(-1);
    const trial = new Uint8Array(n);
    const fids = TEXT_FIELDS.map((f) => ms._fieldIds[f]);
    for (const [doc, lens] of ms._fieldLength) for (let f = 0; f < nf; f++) fieldLen[doc * nf + f] = lens[fids[f]] ?? 0;
    for (const [doc, st] of ms._storedFields) {
      piece[doc] = st.pieceId ?? -1;
      trial[doc] = st.kind === 'trial' ? 1 : 0;
    }
    return (this.flat = { fieldLen, piece, trial });
  }

  private fresh() {
    this.flat = null;
    return new MiniSearch<IndexedDoc>({
      fields: [...TEXT_FIELDS],
      storeFields: ['kind', 'refId', 'pieceId'],
      tokenize,
      processTerm: (t) => t.toLowerCase(),
      searchOptions: { tokenize: queryTokens, processTerm: (t) => t.toLowerCase() },
    });
  }

  /** Replace everything (start-up). */
  load(pieces: PieceDoc[], trials: TrialDoc[]) {
    this.ms = this.fresh();
    this.pieces.clear();
    this.byId.length = 0;
    this.trials.clear();
    for (const p of pieces) {
      this.pieces.set(p.id, p);
      this.byId[p.id] = p;
    }
    for (const t of trials) this.trials.set(t.id, t);
    this.ms.addAll([...pieces.map(pieceEntry), ...trials.map(trialEntry)]);
    this.flat = null;
  }

  // remove() (not discard()) so the postings never hold stale documents and every score follows minisearch's formula exactly.
  setPiece(id: number, doc: PieceDoc | null) {
    this.flat = null;
    const prev = this.pieces.get(id);
    if (prev) this.ms.remove(pieceEntry(prev));
    this.pieces.delete(id);
    this.byId[id] = doc ?? undefined;
    if (doc) {
      this.pieces.set(id, doc);
      this.ms.add(pieceEntry(doc));
    }
  }

  setTrial(id: number, doc: TrialDoc | null) {
    this.flat = null;
    const prev = this.trials.get(id);
    if (prev) this.ms.remove(trialEntry(prev));
    this.trials.delete(id);
    if (doc) {
      this.trials.set(id, doc);
      this.ms.add(trialEntry(doc));
    }
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

  /**
   * One index term's postings over every field as flat arrays: document ids and each one's BM25+ contribution
   * with its field boost (idf, term frequency and field length do not depend on the query; the prefix/fuzzy
   * weight does, and multiplies in). Built on first use and kept until the index changes, so a common word is
   * a pass over two typed arrays rather than over nested Maps.
   */
  private postings(term: string, data: Postings) {
    const hit = this.posted.get(term);
    if (hit) return hit;
    const ms = this.ms as unknown as MsInternals;
    const { fieldLen } = this.flatten();
    const nf = TEXT_FIELDS.length;
    let size = 0;
    for (const freqs of data.values()) size += freqs.size;
    const docs = new Int32Array(size);
    const contrib = new Float64Array(size);
    let i = 0;
    for (let f = 0; f < nf; f++) {
      const fid = ms._fieldIds[TEXT_FIELDS[f]];
      const freqs = data.get(fid);
      if (!freqs) continue;
      const matching = freqs.size;
      const idf = Math.log(1 + (ms._documentCount - matching + 0.5) / (matching + 0.5));
      const k1 = BM25.k * (1 - BM25.b);
      const k2 = (BM25.k * BM25.b) / ms._avgFieldLength[fid];
      const base = (BOOST[TEXT_FIELDS[f]] ?? 1) * idf;
      for (const [doc, tf] of freqs) {
        docs[i] = doc;
        contrib[i++] = base * (BM25.d + (tf * (BM25.k + 1)) / (tf + k1 + k2 * fieldLen[doc * nf + f]));
      }
    }
    const out = { docs: docs.subarray(0, i), contrib: contrib.subarray(0, i) };
    // Bounded: a few million cached postings at most, then start again.
    if ((this.postedSize += i) > 4_000_000) {
      this.posted.clear();
      this.postedSize = i;
    }
    this.posted.set(term, out);
    return out;
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
   * worked out only for the pieces a page shows.
   */
  search(q: string, withTrials: boolean): TextMatches {
    const ms = this.ms as unknown as MsInternals;
    const words = queryTokens(q).map((t) => t.toLowerCase());
    const perWord = words.map((w) => this.expand(w));
    const n = ms._nextId;
    // Per-document scratch reused across queries (zeroed again below over the documents this query touched).
    if (!this.scratch || this.scratch.score.length < n) this.scratch = { score: new Float64Array(n), hitCount: new Uint16Array(n), seen: new Uint16Array(n) };
    const { score, hitCount, seen } = this.scratch;
    let first: number[] = [];
    const { piece, trial } = this.flatten();
    let live: number[] = [];
    perWord.forEach((exps, w) => {
      const stamp = w + 1;
      const touched: number[] = [];
      for (const { term, weight, data } of exps) {
        const { docs, contrib } = this.postings(term, data);
        for (let i = 0; i < docs.length; i++) {
          const doc = docs[i];
          // AND: after the first word, only documents that matched every earlier word can still match.
          if (hitCount[doc] !== w) continue;
          score[doc] += weight * contrib[i];
          if (seen[doc] !== stamp) {
            seen[doc] = stamp;
            touched.push(doc);
          }
        }
      }
      for (const doc of touched) hitCount[doc] = w + 1;
      if (!w) first = touched;
      live = touched;
    });
    // minisearch multiplies by the number of distinct query words a document matched: all of them, under AND.
    const quality = new Set(words).size;
    const maxPiece = Math.max(0, this.byId.length - 1);
    const pieceScore = new Float64Array(maxPiece + 1);
    const matched = new Uint8Array(maxPiece + 1);
    const ownMatched = new Uint8Array(maxPiece + 1);
    const ids: number[] = [];
    const trialsOf = new Map<number, number[]>();
    if (words.length)
      for (const doc of live) {
        const pid = piece[doc];
        if (pid < 0 || pid > maxPiece || (trial[doc] && !withTrials)) continue;
        pieceScore[pid] += score[doc] * quality;
        if (!matched[pid]) {
          matched[pid] = 1;
          ids.push(pid);
        }
        if (trial[doc]) trialsOf.set(pid, [...(trialsOf.get(pid) ?? []), doc]);
        else ownMatched[pid] = 1;
      }
    // Every document scored was touched by the first word (AND), so this clears the scratch.
    for (const doc of first) {
      score[doc] = 0;
      hitCount[doc] = 0;
      seen[doc] = 0;
    }
    const scoreOf = (pid: number) => (pid <= maxPiece && matched[pid] ? pieceScore[pid] : undefined);
    // Which expanded terms and fields a page's document holds: tokenise its own fields (as the index did) against the term set.
    const expanded = new Set(perWord.flatMap((exps) => exps.map((e) => e.term)));
    const detail = (pieceId: number): TextHit => {
      const hit: TextHit = { score: scoreOf(pieceId) ?? 0, terms: new Set(), fields: new Set(), viaTrials: [] };
      const doc = this.pieces.get(pieceId);
      const entries: IndexedDoc[] = [];
      if (doc && pieceId <= maxPiece && ownMatched[pieceId]) entries.push(pieceEntry(doc));
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
    return { ids, scores: pieceScore, score: scoreOf, detail };
  }
}

const list = (xs: string[]) => xs.join(' ; ');

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

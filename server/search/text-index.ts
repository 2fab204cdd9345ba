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

export class TextIndex {
  readonly pieces = new Map<number, PieceDoc>();
  readonly trials = new Map<number, TrialDoc>();
  private ms = this.fresh();

  private fresh() {
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
    this.trials.clear();
    for (const p of pieces) this.pieces.set(p.id, p);
    for (const t of trials) this.trials.set(t.id, t);
    this.ms.addAll([...pieces.map(pieceEntry), ...trials.map(trialEntry)]);
  }

  setPiece(id: number, doc: PieceDoc | null) {
    if (this.pieces.has(id)) this.ms.discard(`p${id}`);
    this.pieces.delete(id);
    if (doc) {
      this.pieces.set(id, doc);
      this.ms.add(pieceEntry(doc));
    }
  }

  setTrial(id: number, doc: TrialDoc | null) {
    if (this.trials.has(id)) this.ms.discard(`t${id}`);
    this.trials.delete(id);
    if (doc) {
      this.trials.set(id, doc);
      this.ms.add(trialEntry(doc));
    }
  }

  /**
   * Pieces matching every word (prefix and fuzzy), scored by minisearch with the
   * field boosts; trial hits count for their piece when `withTrials`.
   */
  search(q: string, withTrials: boolean): Map<number, TextHit> {
    const hits = new Map<number, TextHit>();
    const results = this.ms.search(q, {
      prefix: (term) => term.length >= 2,
      fuzzy: (term) => (term.length >= 5 ? 0.2 : term.length >= 4 ? 1 : 0),
      maxFuzzy: 2,
      boost: BOOST,
      combineWith: 'AND',
      filter: (r) => withTrials || r.kind === 'piece',
    });
    for (const r of results) {
      const pieceId = r.pieceId as number | null;
      if (pieceId == null) continue;
      const hit = hits.get(pieceId) ?? { score: 0, terms: new Set<string>(), fields: new Set<TextField>(), viaTrials: [] };
      hit.score += r.score;
      for (const [term, fields] of Object.entries(r.match)) {
        hit.terms.add(term);
        for (const f of fields) hit.fields.add(f as TextField);
      }
      if (r.kind === 'trial') hit.viaTrials.push(this.trials.get(r.refId as number)?.code ?? '');
      hits.set(pieceId, hit);
    }
    return hits;
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

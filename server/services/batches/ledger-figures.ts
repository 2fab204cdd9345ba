import type { BatchEventType, BatchIngredient } from '../../models/batches.ts';

/**
 * Interim ledger walk for the batch routes, kept to what the routes need until
 * the shared ledger module (shared/compute/ledger.ts) takes it over.
 * Strength is relative to the fresh charge (1 = as made) and is an estimate:
 * each use takes `uptakePerUse` of what is left [CP].
 */
export type LedgerBatch = { volumeMl: number; ingredients: BatchIngredient[]; uptakePerUse: number };
export type LedgerEvent = { id: number; type: BatchEventType; volumeMl: number | null; fibreMassG: number | null; additions: BatchIngredient[] | null; occurredAt: Date };
export type TimelinePoint = { eventId: number | null; at: string; type: BatchEventType | 'made'; remainingMl: number; strength: number };

export const LOW_STRENGTH = 0.5; // below half the fresh charge, check with a test strip [CP]
export const TOP_UP_SHARE = { low: 0.25, high: 0.5 }; // 25–50 % of the original charge per reuse [CP, FM]

export function walkLedger(batch: LedgerBatch, events: LedgerEvent[], madeAt: string) {
  const charge = batch.ingredients.reduce((s, i) => s + i.grams, 0);
  let remainingMl = batch.volumeMl;
  let strength = 1;
  let uses = 0;
  let fibreMassG = 0;
  let lastStripAfterUse = -1;
  const timeline: TimelinePoint[] = [{ eventId: null, at: madeAt, type: 'made', remainingMl, strength }];
  for (const e of events) {
    if (e.type === 'use') {
      remainingMl -= e.volumeMl ?? 0;
      uses += 1;
      fibreMassG += e.fibreMassG ?? 0;
      strength *= 1 - batch.uptakePerUse;
    } else if (e.type === 'water' || e.type === 'top-up') {
      const added = e.volumeMl ?? 0;
      const before = remainingMl;
      remainingMl += added;
      // Water dilutes; chemicals added restore part of the charge.
      if (remainingMl > 0) strength = (strength * before) / remainingMl;
      if (e.type === 'top-up' && charge > 0) {
        const grams = (e.additions ?? []).reduce((s, a) => s + a.grams, 0);
        strength += (grams / charge) * (batch.volumeMl / Math.max(remainingMl, 1));
      }
    } else if (e.type === 'test-strip') {
      lastStripAfterUse = uses;
    }
    remainingMl = Math.max(0, round(remainingMl));
    timeline.push({ eventId: e.id, at: e.occurredAt.toISOString(), type: e.type, remainingMl, strength: round(strength, 3) });
  }
  const topUpSuggestion =
    uses > 0
      ? batch.ingredients.map((i) => ({ name: i.name, refId: i.refId, kind: i.kind, lowG: round(i.grams * TOP_UP_SHARE.low, 1), highG: round(i.grams * TOP_UP_SHARE.high, 1) }))
      : [];
  const testStripDue = strength < LOW_STRENGTH && lastStripAfterUse < uses;
  return { remainingMl, uses, fibreMassG: round(fibreMassG, 1), estimatedStrength: round(strength, 3), topUpSuggestion, testStripDue, timeline };
}

function round(x: number, digits = 2) {
  const f = 10 ** digits;
  return Math.round(x * f) / f;
}

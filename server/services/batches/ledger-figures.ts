import {
  computeLedger,
  LedgerError,
  referenceLoadG,
  tryEvent,
  type LedgerBatch,
  type LedgerEvent,
} from '../../../shared/compute/ledger.ts';
import { HttpError } from '../../http/errors.ts';
import type { BatchEvent, MordantBatch } from '../../models/index.ts';
import { DRAW_ONLY_KINDS, type BatchEventInput } from '../../../shared/schemas/batches.ts';

/** Maps stored batches and events onto the shared ledger (shared/compute/ledger.ts), which does all the arithmetic. */
export function ledgerBatch(b: MordantBatch, thickenerIds: ReadonlySet<number>): LedgerBatch {
  return {
    volumeMl: b.volumeMl,
    ingredients: b.ingredients.map((i) => ({
      name: i.name,
      grams: i.grams,
      refId: i.refId,
      thickener: i.kind === 'chemical' && thickenerIds.has(i.refId),
    })),
    uptakePerUse: b.uptakePerUse,
    drawOnly: DRAW_ONLY_KINDS.includes(b.kind),
    status: b.status,
  };
}

type EventLike = Pick<
  BatchEvent,
  'type' | 'volumeMl' | 'fibreMassG' | 'additions' | 'ph' | 'result' | 'route' | 'ruleFollowed'
> & { reason?: string | null };

export function ledgerEvent(e: EventLike, thickenerIds: ReadonlySet<number>): LedgerEvent {
  switch (e.type) {
    case 'use':
      return { type: 'use', volumeMl: e.volumeMl ?? 0, fibreMassG: e.fibreMassG };
    case 'top-up':
      return {
        type: 'top-up',
        volumeMl: e.volumeMl,
        additions: (e.additions ?? []).map((a) => ({
          name: a.name,
          grams: a.grams,
          refId: a.refId,
          thickener: a.kind === 'chemical' && thickenerIds.has(a.refId),
        })),
      };
    case 'water':
      return { type: 'water', volumeMl: e.volumeMl ?? 0 };
    case 'test-strip':
      return { type: 'test-strip', result: e.result };
    case 'ph':
      return { type: 'ph', ph: e.ph ?? Number.NaN };
    case 'disposal':
      return { type: 'disposal', route: e.route, ruleFollowed: e.ruleFollowed, reason: e.reason ?? null };
  }
}

// A disposal already in the ledger was accepted when it was recorded (exhausted, or with a reason kept in its notes).
const stored = (e: BatchEvent, t: ReadonlySet<number>) =>
  ledgerEvent(e.type === 'disposal' ? { ...e.get({ plain: true }), reason: 'accepted when recorded' } : e, t);

const asHttp = (err: LedgerError) =>
  new HttpError(err.status, err.status === 409 ? 'conflict' : 'unprocessable', err.message, {
    reason: err.code,
    ...err.details,
    ...(err.code === 'not-exhausted'
      ? { fields: { reason: ['Say why the batch is disposed of before it is exhausted'] } }
      : {}),
  });

const r = (x: number, d = 1) => Math.round(x * 10 ** d) / 10 ** d;

/** The figures every batch answer carries, from the replayed ledger. */
export function figures(b: MordantBatch, events: BatchEvent[], thickenerIds: ReadonlySet<number>) {
  let ledger;
  try {
    ledger = computeLedger(
      ledgerBatch(b, thickenerIds),
      events.map((e) => stored(e, thickenerIds)),
    );
  } catch (err) {
    if (err instanceof LedgerError)
      throw new HttpError(500, 'ledger_inconsistent', `The stored ledger of ${b.code} does not replay: ${err.message}`);
    throw err;
  }
  const s = ledger.state;
  return {
    remainingMl: r(s.remainingMl),
    uses: s.uses,
    fibreMassG: r(s.fibreMassG),
    estimatedStrength: r(s.strength, 3),
    exhaustedEstimate: ledger.exhaustedEstimate,
    topUp: ledger.topUp
      ? {
          ...ledger.topUp,
          ingredients: ledger.topUp.ingredients.map((i) => ({ ...i, grams: r(i.grams, 2) })),
          waterMl: r(ledger.topUp.waterMl),
          volumeAfterMl: r(ledger.topUp.volumeAfterMl),
        }
      : null,
    referenceLoadG: r(referenceLoadG(ledgerBatch(b, thickenerIds))),
    testStrip: ledger.testStrip,
    timeline: ledger.timeline.map((p, i) => ({
      eventId: i === 0 ? null : events[i - 1].id,
      at: i === 0 ? `${b.madeOn}T00:00:00.000Z` : events[i - 1].occurredAt.toISOString(),
      type: p.type,
      remainingMl: r(p.remainingMl),
      strength: r(p.strength, 3),
    })),
  };
}
export type Figures = ReturnType<typeof figures>;

/** Refuse an event the ledger would not accept (overdraw, disposed, not exhausted) before anything is written. */
export function checkEvent(
  b: MordantBatch,
  events: BatchEvent[],
  input: BatchEventInput,
  thickenerIds: ReadonlySet<number>,
) {
  const next = ledgerEvent(
    {
      ...input,
      volumeMl: input.volumeMl ?? null,
      fibreMassG: input.fibreMassG ?? null,
      additions: input.additions ?? null,
      ph: input.ph ?? null,
      result: input.result ?? null,
      route: input.route ?? null,
      ruleFollowed: input.ruleFollowed ?? null,
      reason: input.reason ?? null,
    },
    thickenerIds,
  );
  const res = tryEvent(
    ledgerBatch(b, thickenerIds),
    events.map((e) => stored(e, thickenerIds)),
    next,
  );
  if (!res.ok) throw asHttp(res.error);
  return res.ledger;
}

/**
 * Replay a whole changed history (events edited, removed or added in place): the ledger after it, or the
 * refusal as an HTTP error. Stored disposals count as accepted when they were recorded.
 */
export function checkHistory(b: MordantBatch, events: EventLike[], thickenerIds: ReadonlySet<number>) {
  try {
    return computeLedger(
      ledgerBatch(b, thickenerIds),
      events.map((e) =>
        ledgerEvent(e.type === 'disposal' ? { ...e, reason: 'accepted when recorded' } : e, thickenerIds),
      ),
    );
  } catch (err) {
    if (err instanceof LedgerError) throw asHttp(err);
    throw err;
  }
}

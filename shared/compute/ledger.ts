/**
 * The bath ledger (BRIEF §4.3): a mordant bath or print paste kept in use, topped up,
 * until it is exhausted. Everything here is derived from the batch and its ordered
 * events; strength is an ESTIMATE from the dyer's uptake-per-use figure, not a measurement.
 * Volumes in millilitres, masses in grams.
 */

export type LedgerIngredient = { name: string; grams: number; refId?: number | null; thickener?: boolean };
export type LedgerBatch = {
  volumeMl: number;
  ingredients: LedgerIngredient[];
  /** Estimated fraction (0–1) of the bath's mordant that one use takes up; 0 for a stock that is only drawn from. */
  uptakePerUse: number;
  status?: 'active' | 'exhausted' | 'disposed';
};

export type LedgerEvent =
  | { type: 'use'; volumeMl: number; fibreMassG?: number | null }
  | { type: 'top-up'; additions?: LedgerIngredient[] | null; volumeMl?: number | null }
  | { type: 'water'; volumeMl: number }
  | { type: 'test-strip'; result?: string | null; deltaE?: number | null }
  | { type: 'ph'; ph: number }
  | { type: 'disposal'; route?: string | null; ruleFollowed?: string | null; reason?: string | null };

/** A refused event, with the HTTP status the server answers: 409 conflicts with the batch's state, 422 cannot be applied. */
export class LedgerError extends Error {
  constructor(
    public code: 'overdraw' | 'disposed' | 'not-exhausted' | 'invalid-event',
    public status: 409 | 422,
    message: string,
    public details?: Record<string, unknown>,
  ) {
    super(message);
  }
}

/**
 * Top-up rule: add 25–50 % of the original charge for each reuse since the last
 * top-up, and water back to the original volume. Common practice, from memory;
 * confirm with a test strip rather than relying on it.
 */
export const TOP_UP_RULE = { minFraction: 0.25, maxFraction: 0.5, source: 'common practice, from memory' } as const;

/**
 * When to prompt a test strip (common practice, from memory): the estimated strength
 * is below half the original, the last strip drifted more than ΔE00 2 from the first,
 * or three uses have passed without a strip.
 */
export const TEST_STRIP_RULE = { lowStrength: 0.5, driftDeltaE: 2, usesWithoutStrip: 3, source: 'common practice, from memory' } as const;

/** Below this estimated strength the bath is probably spent (common practice, from memory). */
export const EXHAUSTED_BELOW = 0.15;

export type LedgerState = {
  remainingMl: number;
  uses: number;
  fibreMassG: number;
  /** Estimated grams of active ingredients (thickeners excluded) now in the bath. */
  chargeG: number;
  /** Estimated concentration relative to the original bath (1 = as made). */
  strength: number;
  /** Estimated fraction of the original charge still in the bath. */
  chargeFraction: number;
  usesSinceTopUp: number;
  usesSinceStrip: number;
  firstStripDeltaE: number | null;
  lastStripDeltaE: number | null;
  lastPh: number | null;
  disposed: boolean;
};

export type TimelinePoint = { index: number; type: LedgerEvent['type'] | 'made'; remainingMl: number; strength: number; chargeFraction: number };

const activeGrams = (list: readonly LedgerIngredient[] | null | undefined) => (list ?? []).filter((i) => !i.thickener).reduce((s, i) => s + i.grams, 0);

/** The bath as made; a disposal is known only from a disposal event in the history. */
export function initialState(batch: LedgerBatch): LedgerState {
  const chargeG = activeGrams(batch.ingredients);
  return {
    remainingMl: batch.volumeMl,
    uses: 0,
    fibreMassG: 0,
    chargeG,
    strength: 1,
    chargeFraction: 1,
    usesSinceTopUp: 0,
    usesSinceStrip: 0,
    firstStripDeltaE: null,
    lastStripDeltaE: null,
    lastPh: null,
    disposed: false,
  };
}

const positive = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x) && x > 0;

/** Apply one event; throws a LedgerError and leaves the state untouched when it is refused. */
export function applyEvent(batch: LedgerBatch, s: LedgerState, e: LedgerEvent, opts: { exhausted?: boolean } = {}): LedgerState {
  if (s.disposed) throw new LedgerError('disposed', 409, 'This batch has been disposed of; no further events can be recorded.');
  const charge0 = activeGrams(batch.ingredients);
  const withCharge = (next: LedgerState): LedgerState => {
    const chargeFraction = charge0 > 0 ? next.chargeG / charge0 : 0;
    const strength = next.remainingMl > 0 && charge0 > 0 ? next.chargeG / next.remainingMl / (charge0 / batch.volumeMl) : 0;
    return { ...next, chargeFraction, strength };
  };
  switch (e.type) {
    case 'use': {
      if (!positive(e.volumeMl)) throw new LedgerError('invalid-event', 422, 'A use needs the volume drawn, in mL, greater than zero.');
      if (e.volumeMl > s.remainingMl + 1e-9) {
        throw new LedgerError('overdraw', 409, `Only ${round1(s.remainingMl)} mL are left; ${round1(e.volumeMl)} mL cannot be drawn.`, {
          remainingMl: s.remainingMl,
          requestedMl: e.volumeMl,
        });
      }
      // The liquid drawn carries its share of the mordant; the fibre takes up the estimated fraction of what stays.
      const remainingMl = s.remainingMl - e.volumeMl;
      const kept = s.remainingMl > 0 ? s.chargeG * (remainingMl / s.remainingMl) : 0;
      const uptake = Math.min(Math.max(batch.uptakePerUse, 0), 1);
      return withCharge({
        ...s,
        remainingMl,
        chargeG: kept * (1 - uptake),
        uses: s.uses + 1,
        fibreMassG: s.fibreMassG + (e.fibreMassG ?? 0),
        usesSinceTopUp: s.usesSinceTopUp + 1,
        usesSinceStrip: s.usesSinceStrip + 1,
      });
    }
    case 'top-up': {
      const addedG = activeGrams(e.additions);
      const addedMl = e.volumeMl ?? 0;
      if (addedMl < 0 || !(addedG > 0 || addedMl > 0)) throw new LedgerError('invalid-event', 422, 'A top-up needs chemicals added, water added, or both.');
      return withCharge({ ...s, chargeG: s.chargeG + addedG, remainingMl: s.remainingMl + addedMl, usesSinceTopUp: 0 });
    }
    case 'water':
      if (!positive(e.volumeMl)) throw new LedgerError('invalid-event', 422, 'Water added needs a volume in mL greater than zero.');
      return withCharge({ ...s, remainingMl: s.remainingMl + e.volumeMl });
    case 'test-strip': {
      const d = e.deltaE ?? null;
      return { ...s, usesSinceStrip: 0, firstStripDeltaE: s.firstStripDeltaE ?? d, lastStripDeltaE: d ?? s.lastStripDeltaE };
    }
    case 'ph':
      if (!(e.ph >= 0 && e.ph <= 14)) throw new LedgerError('invalid-event', 422, 'A pH reading lies between 0 and 14.');
      return { ...s, lastPh: e.ph };
    case 'disposal': {
      const spent = opts.exhausted || batch.status === 'exhausted' || s.remainingMl <= 0 || s.strength < EXHAUSTED_BELOW;
      if (!spent && !e.reason?.trim()) {
        throw new LedgerError('not-exhausted', 422, 'This batch is not exhausted; give a reason for disposing of it.');
      }
      return { ...s, disposed: true };
    }
  }
}

const round1 = (x: number) => Math.round(x * 10) / 10;

export type TopUpSuggestion = {
  usesSinceTopUp: number;
  ingredients: Array<{ name: string; refId: number | null; minG: number; maxG: number }>;
  waterMl: number;
  rule: typeof TOP_UP_RULE;
};

/** The documented top-up rule applied to the uses since the last top-up; null when nothing is due. */
export function suggestTopUp(batch: LedgerBatch, s: LedgerState): TopUpSuggestion | null {
  if (s.disposed || s.usesSinceTopUp === 0) return null;
  const n = s.usesSinceTopUp;
  return {
    usesSinceTopUp: n,
    ingredients: batch.ingredients
      .filter((i) => !i.thickener)
      .map((i) => ({ name: i.name, refId: i.refId ?? null, minG: i.grams * TOP_UP_RULE.minFraction * n, maxG: i.grams * TOP_UP_RULE.maxFraction * n })),
    waterMl: Math.max(0, batch.volumeMl - s.remainingMl),
    rule: TOP_UP_RULE,
  };
}

export type StripPrompt = { due: boolean; reasons: Array<'low-strength' | 'drift' | 'many-uses'> };

export function testStripPrompt(s: LedgerState): StripPrompt {
  const reasons: StripPrompt['reasons'] = [];
  if (s.disposed) return { due: false, reasons };
  if (s.strength < TEST_STRIP_RULE.lowStrength) reasons.push('low-strength');
  if (s.firstStripDeltaE != null && s.lastStripDeltaE != null && Math.abs(s.lastStripDeltaE - s.firstStripDeltaE) > TEST_STRIP_RULE.driftDeltaE) reasons.push('drift');
  if (s.usesSinceStrip >= TEST_STRIP_RULE.usesWithoutStrip) reasons.push('many-uses');
  return { due: reasons.length > 0, reasons };
}

export type Ledger = {
  state: LedgerState;
  timeline: TimelinePoint[];
  topUp: TopUpSuggestion | null;
  testStrip: StripPrompt;
  /** Estimated spent: no liquid left, or strength under EXHAUSTED_BELOW. */
  exhaustedEstimate: boolean;
};

/** Replay a batch's ordered events; throws the first LedgerError met. */
export function computeLedger(batch: LedgerBatch, events: readonly LedgerEvent[]): Ledger {
  let state = initialState(batch);
  const timeline: TimelinePoint[] = [{ index: 0, type: 'made', remainingMl: state.remainingMl, strength: state.strength, chargeFraction: state.chargeFraction }];
  events.forEach((e, i) => {
    state = applyEvent(batch, state, e);
    timeline.push({ index: i + 1, type: e.type, remainingMl: state.remainingMl, strength: state.strength, chargeFraction: state.chargeFraction });
  });
  return {
    state,
    timeline,
    topUp: suggestTopUp(batch, state),
    testStrip: testStripPrompt(state),
    exhaustedEstimate: state.remainingMl <= 0 || state.strength < EXHAUSTED_BELOW,
  };
}

/** Check a new event against the history without changing anything: the ledger after it, or the refusal. */
export function tryEvent(batch: LedgerBatch, history: readonly LedgerEvent[], next: LedgerEvent): { ok: true; ledger: Ledger } | { ok: false; error: LedgerError } {
  try {
    return { ok: true, ledger: computeLedger(batch, [...history, next]) };
  } catch (err) {
    if (err instanceof LedgerError) return { ok: false, error: err };
    throw err;
  }
}

/**
 * The bath ledger (BRIEF §4.3): a mordant bath, stock or print paste kept in use, topped up,
 * until it is exhausted. Everything here is derived from the batch and its ordered
 * events; strength is an ESTIMATE from the dyer's uptake figure, not a measurement.
 * Volumes in millilitres, masses in grams.
 */

export type LedgerIngredient = { name: string; grams: number; refId?: number | null; thickener?: boolean };
export type LedgerBatch = {
  volumeMl: number;
  ingredients: LedgerIngredient[];
  /**
   * Estimated fraction (0–1) of the bath's mordant that one reference load of fibre takes up
   * (see `referenceLoadG`); a use without a fibre mass is liquor drawn off (for a paste or a child batch) and takes none.
   */
  uptakePerUse: number;
  /** A stock or print paste that is only drawn from: a use takes volume, never strength (the uptake is ignored). */
  drawOnly?: boolean;
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
 * The fibre mass one use of `uptakePerUse` refers to: the mass the made volume serves at a
 * liquor ratio of 1:20 (1 mL of water ≈ 1 g), so a 2000 mL bath has a 100 g reference load.
 * Immersion mordant baths are commonly run at about 1:20 to 1:40; common practice, recalled from memory.
 */
export const REFERENCE_LIQUOR_RATIO = { ratio: 20, source: 'common practice, recalled from memory' } as const;

/** The reference load of a batch in grams of dry fibre (made volume / 20). */
export const referenceLoadG = (batch: Pick<LedgerBatch, 'volumeMl'>) => batch.volumeMl / REFERENCE_LIQUOR_RATIO.ratio;

/**
 * Fraction of the mordant that stays in the bath after one use. The uptake compounds with the fibre
 * mass: kept = (1 − u)^(m / m_ref), so two half loads take up what one full load does. A use without a
 * fibre mass is liquor drawn off for a paste or a child batch: no fibre went in, so nothing is taken up (1);
 * a draw-only stock or paste keeps everything (1) whatever the fibre.
 */
export function keptFraction(batch: LedgerBatch, fibreMassG?: number | null): number {
  if (batch.drawOnly) return 1;
  const u = Math.min(Math.max(batch.uptakePerUse, 0), 1);
  if (u === 0) return 1;
  const loads = fibreMassG != null && fibreMassG > 0 ? fibreMassG / referenceLoadG(batch) : 0;
  return u === 1 ? 0 : (1 - u) ** loads;
}

/**
 * When to prompt a test strip (common practice, from memory): the estimated strength
 * is below half the original, the last strip drifted more than ΔE00 2 from the first,
 * or three uses have passed without a strip.
 */
export const TEST_STRIP_RULE = {
  lowStrength: 0.5,
  driftDeltaE: 2,
  usesWithoutStrip: 3,
  source: 'common practice, from memory',
} as const;

/** Below this estimated strength the bath is probably spent (common practice, from memory). */
export const EXHAUSTED_BELOW = 0.15;

export type LedgerState = {
  remainingMl: number;
  uses: number;
  fibreMassG: number;
  /** Estimated grams of active ingredients (thickeners excluded) now in the bath (see `madeCharge` for a batch listing none). */
  chargeG: number;
  /** Estimated grams of each ingredient now in the bath (thickeners included), by `ingredientKey`. */
  grams: Record<string, number>;
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

export type TimelinePoint = {
  index: number;
  type: LedgerEvent['type'] | 'made';
  remainingMl: number;
  strength: number;
  chargeFraction: number;
};

const activeGrams = (list: readonly LedgerIngredient[] | null | undefined) =>
  (list ?? []).filter((i) => !i.thickener).reduce((s, i) => s + i.grams, 0);

/**
 * The charge the strength is measured against: the active grams as made. A batch that lists no active
 * ingredient (a child made from its parent's liquor, say) is followed as its made liquor, 1 unit per mL,
 * so uses and water still move its strength.
 */
const madeCharge = (batch: LedgerBatch) => activeGrams(batch.ingredients) || batch.volumeMl;

/** One ingredient's key in `LedgerState.grams`: its reference id when it has one, else its name. */
export const ingredientKey = (i: Pick<LedgerIngredient, 'name' | 'refId'>) =>
  i.refId != null ? `#${i.refId}` : i.name;

const addGrams = (into: Record<string, number>, list: readonly LedgerIngredient[] | null | undefined) => {
  const out = { ...into };
  for (const i of list ?? []) out[ingredientKey(i)] = (out[ingredientKey(i)] ?? 0) + i.grams;
  return out;
};
const scaleGrams = (g: Record<string, number>, k: (key: string) => number) =>
  Object.fromEntries(Object.entries(g).map(([key, v]) => [key, v * k(key)]));

/** The bath as made; a disposal is known only from a disposal event in the history. */
export function initialState(batch: LedgerBatch): LedgerState {
  const chargeG = madeCharge(batch);
  return {
    remainingMl: batch.volumeMl,
    uses: 0,
    fibreMassG: 0,
    chargeG,
    grams: addGrams({}, batch.ingredients),
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

const thickenerKeys = (batch: LedgerBatch) => new Set(batch.ingredients.filter((i) => i.thickener).map(ingredientKey));

const positive = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x) && x > 0;

/** Apply one event; throws a LedgerError and leaves the state untouched when it is refused. */
export function applyEvent(
  batch: LedgerBatch,
  s: LedgerState,
  e: LedgerEvent,
  opts: { exhausted?: boolean } = {},
): LedgerState {
  if (s.disposed)
    throw new LedgerError('disposed', 409, 'This batch has been disposed of; no further events can be recorded.');
  const charge0 = madeCharge(batch);
  const withCharge = (next: LedgerState): LedgerState => {
    const chargeFraction = charge0 > 0 ? next.chargeG / charge0 : 0;
    const strength =
      next.remainingMl > 0 && charge0 > 0 ? next.chargeG / next.remainingMl / (charge0 / batch.volumeMl) : 0;
    return { ...next, chargeFraction, strength };
  };
  switch (e.type) {
    case 'use': {
      if (!positive(e.volumeMl))
        throw new LedgerError('invalid-event', 422, 'A use needs the volume drawn, in mL, greater than zero.');
      if (e.volumeMl > s.remainingMl + 1e-9) {
        throw new LedgerError(
          'overdraw',
          409,
          `Only ${round1(s.remainingMl)} mL are left; ${round1(e.volumeMl)} mL cannot be drawn.`,
          {
            remainingMl: s.remainingMl,
            requestedMl: e.volumeMl,
          },
        );
      }
      // The liquid drawn carries its share of every ingredient; the fibre takes up the estimated
      // fraction of the active ones that stay (thickeners are not taken up; a draw-only batch keeps its strength).
      const remainingMl = s.remainingMl - e.volumeMl;
      const share = s.remainingMl > 0 ? remainingMl / s.remainingMl : 0;
      const kept = keptFraction(batch, e.fibreMassG);
      const thick = thickenerKeys(batch);
      const grams = scaleGrams(s.grams, (key) => share * (thick.has(key) ? 1 : kept));
      return withCharge({
        ...s,
        remainingMl,
        grams,
        chargeG: s.chargeG * share * kept,
        uses: s.uses + 1,
        fibreMassG: s.fibreMassG + (e.fibreMassG ?? 0),
        usesSinceTopUp: s.usesSinceTopUp + 1,
        usesSinceStrip: s.usesSinceStrip + 1,
      });
    }
    case 'top-up': {
      const addedG = activeGrams(e.additions);
      const addedMl = e.volumeMl ?? 0;
      if (addedMl < 0 || !(addedG > 0 || addedMl > 0))
        throw new LedgerError('invalid-event', 422, 'A top-up needs chemicals added, water added, or both.');
      return withCharge({
        ...s,
        chargeG: s.chargeG + addedG,
        grams: addGrams(s.grams, e.additions),
        remainingMl: s.remainingMl + addedMl,
        usesSinceTopUp: 0,
      });
    }
    case 'water':
      if (!positive(e.volumeMl))
        throw new LedgerError('invalid-event', 422, 'Water added needs a volume in mL greater than zero.');
      return withCharge({ ...s, remainingMl: s.remainingMl + e.volumeMl });
    case 'test-strip': {
      const d = e.deltaE ?? null;
      return {
        ...s,
        usesSinceStrip: 0,
        firstStripDeltaE: s.firstStripDeltaE ?? d,
        lastStripDeltaE: d ?? s.lastStripDeltaE,
      };
    }
    case 'ph':
      if (!(e.ph >= 0 && e.ph <= 14))
        throw new LedgerError('invalid-event', 422, 'A pH reading lies between 0 and 14.');
      return { ...s, lastPh: e.ph };
    case 'disposal': {
      const spent =
        opts.exhausted || batch.status === 'exhausted' || s.remainingMl <= 0 || s.strength < EXHAUSTED_BELOW;
      if (!spent && !e.reason?.trim()) {
        throw new LedgerError('not-exhausted', 422, 'This batch is not exhausted; give a reason for disposing of it.');
      }
      return { ...s, disposed: true };
    }
  }
}

const round1 = (x: number) => Math.round(x * 10) / 10;

/**
 * What the top-up restores: every ingredient of the bath as made back to its made concentration
 * (g/L), in the volume after topping up, from the ledger's own estimate of the grams now in it.
 */
export const TOP_UP_RULE = {
  rule: 'restore the made strength: for each ingredient, made g/L × volume after topping up − the estimated grams now, and water back to the made volume; never above the made strength, never a dilution',
  source: 'mass balance on the ledger estimate (c·V); the uptake behind it is the dyer’s estimate',
} as const;

export type TopUpSuggestion = {
  usesSinceTopUp: number;
  /** Grams to add per ingredient (0 when that one is at its made concentration). */
  ingredients: Array<{ name: string; refId: number | null; grams: number; thickener: boolean }>;
  waterMl: number;
  /** The volume after the top-up: the made volume, or what is there now if that is more (no dilution). */
  volumeAfterMl: number;
  rule: typeof TOP_UP_RULE;
};

/** Relative shortfall below which an ingredient counts as at its made strength. */
const AT_STRENGTH = 1e-6;

/**
 * The top-up that brings the estimate back to the made strength; null when nothing is due (disposed,
 * empty, or every ingredient at its made concentration, as in a stock or paste that is only drawn from).
 */
export function suggestTopUp(batch: LedgerBatch, s: LedgerState): TopUpSuggestion | null {
  if (s.disposed || s.remainingMl <= 0 || !(batch.volumeMl > 0)) return null;
  // Each ingredient of the bath as made, by key, with its made concentration in g/mL.
  const made = new Map<string, { name: string; refId: number | null; thickener: boolean; perMl: number }>();
  for (const i of batch.ingredients) {
    const key = ingredientKey(i);
    const prev = made.get(key);
    made.set(key, {
      name: i.name,
      refId: i.refId ?? null,
      thickener: !!i.thickener,
      perMl: (prev?.perMl ?? 0) + i.grams / batch.volumeMl,
    });
  }
  const due = [...made.entries()].some(
    ([key, m]) => !m.thickener && m.perMl > 0 && (s.grams[key] ?? 0) / s.remainingMl < m.perMl * (1 - AT_STRENGTH),
  );
  if (!due) return null;
  // Water back to the made volume, never more: a bath above it keeps its volume (no dilution).
  const volumeAfterMl = Math.max(batch.volumeMl, s.remainingMl);
  return {
    usesSinceTopUp: s.usesSinceTopUp,
    ingredients: [...made.entries()].map(([key, m]) => ({
      name: m.name,
      refId: m.refId,
      thickener: m.thickener,
      // Never more than the made strength: an ingredient already at or above it gets nothing.
      grams: Math.max(0, m.perMl * volumeAfterMl - (s.grams[key] ?? 0)),
    })),
    waterMl: volumeAfterMl - s.remainingMl,
    volumeAfterMl,
    rule: TOP_UP_RULE,
  };
}

export type StripPrompt = { due: boolean; reasons: Array<'low-strength' | 'drift' | 'many-uses'> };

export function testStripPrompt(s: LedgerState): StripPrompt {
  const reasons: StripPrompt['reasons'] = [];
  if (s.disposed) return { due: false, reasons };
  if (s.strength < TEST_STRIP_RULE.lowStrength) reasons.push('low-strength');
  if (
    s.firstStripDeltaE != null &&
    s.lastStripDeltaE != null &&
    Math.abs(s.lastStripDeltaE - s.firstStripDeltaE) > TEST_STRIP_RULE.driftDeltaE
  )
    reasons.push('drift');
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
  const timeline: TimelinePoint[] = [
    {
      index: 0,
      type: 'made',
      remainingMl: state.remainingMl,
      strength: state.strength,
      chargeFraction: state.chargeFraction,
    },
  ];
  events.forEach((e, i) => {
    state = applyEvent(batch, state, e);
    timeline.push({
      index: i + 1,
      type: e.type,
      remainingMl: state.remainingMl,
      strength: state.strength,
      chargeFraction: state.chargeFraction,
    });
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
export function tryEvent(
  batch: LedgerBatch,
  history: readonly LedgerEvent[],
  next: LedgerEvent,
): { ok: true; ledger: Ledger } | { ok: false; error: LedgerError } {
  try {
    return { ok: true, ledger: computeLedger(batch, [...history, next]) };
  } catch (err) {
    if (err instanceof LedgerError) return { ok: false, error: err };
    throw err;
  }
}

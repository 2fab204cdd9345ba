import { describe, expect, it } from 'vitest';
import {
  applyEvent,
  computeLedger,
  initialState,
  keptFraction,
  LedgerError,
  referenceLoadG,
  REFERENCE_LIQUOR_RATIO,
  suggestTopUp,
  tryEvent,
  type LedgerBatch,
  type LedgerEvent,
  type TopUpSuggestion,
} from '../../shared/compute/ledger.ts';

// A worked reuse history (common practice, invented figures): a 2000 mL aluminium acetate
// bath made from 100 g alum and 50 g calcium acetate, fibre uptake estimated at 20 % per
// reference load (2000 mL at 1:20 = 100 g of fibre; the 1:20 is common practice, recalled
// from memory), used four times with two top-ups, until it is exhausted.
const batch: LedgerBatch = {
  volumeMl: 2000,
  uptakePerUse: 0.2,
  ingredients: [
    { name: 'potash alum', grams: 100 },
    { name: 'calcium acetate', grams: 50 },
  ],
};
const history: LedgerEvent[] = [
  { type: 'use', volumeMl: 500, fibreMassG: 100 },
  { type: 'use', volumeMl: 500, fibreMassG: 100 },
  {
    type: 'top-up',
    additions: [
      { name: 'potash alum', grams: 50 },
      { name: 'calcium acetate', grams: 25 },
    ],
    volumeMl: 1000,
  },
  { type: 'use', volumeMl: 1000 },
  { type: 'test-strip', result: 'full red', deltaE: 0.5 },
  { type: 'top-up', additions: [{ name: 'potash alum', grams: 25 }], volumeMl: 500 },
  { type: 'use', volumeMl: 1500, fibreMassG: 400 },
];

/** The suggestion as a top-up event, to replay it through the ledger. */
const asEvent = (t: TopUpSuggestion): LedgerEvent => ({
  type: 'top-up',
  additions: t.ingredients
    .filter((i) => i.grams > 0)
    .map((i) => ({ name: i.name, refId: i.refId, grams: i.grams, thickener: i.thickener })),
  volumeMl: t.waterMl,
});

describe('bath ledger arithmetic (worked reuse history, common practice)', () => {
  it('tracks remaining volume, uses, fibre treated and estimated strength event by event', () => {
    const l = computeLedger(batch, history);
    // Hand arithmetic: charge 150 g in 2000 mL = 75 g/L; one reference load (100 g fibre) keeps 0.8
    // of what stays after the draw; a use without a fibre mass is liquor drawn off and keeps it all.
    // use 500 (100 g): 1500 mL, 150 × 1500/2000 × 0.8 = 90 g (60 g/L, strength 0.8)
    // use 500 (100 g): 1000 mL, 90 × 1000/1500 × 0.8 = 48 g (48 g/L, strength 0.64)
    // top-up +75 g +1000 mL: 2000 mL, 123 g (61.5 g/L, strength 0.82)
    // use 1000 (no fibre mass, drawn off): 1000 mL, 123 × 0.5 = 61.5 g (61.5 g/L, strength 0.82)
    // top-up +25 g +500 mL: 1500 mL, 86.5 g (57.6667 g/L, strength 0.768889)
    // use 1500: 0 mL, exhausted
    const expected = [
      [2000, 1],
      [1500, 0.8],
      [1000, 0.64],
      [2000, 0.82],
      [1000, 0.82],
      [1000, 0.82],
      [1500, 86.5 / 1500 / 0.075],
      [0, 0],
    ];
    expect(l.timeline).toHaveLength(expected.length);
    l.timeline.forEach((p, i) => {
      expect(p.remainingMl).toBeCloseTo(expected[i][0], 9);
      expect(p.strength).toBeCloseTo(expected[i][1], 9);
    });
    expect(l.timeline.map((p) => p.type)).toEqual([
      'made',
      'use',
      'use',
      'top-up',
      'use',
      'test-strip',
      'top-up',
      'use',
    ]);
    expect(l.state).toMatchObject({ remainingMl: 0, uses: 4, fibreMassG: 600, usesSinceTopUp: 1 });
    expect(l.exhaustedEstimate).toBe(true);
    // Grams are followed per ingredient: after two uses 100 × 0.5 × 0.64 = 32 g alum, 16 g calcium acetate.
    expect(computeLedger(batch, history.slice(0, 2)).state.grams['potash alum']).toBeCloseTo(32, 9);
    expect(computeLedger(batch, history.slice(0, 2)).state.grams['calcium acetate']).toBeCloseTo(16, 9);
  });

  it('suggests per ingredient made g/L × volume after topping up − estimated grams now, and water back to the made volume (mass balance)', () => {
    const l = computeLedger(batch, history.slice(0, 2));
    expect(l.topUp?.usesSinceTopUp).toBe(2);
    // 0.05 g/mL × 2000 mL − 32 g = 68 g alum; 0.025 g/mL × 2000 mL − 16 g = 34 g calcium acetate.
    expect(l.topUp?.ingredients.map((i) => [i.name, i.grams])).toEqual([
      ['potash alum', expect.closeTo(68, 9)],
      ['calcium acetate', expect.closeTo(34, 9)],
    ]);
    expect(l.topUp?.waterMl).toBe(1000);
    expect(l.topUp?.volumeAfterMl).toBe(2000);
  });

  it('restores the made strength exactly: replaying the ledger after the suggestion gives strength 1.000 at the made volume', () => {
    const cases: LedgerEvent[][] = [
      history.slice(0, 1),
      history.slice(0, 2),
      history.slice(0, 4),
      [
        { type: 'use', volumeMl: 300, fibreMassG: 250 },
        { type: 'use', volumeMl: 120 },
        { type: 'use', volumeMl: 700, fibreMassG: 37 },
      ],
    ];
    for (const h of cases) {
      const t = computeLedger(batch, h).topUp;
      expect(t).not.toBeNull();
      const after = computeLedger(batch, [...h, asEvent(t!)]);
      expect(after.state.strength).toBeCloseTo(1, 9);
      expect(after.state.remainingMl).toBeCloseTo(2000, 9);
      expect(after.state.grams['potash alum']).toBeCloseTo(100, 9);
      expect(after.state.grams['calcium acetate']).toBeCloseTo(50, 9);
      expect(after.topUp).toBeNull();
    }
  });

  it('never dilutes: above the made volume it adds no water and brings each ingredient to its made g/L in the volume there is', () => {
    // use (one load) then 1000 mL water: 2500 mL holding 60 g alum and 30 g calcium acetate.
    const h: LedgerEvent[] = [history[0], { type: 'water', volumeMl: 1000 }];
    const t = computeLedger(batch, h).topUp!;
    expect(t.waterMl).toBe(0);
    expect(t.volumeAfterMl).toBe(2500);
    expect(t.ingredients.map((i) => i.grams)).toEqual([
      expect.closeTo(0.05 * 2500 - 60, 9),
      expect.closeTo(0.025 * 2500 - 30, 9),
    ]);
    const after = computeLedger(batch, [...h, asEvent(t)]);
    expect(after.state.strength).toBeCloseTo(1, 9);
    expect(after.state.remainingMl).toBe(2500);
  });

  it('never raises an ingredient above its made strength, and suggests nothing at the made strength', () => {
    // One load, then 100 g alum alone: alum 160 g in 1500 mL is above its made 0.05 g/mL; calcium acetate is short.
    const h: LedgerEvent[] = [history[0], { type: 'top-up', additions: [{ name: 'potash alum', grams: 100 }] }];
    const t = computeLedger(batch, h).topUp!;
    expect(t.ingredients).toEqual([
      { name: 'potash alum', refId: null, thickener: false, grams: 0 },
      { name: 'calcium acetate', refId: null, thickener: false, grams: expect.closeTo(50 - 30, 9) },
    ]);
    expect(t.waterMl).toBe(500);
    expect(computeLedger(batch, []).topUp).toBeNull();
    // A bath only drawn from (no uptake) is still at the made strength: nothing is due, although its volume fell.
    expect(
      computeLedger({ ...batch, uptakePerUse: 0 }, [{ type: 'use', volumeMl: 800, fibreMassG: 200 }]).topUp,
    ).toBeNull();
    // Just topped up to the made strength: nothing due.
    expect(
      computeLedger(batch, [...history.slice(0, 2), asEvent(computeLedger(batch, history.slice(0, 2)).topUp!)]).topUp,
    ).toBeNull();
  });

  it('scales the uptake with the fibre mass treated, against the reference load the made volume serves at 1:20 (common practice, recalled from memory)', () => {
    expect(REFERENCE_LIQUOR_RATIO.ratio).toBe(20);
    expect(referenceLoadG(batch)).toBe(100);
    // kept = (1 − u)^(m / m_ref): one load 0.8, two loads 0.64, half a load √0.8; no fibre mass: drawn off, all kept.
    expect(keptFraction(batch, 100)).toBeCloseTo(0.8, 12);
    expect(keptFraction(batch, 200)).toBeCloseTo(0.64, 12);
    expect(keptFraction(batch, 50)).toBeCloseTo(Math.sqrt(0.8), 12);
    expect(keptFraction(batch, null)).toBe(1);
    // One use of 200 g takes up what two uses of 100 g do (the draws themselves do not change strength).
    const one = computeLedger(batch, [{ type: 'use', volumeMl: 100, fibreMassG: 200 }]).state.strength;
    const two = computeLedger(batch, [
      { type: 'use', volumeMl: 50, fibreMassG: 100 },
      { type: 'use', volumeMl: 50, fibreMassG: 100 },
    ]).state.strength;
    expect(one).toBeCloseTo(0.64, 12);
    expect(two).toBeCloseTo(one, 12);
    // The same 100 g in a bath ten times larger (reference load 1000 g) takes a tenth of the loads: 0.8^0.1.
    const big = computeLedger({ ...batch, volumeMl: 20000 }, [{ type: 'use', volumeMl: 100, fibreMassG: 100 }]);
    expect(big.state.strength).toBeCloseTo(0.8 ** 0.1, 12);
  });

  it('a stock or print paste that is only drawn from loses volume, not strength', () => {
    const paste: LedgerBatch = {
      volumeMl: 500,
      uptakePerUse: 0.3,
      drawOnly: true,
      ingredients: [
        { name: 'aluminium acetate', grams: 20 },
        { name: 'guar gum', grams: 10, thickener: true },
      ],
    };
    const l = computeLedger(paste, [
      { type: 'use', volumeMl: 120, fibreMassG: 250 },
      { type: 'use', volumeMl: 80 },
    ]);
    expect(l.state.remainingMl).toBe(300);
    expect(l.state.strength).toBeCloseTo(1, 12);
    expect(l.state.grams['aluminium acetate']).toBeCloseTo(12, 12);
    expect(l.state.grams['guar gum']).toBeCloseTo(6, 12);
    expect(l.topUp).toBeNull();
    expect(keptFraction(paste, 1000)).toBe(1);
    // Water does dilute it, and the suggestion then brings mordant and thickener back to their made g/L without water.
    const wet = computeLedger(paste, [
      { type: 'use', volumeMl: 200 },
      { type: 'water', volumeMl: 300 },
    ]);
    // 300 mL holding 12 g and 6 g, then 300 mL water: 600 mL at half strength.
    expect(wet.state.strength).toBeCloseTo(0.5, 12);
    const t = suggestTopUp(paste, wet.state);
    expect(t?.waterMl).toBe(0);
    // 0.04 g/mL × 600 mL − 12 g; 0.02 g/mL × 600 mL − 6 g.
    expect(t?.ingredients.map((i) => [i.name, i.grams])).toEqual([
      ['aluminium acetate', expect.closeTo(12, 9)],
      ['guar gum', expect.closeTo(6, 9)],
    ]);
  });

  it('follows a batch that lists no active ingredient (a child made from its parent liquor) by its made liquor', () => {
    const child: LedgerBatch = {
      volumeMl: 500,
      uptakePerUse: 0.08,
      ingredients: [{ name: 'guar gum', grams: 10, thickener: true }],
      drawOnly: true,
    };
    expect(computeLedger(child, [{ type: 'use', volumeMl: 120, fibreMassG: 250 }]).state.strength).toBeCloseTo(1, 12);
    expect(computeLedger(child, [{ type: 'water', volumeMl: 500 }]).state.strength).toBeCloseTo(0.5, 12);
  });

  it('prompts a test strip when the estimate falls low, results drift, or three uses pass without one', () => {
    expect(computeLedger(batch, history.slice(0, 1)).testStrip).toEqual({ due: false, reasons: [] });
    const low = computeLedger({ ...batch, uptakePerUse: 0.6 }, history.slice(0, 1));
    expect(low.testStrip.reasons).toContain('low-strength');
    const drift = computeLedger(batch, [...history.slice(0, 5), { type: 'test-strip', deltaE: 3.1 }]);
    expect(drift.testStrip.reasons).toContain('drift');
    const many = computeLedger({ ...batch, uptakePerUse: 0 }, [
      { type: 'use', volumeMl: 100 },
      { type: 'use', volumeMl: 100 },
      { type: 'use', volumeMl: 100 },
    ]);
    expect(many.testStrip.reasons).toEqual(['many-uses']);
    expect(many.state.strength).toBeCloseTo(1, 12);
  });

  it('dilutes the estimate when only water is added', () => {
    const l = computeLedger(batch, [{ type: 'water', volumeMl: 2000 }]);
    expect(l.state.strength).toBeCloseTo(0.5, 12);
    expect(l.state.chargeFraction).toBeCloseTo(1, 12);
  });
});

describe('bath ledger refusals', () => {
  it('refuses a draw larger than what is left with a 409, leaving the history unchanged', () => {
    const r = tryEvent(batch, history.slice(0, 2), { type: 'use', volumeMl: 1000.5 });
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.error).toBeInstanceOf(LedgerError);
      expect(r.error).toMatchObject({
        code: 'overdraw',
        status: 409,
        details: { remainingMl: 1000, requestedMl: 1000.5 },
      });
    }
    const exact = tryEvent(batch, history.slice(0, 2), { type: 'use', volumeMl: 1000 });
    expect(exact.ok && exact.ledger.state.remainingMl).toBe(0);
  });

  it('refuses any event after disposal with a 409', () => {
    const disposed: LedgerEvent[] = [
      ...history,
      { type: 'disposal', route: 'licensed waste contractor', ruleFollowed: 'local rule' },
    ];
    for (const e of [
      { type: 'use', volumeMl: 1 },
      { type: 'water', volumeMl: 100 },
      { type: 'ph', ph: 4 },
      { type: 'disposal' },
    ] as LedgerEvent[]) {
      const r = tryEvent(batch, disposed, e);
      expect(r.ok ? null : r.error.code).toBe('disposed');
      expect(r.ok ? null : r.error.status).toBe(409);
    }
  });

  it('disposes of a batch that is not exhausted only with a reason (422 otherwise)', () => {
    const r = tryEvent(batch, history.slice(0, 1), { type: 'disposal' });
    expect(r.ok ? null : r.error).toMatchObject({ code: 'not-exhausted', status: 422 });
    expect(tryEvent(batch, history.slice(0, 1), { type: 'disposal', reason: 'contaminated with iron' }).ok).toBe(true);
    expect(tryEvent({ ...batch, status: 'exhausted' }, history.slice(0, 1), { type: 'disposal' }).ok).toBe(true);
  });

  it('refuses malformed events with a 422 and does not mutate the state', () => {
    const s = initialState(batch);
    const before = structuredClone(s);
    for (const e of [
      { type: 'use', volumeMl: 0 },
      { type: 'water', volumeMl: -5 },
      { type: 'top-up' },
      { type: 'ph', ph: 15 },
    ] as LedgerEvent[]) {
      expect(() => applyEvent(batch, s, e)).toThrow(LedgerError);
    }
    expect(s).toEqual(before);
  });
});

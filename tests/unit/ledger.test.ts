import { describe, expect, it } from 'vitest';
import { applyEvent, computeLedger, initialState, LedgerError, TOP_UP_RULE, tryEvent, type LedgerBatch, type LedgerEvent } from '../../shared/compute/ledger.ts';

// A worked reuse history (common practice, invented figures): a 2000 mL aluminium acetate
// bath made from 100 g alum and 50 g calcium acetate, fibre uptake estimated at 20 % per use,
// used four times with two top-ups, until it is exhausted.
const batch: LedgerBatch = {
  volumeMl: 2000,
  uptakePerUse: 0.2,
  ingredients: [
    { name: 'potash alum', grams: 100 },
    { name: 'calcium acetate', grams: 50 },
  ],
};
const history: LedgerEvent[] = [
  { type: 'use', volumeMl: 500, fibreMassG: 250 },
  { type: 'use', volumeMl: 500, fibreMassG: 250 },
  { type: 'top-up', additions: [{ name: 'potash alum', grams: 50 }, { name: 'calcium acetate', grams: 25 }], volumeMl: 1000 },
  { type: 'use', volumeMl: 1000, fibreMassG: 300 },
  { type: 'test-strip', result: 'full red', deltaE: 0.5 },
  { type: 'top-up', additions: [{ name: 'potash alum', grams: 25 }], volumeMl: 500 },
  { type: 'use', volumeMl: 1500, fibreMassG: 400 },
];

describe('bath ledger arithmetic (worked reuse history, common practice)', () => {
  it('tracks remaining volume, uses, fibre treated and estimated strength event by event', () => {
    const l = computeLedger(batch, history);
    // Hand arithmetic: charge 150 g in 2000 mL = 75 g/L.
    // use 500: 1500 mL, 150 × 1500/2000 × 0.8 = 90 g (60 g/L, strength 0.8)
    // use 500: 1000 mL, 90 × 1000/1500 × 0.8 = 48 g (48 g/L, strength 0.64)
    // top-up +75 g +1000 mL: 2000 mL, 123 g (61.5 g/L, strength 0.82)
    // use 1000: 1000 mL, 123 × 0.5 × 0.8 = 49.2 g (49.2 g/L, strength 0.656)
    // top-up +25 g +500 mL: 1500 mL, 74.2 g (49.4667 g/L, strength 0.659556)
    // use 1500: 0 mL, exhausted
    const expected = [
      [2000, 1],
      [1500, 0.8],
      [1000, 0.64],
      [2000, 0.82],
      [1000, 0.656],
      [1000, 0.656],
      [1500, 74.2 / 1500 / 0.075],
      [0, 0],
    ];
    expect(l.timeline).toHaveLength(expected.length);
    l.timeline.forEach((p, i) => {
      expect(p.remainingMl).toBeCloseTo(expected[i][0], 9);
      expect(p.strength).toBeCloseTo(expected[i][1], 9);
    });
    expect(l.timeline.map((p) => p.type)).toEqual(['made', 'use', 'use', 'top-up', 'use', 'test-strip', 'top-up', 'use']);
    expect(l.state).toMatchObject({ remainingMl: 0, uses: 4, fibreMassG: 1200, usesSinceTopUp: 1 });
    expect(l.exhaustedEstimate).toBe(true);
  });

  it('suggests a top-up of 25–50 % of the original charge per reuse (common practice, from memory) and water back to volume', () => {
    const l = computeLedger(batch, history.slice(0, 2));
    expect(TOP_UP_RULE).toMatchObject({ minFraction: 0.25, maxFraction: 0.5 });
    expect(l.topUp?.usesSinceTopUp).toBe(2);
    expect(l.topUp?.ingredients).toEqual([
      { name: 'potash alum', refId: null, minG: 50, maxG: 100 },
      { name: 'calcium acetate', refId: null, minG: 25, maxG: 50 },
    ]);
    expect(l.topUp?.waterMl).toBe(1000);
    expect(computeLedger(batch, history.slice(0, 3)).topUp).toBeNull();
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
      expect(r.error).toMatchObject({ code: 'overdraw', status: 409, details: { remainingMl: 1000, requestedMl: 1000.5 } });
    }
    const exact = tryEvent(batch, history.slice(0, 2), { type: 'use', volumeMl: 1000 });
    expect(exact.ok && exact.ledger.state.remainingMl).toBe(0);
  });

  it('refuses any event after disposal with a 409', () => {
    const disposed: LedgerEvent[] = [...history, { type: 'disposal', route: 'licensed waste contractor', ruleFollowed: 'local rule' }];
    for (const e of [{ type: 'use', volumeMl: 1 }, { type: 'water', volumeMl: 100 }, { type: 'ph', ph: 4 }, { type: 'disposal' }] as LedgerEvent[]) {
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
    for (const e of [{ type: 'use', volumeMl: 0 }, { type: 'water', volumeMl: -5 }, { type: 'top-up' }, { type: 'ph', ph: 15 }] as LedgerEvent[]) {
      expect(() => applyEvent(batch, s, e)).toThrow(LedgerError);
    }
    expect(s).toEqual(before);
  });
});

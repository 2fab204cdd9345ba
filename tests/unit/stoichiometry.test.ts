import { describe, expect, it } from 'vitest';
import atomicWeights from '../reference/atomic-weights.json' with { type: 'json' };
import {
  bathProduct,
  imbalance,
  madeByReaction,
  matchingReactant,
  REACTIONS,
  reactionYield,
} from '../../shared/compute/stoichiometry.ts';

// Molar masses worked by hand here from the IUPAC 2021 abridged atomic weights
// (Prohaska et al. 2022, tests/reference/atomic-weights.json), independently of the formula parser.
const w = Object.fromEntries(atomicWeights.map((e) => [e.symbol, e.abridged_atomic_weight])) as Record<string, number>;
const M = {
  alum: w.K + w.Al + 2 * (w.S + 4 * w.O) + 12 * (2 * w.H + w.O), // KAl(SO4)2·12H2O ≈ 474.39
  caAcetate: w.Ca + 2 * (2 * w.C + 3 * w.H + 2 * w.O), // Ca(CH3COO)2 ≈ 158.17
  basicAlAcetate: w.Al + w.O + w.H + 2 * (2 * w.C + 3 * w.H + 2 * w.O), // Al(OH)(CH3COO)2 ≈ 162.08
  leadAcetate: w.Pb + 2 * (2 * w.C + 3 * w.H + 2 * w.O) + 3 * (2 * w.H + w.O), // Pb(CH3COO)2·3H2O ≈ 379.3
};

describe('reactions in the pot', () => {
  it.each(REACTIONS.map((r) => [r.id, r] as const))('%s balances atom for atom', (_id, r) => {
    expect(imbalance(r)).toEqual({});
  });

  it('MB-07 (100 g alum + 50 g calcium acetate in 2 L) makes about 34.2 g of basic aluminium acetate, 17.1 g/L, 2.84 g Al/L', () => {
    const p = bathProduct(
      [
        { name: 'potash alum', grams: 100 },
        { name: 'calcium acetate', grams: 50 },
      ],
      2000,
    )!;
    // By hand: alum 100/474.39 = 0.21080 mol needs 1.5 × that = 0.31620 mol Ca acetate; 50/158.17 = 0.31612 mol
    // is a hair short, so calcium acetate limits. Al acetate = 2/3 × 0.31612 mol.
    const alMol = ((50 / M.caAcetate) * 2) / 3;
    expect(p.limiting).toBe('calcium acetate');
    expect(p.active.grams).toBeCloseTo(alMol * M.basicAlAcetate, 6);
    expect(p.active.grams).toBeCloseTo(34.16, 2);
    expect(p.activeGPerL).toBeCloseTo(17.08, 2);
    expect((alMol * w.Al * 1000) / 2000).toBeCloseTo(2.84, 2);
    // Not the total charge: 150 g weighed in, 75 g/L, is not the strength.
    expect(p.activeGPerL).toBeLessThan(75 / 4);
    expect(p.excess.map((x) => x.name)).toEqual(['potash alum']);
    expect(p.products.find((x) => x.fate === 'precipitate')!.name).toBe('calcium sulfate (gypsum)');
  });

  it('the stoichiometric ratio is about 2 parts alum to 1 part calcium acetate by mass (common practice ratio, recalled from memory)', () => {
    const r = REACTIONS.find((x) => x.id === 'alum-calcium-acetate')!;
    const [ca] = matchingReactant(r, 'potash alum', 100);
    expect(ca.grams).toBeCloseTo((100 / M.alum) * 1.5 * M.caAcetate, 6);
    expect(ca.grams / 100).toBeCloseTo(0.5, 2);
  });

  it('historical red liquor: the lead leaves as lead sulfate, one PbSO4 per lead acetate', () => {
    const r = REACTIONS.find((x) => x.id === 'alum-lead-acetate')!;
    const [pb] = matchingReactant(r, 'potash alum', 100);
    expect(pb.grams).toBeCloseTo((100 / M.alum) * 1.5 * M.leadAcetate, 6);
    const y = reactionYield(r, { 'potash alum': 100, 'lead(II) acetate (sugar of lead)': pb.grams });
    const sludge = y.products.find((x) => x.name === 'lead(II) sulfate')!;
    expect(sludge.fate).toBe('precipitate');
    expect(sludge.grams).toBeCloseTo((pb.grams / M.leadAcetate) * (w.Pb + w.S + 4 * w.O), 6);
  });

  it('a bath whose chemicals only dissolve makes nothing', () => {
    expect(bathProduct([{ name: 'potash alum', grams: 100 }], 2000)).toBeNull();
    expect(madeByReaction([{ name: 'potash alum', grams: 100 }], 2000)).toBeNull();
  });

  it('reports the aluminium the liquor carries: 2.84 g Al/L for MB-07 (by hand from IUPAC 2021 masses)', () => {
    const m = madeByReaction(
      [
        { name: 'potash alum', grams: 100 },
        { name: 'calcium acetate', grams: 50 },
      ],
      2000,
    )!;
    const alMol = ((50 / M.caAcetate) * 2) / 3;
    expect(m.metal).toEqual({ symbol: 'Al', gPerL: expect.closeTo((alMol * w.Al * 1000) / 2000, 9) });
    expect(m.byProducts.map((x) => x.name)).toContain('calcium sulfate (gypsum)');
  });
});

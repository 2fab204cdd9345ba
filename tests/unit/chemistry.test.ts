import { describe, expect, it } from 'vitest';
import atomicWeights from '../reference/atomic-weights.json' with { type: 'json' };
import compounds from '../reference/mordant-compounds.json' with { type: 'json' };
import { ATOMIC_WEIGHTS } from '../../shared/data/atomic-weights.ts';
import { compareMetalLoad, FormulaError, metalLoad, metalMassFraction, molarMass, parseFormula, perKgFibre } from '../../shared/compute/chemistry.ts';

describe('atomic weight table', () => {
  // Source: IUPAC 2021 abridged standard atomic weights (Prohaska et al. 2022), tests/reference/atomic-weights.json.
  it.each(atomicWeights.map((e) => [e.symbol, e.abridged_atomic_weight] as const))('%s = %f g/mol (IUPAC 2021 abridged)', (symbol, w) => {
    expect(ATOMIC_WEIGHTS[symbol]).toBe(w);
  });
});

describe('formula parser', () => {
  it('reads parentheses and hydrates written with · or a full stop', () => {
    expect(parseFormula('KAl(SO4)2·12H2O')).toEqual({ K: 1, Al: 1, S: 2, O: 20, H: 24 });
    expect(parseFormula('Pb(CH3COO)2.3H2O')).toEqual({ Pb: 1, C: 4, H: 12, O: 7 });
    expect(parseFormula('K2Cr2O7')).toEqual({ K: 2, Cr: 2, O: 7 });
    expect(parseFormula('[Al(OH)2]2SO4')).toEqual({ Al: 2, O: 8, H: 4, S: 1 });
  });

  it('agrees with the element counts of every reference compound (tests/reference/mordant-compounds.json)', () => {
    for (const c of compounds) expect(parseFormula(c.formula), c.formula).toEqual(c.composition);
  });

  it('refuses unknown elements, stray characters and unbalanced brackets', () => {
    for (const bad of ['Xx2O', 'KAl(SO4', 'KAlSO4)2', 'K2Cr2O7·', 'NaCl!', '', 'H0']) expect(() => parseFormula(bad), bad).toThrow(FormulaError);
  });
});

describe('molar mass and metal mass fraction', () => {
  // Source: tests/reference/mordant-compounds.json, molar masses computed exactly from IUPAC 2021 abridged weights,
  // published to 3 decimals; fractions to 6 decimals.
  it.each(compounds.map((c) => [c.formula, c] as const))('%s', (formula, c) => {
    expect(Math.abs(molarMass(formula) - c.molar_mass_g_per_mol)).toBeLessThanOrEqual(0.5e-3);
    for (const [metal, f] of Object.entries(c.metal_mass_fraction)) {
      expect(Math.abs(metalMassFraction(formula, metal) - f), `${metal} in ${formula}`).toBeLessThanOrEqual(0.5e-6);
    }
  });

  it('reports 0 for a metal the formula lacks', () => {
    expect(metalMassFraction('K2Cr2O7', 'Pb')).toBe(0);
  });
});

describe('metal load', () => {
  // Fractions from tests/reference/mordant-compounds.json (IUPAC 2021): Pb in Pb(CH3COO)2·3H2O 0.546222,
  // Al in KAl(SO4)2·12H2O 0.056879, Al in Al(OH)(CH3COO)2 0.166476.
  it('sums grams × fraction for a set of chemicals, per batch and per kg of fibre', () => {
    const load = metalLoad([
      { formula: 'Pb(CH3COO)2·3H2O', grams: 20 },
      { formula: 'KAl(SO4)2·12H2O', grams: 100 },
      { formula: 'Al(OH)(CH3COO)2', grams: 10 },
      { formula: null, grams: 30 },
    ]);
    expect(load.Pb).toBeCloseTo(20 * 0.546222, 4);
    expect(load.Al).toBeCloseTo(100 * 0.056879 + 10 * 0.166476, 4);
    expect((load as Record<string, number>).K).toBeUndefined();
    const perKg = perKgFibre(load, 250);
    expect(perKg.Pb).toBeCloseTo(20 * 0.546222 * 4, 3);
  });

  it('compares historical and modern recipes: the grams of lead not used', () => {
    // A lead-based red liquor (20 g lead acetate + 40 g alum) replaced by 60 g alum with calcium acetate.
    const rows = compareMetalLoad(
      [{ formula: 'Pb(CH3COO)2·3H2O', grams: 20 }, { formula: 'KAl(SO4)2·12H2O', grams: 40 }],
      [{ formula: 'KAl(SO4)2·12H2O', grams: 60 }, { formula: 'Ca(CH3COO)2', grams: 30 }],
      250,
    );
    const pb = rows.find((r) => r.metal === 'Pb')!;
    expect(pb).toMatchObject({ heavy: true, afterG: 0 });
    expect(pb.avoidedG).toBeCloseTo(10.92444, 4);
    expect(pb.beforeGPerKgFibre).toBeCloseTo(43.69776, 3);
    const al = rows.find((r) => r.metal === 'Al')!;
    expect(al.heavy).toBe(false);
    expect(al.avoidedG).toBeCloseTo(-20 * 0.056879, 4);
    expect(rows.map((r) => r.metal)).not.toContain('Ca');
  });
});

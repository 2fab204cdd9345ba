import { describe, expect, it } from 'vitest';
import atomicWeights from '../reference/atomic-weights.json' with { type: 'json' };
import compounds from '../reference/mordant-compounds.json' with { type: 'json' };
import { ATOMIC_WEIGHTS } from '../../shared/data/atomic-weights.ts';
import {
  compareMetalLoad,
  FormulaError,
  metalLoad,
  metalMassFraction,
  molarMass,
  parseFormula,
  perKgFibre,
} from '../../shared/compute/chemistry.ts';

describe('atomic weight table', () => {
  // Source: IUPAC 2021 abridged standard atomic weights (Prohaska et al. 2022), tests/reference/atomic-weights.json.
  it.each(atomicWeights.map((e) => [e.symbol, e.abridged_atomic_weight] as const))(
    '%s = %f g/mol (IUPAC 2021 abridged)',
    (symbol, w) => {
      expect(ATOMIC_WEIGHTS[symbol]).toBe(w);
    },
  );
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
    for (const bad of ['Xx2O', 'KAl(SO4', 'KAlSO4)2', 'K2Cr2O7·', 'NaCl!', '', 'H0'])
      expect(() => parseFormula(bad), bad).toThrow(FormulaError);
  });

  it('reads decimal, vulgar-fraction and a/b hydrate coefficients, with any hydrate dot', () => {
    // Element counts by hand: CaSO4·½H2O = Ca 1, S 1, O 4.5, H 1.
    const hemihydrate = { Ca: 1, S: 1, O: 4.5, H: 1 };
    for (const f of [
      'CaSO4·0.5H2O',
      'CaSO4.0.5H2O',
      'CaSO4·½H2O',
      'CaSO4.½H2O',
      'CaSO4·1/2H2O',
      'CaSO4 · 0.5H2O',
      'CaSO4*0.5H2O',
    ]) {
      expect(parseFormula(f), f).toEqual(hemihydrate);
    }
    expect(parseFormula('Al2(SO4)3·14.3H2O')).toEqual({ Al: 2, S: 3, O: 12 + 14.3, H: 28.6 });
    expect(parseFormula('Al2(SO4)3.14.3H2O')).toEqual({ Al: 2, S: 3, O: 12 + 14.3, H: 28.6 });
    expect(parseFormula('CaSO4·1½H2O')).toEqual({ Ca: 1, S: 1, O: 5.5, H: 3 });
    for (const [ch, v] of [
      ['¼', 0.25],
      ['¾', 0.75],
      ['⅓', 1 / 3],
      ['⅔', 2 / 3],
      ['⅛', 0.125],
    ] as const) {
      expect(parseFormula(`CaSO4·${ch}H2O`).H, ch).toBeCloseTo(2 * v, 12);
    }
    // A full stop as hydrate dot still works after a count or a bracket.
    expect(parseFormula('Pb(CH3COO)2.3H2O')).toEqual({ Pb: 1, C: 4, H: 12, O: 7 });
    expect(parseFormula('CuSO4.5H2O')).toEqual({ Cu: 1, S: 1, O: 9, H: 10 });
  });

  it('gives the position of the fault (1-based, as a person counts)', () => {
    const fault = (f: string) => {
      try {
        parseFormula(f);
      } catch (e) {
        if (e instanceof FormulaError) return { position: e.position, reason: e.reason };
      }
      return null;
    };
    expect(fault('CaSO4·x')).toEqual({ position: 7, reason: 'Unexpected "x" at position 7' });
    expect(fault('NaCl!')).toEqual({ position: 5, reason: 'Unexpected "!" at position 5' });
    expect(fault('Xx2O')).toEqual({ position: 1, reason: 'Unknown element "Xx" at position 1' });
    expect(fault('KAl(SO4')).toEqual({ position: 4, reason: 'Unclosed "(" at position 4' });
    expect(fault('KAlSO4)2')).toEqual({ position: 7, reason: 'Unmatched ")" at position 7' });
    expect(fault('H0')).toEqual({ position: 2, reason: 'A count of zero at position 2' });
    expect(fault('K2Cr2O7·')).toEqual({ position: 8, reason: 'Nothing after the hydrate dot at position 8' });
    expect(fault('H2 O')).toEqual({ position: 3, reason: 'Unexpected space at position 3' });
    expect(fault('CaSO4·.5H2O')?.position).toBe(7);
    expect(fault('CaSO4·0H2O')?.position).toBe(7);
    expect(fault('CaSO4·5.H2O')?.position).toBe(8);
    // Counts inside a part are whole numbers: never read "Fe1.5O" as Fe·5O.
    expect(fault('Fe1.5O')?.position).toBe(4);
    expect(fault('CaSO4·0.5')?.reason).toBe('An element is missing after the coefficient at the end');
    expect(fault('CaSO4·H½')?.position).toBe(8);
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

  it('weighs decimal and fractional hydrates', () => {
    // Source: IUPAC 2021 abridged atomic weights (tests/reference/atomic-weights.json: Ca 40.078, S 32.06, O 15.999,
    // H 1.008, Al 26.982), summed by hand: CaSO4·0.5H2O = 136.134 + 9.0075 = 145.1415 g/mol (145.14);
    // Al2(SO4)3·14.3H2O = 342.132 + 257.6145 = 599.7465 g/mol (599.7).
    const w = Object.fromEntries(atomicWeights.map((e) => [e.symbol, e.abridged_atomic_weight]));
    expect(w.Ca + w.S + 4 * w.O + 0.5 * (2 * w.H + w.O)).toBeCloseTo(145.1415, 9);
    expect(molarMass('CaSO4·0.5H2O')).toBeCloseTo(145.14, 2);
    expect(molarMass('CaSO4·½H2O')).toBeCloseTo(145.1415, 9);
    expect(molarMass('CaSO4.0.5H2O')).toBeCloseTo(145.1415, 9);
    expect(molarMass('Al2(SO4)3·14.3H2O')).toBeCloseTo(599.7465, 9);
    expect(molarMass('Al2(SO4)3·14.3H2O').toFixed(1)).toBe('599.7');
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
      [
        { formula: 'Pb(CH3COO)2·3H2O', grams: 20 },
        { formula: 'KAl(SO4)2·12H2O', grams: 40 },
      ],
      [
        { formula: 'KAl(SO4)2·12H2O', grams: 60 },
        { formula: 'Ca(CH3COO)2', grams: 30 },
      ],
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

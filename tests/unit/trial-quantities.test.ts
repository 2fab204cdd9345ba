import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { scaleRecipe } from '../../shared/compute/recipe.ts';
import { computeStep, gramsInStep, type QStep } from '../../shared/trials/quantities.ts';
import { trialMetalLoad } from '../../shared/trials/metal-load.ts';
import { parseMeasurementCsv } from '../../server/services/trials/measurements.ts';

const roles = new Map([
  [1, 'mordant'],
  [2, 'thickener'],
  [3, 'mordant'],
]);
const mordantBath: QStep = {
  operation: 'mordant-bath',
  liquorRatio: 30,
  paste: null,
  ingredients: [{ kind: 'chemical', refId: 1, name: 'potash alum', amount: 15, basis: 'owf' }],
};
const paste: QStep = {
  operation: 'print-paste',
  liquorRatio: null,
  paste: { volumeMl: 300, stockGPerL: 75 },
  ingredients: [
    { kind: 'chemical', refId: 3, name: 'aluminium acetate', amount: 40, basis: 'g/L' },
    { kind: 'chemical', refId: 2, name: 'guar gum', amount: 20, basis: 'g/L' },
  ],
};

describe('quantities of a stored step', () => {
  it('gives the worked example of BRIEF §4.1 (common practice): 250 g, alum 15 % owf, 1:30 → 37.5 g in 7.5 L = 5.0 g/L', () => {
    const c = computeStep(mordantBath, 250, roles);
    expect(c.volumeL).toBeCloseTo(7.5, 12);
    expect(c.ingredients[0]).toMatchObject({ grams: 37.5, gPerL: 5 });
    expect(gramsInStep(mordantBath, 1, 250, roles)).toBeCloseTo(37.5, 12);
    expect(gramsInStep(mordantBath, 99, 250, roles)).toBeNull();
  });

  it('makes up a print paste from its stock: V_stock = c·V / c_stock (BRIEF §4.2)', () => {
    const c = computeStep(paste, 250, roles);
    expect(c.paste?.mordants[0]).toMatchObject({ grams: 12, stockMl: 160 });
    expect(c.paste?.thickener?.grams).toBeCloseTo(6, 12);
    expect(c.paste?.waterMl).toBeCloseTo(140, 12);
    // A paste ingredient is g/L of paste and grams for the paste volume, never % owf (it is printed, not worked on the fibre).
    expect(c.ingredients[0]).toMatchObject({ gPerL: 40, grams: 12, percentOwf: null });
    expect(c.paste?.thickener).toMatchObject({
      usualRange: { kind: 'guar', min: 20, max: 50 },
      outsideUsualRange: false,
    });
    const tooStrong = computeStep({ ...paste, paste: { volumeMl: 300, stockGPerL: 20 } }, 250, roles);
    expect(tooStrong.paste).toBeNull();
    expect(tooStrong.pasteProblem).toMatch(/stronger than the stock/);
  });

  it('scales to another dry mass and back without drift', () => {
    const steps = [
      mordantBath,
      {
        ...paste,
        ingredients: [
          ...paste.ingredients,
          { kind: 'chemical' as const, refId: 1, name: 'alum', amount: 7.3, basis: 'g' as const },
        ],
      },
    ];
    const there = scaleRecipe(steps, 250, 40);
    const back = scaleRecipe(there, 40, 250);
    expect(computeStep(there[0], 40, roles).ingredients[0].grams).toBeCloseTo(6, 12);
    expect(there[1].ingredients[2].amount).toBeCloseTo((7.3 * 40) / 250, 12);
    for (const [i, s] of back.entries())
      for (const [j, ing] of s.ingredients.entries())
        expect(ing.amount).toBeCloseTo(steps[i].ingredients[j].amount, 12);
  });
});

type Compound = { formula: string; metal_mass_fraction: Record<string, number> };
const compounds = JSON.parse(
  readFileSync(new URL('../reference/mordant-compounds.json', import.meta.url), 'utf8'),
) as Compound[];
const fraction = (formula: string, metal: string) =>
  compounds.find((c) => c.formula === formula)!.metal_mass_fraction[metal];

describe('metal load of a trial (values from tests/reference/mordant-compounds.json, IUPAC 2021)', () => {
  it('sums lead → aluminium and dichromate → alum substitutions, per batch and per kg fibre', () => {
    const load = trialMetalLoad(
      [
        { historical: { formula: 'Pb(CH3COO)2·3H2O', grams: 18 }, modern: { formula: 'Al(OH)(CH3COO)2', grams: 12 } },
        { historical: { formula: 'K2Cr2O7', grams: 3.6 }, modern: { formula: 'KAl(SO4)2·12H2O', grams: 18 } },
        { historical: { formula: 'SnCl2·2H2O', grams: null }, modern: null },
      ],
      250,
    );
    const row = (m: string) => load.rows.find((r) => r.metal === m)!;
    expect(row('Pb').avoidedG).toBeCloseTo(18 * fraction('Pb(CH3COO)2·3H2O', 'Pb'), 5);
    expect(row('Cr').avoidedG).toBeCloseTo(3.6 * fraction('K2Cr2O7', 'Cr'), 5);
    expect(row('Al').afterG).toBeCloseTo(
      12 * fraction('Al(OH)(CH3COO)2', 'Al') + 18 * fraction('KAl(SO4)2·12H2O', 'Al'),
      4,
    ); // fractions are given to 6 decimals: 30 g × 0.5e-6
    expect(row('Al').avoidedG).toBeLessThan(0);
    expect(row('Pb').beforeGPerKgFibre).toBeCloseTo((18 * fraction('Pb(CH3COO)2·3H2O', 'Pb') * 1000) / 250, 4);
    expect(load.rows.find((r) => r.metal === 'Sn')).toBeUndefined();
    expect(load.incomplete).toBe(1);
  });

  it('counts a practice with no chemical as no metal on its side', () => {
    const load = trialMetalLoad([{ historical: { formula: 'K2Cr2O7', grams: 2 }, modern: null }], 100);
    expect(load.rows).toHaveLength(1);
    expect(load.rows[0]).toMatchObject({ metal: 'Cr', afterG: 0 });
  });
});

describe('CSV of readings', () => {
  it('reads loose headers and the usual ways of writing illuminant/observer and geometry', () => {
    const { rows, errors } = parseMeasurementCsv(
      '\uFEFFl*, A*, b* ,Illuminant/Observer,geometry\n"41,2",38.5,20.1,D65/10°,d/8\n40,38,20,A 10,45/0\n',
    );
    expect(errors).toEqual([]);
    expect(rows[0]).toMatchObject({ L: 41.2, illuminant: 'D65', observer: '10', geometry: 'd:8°' });
    expect(rows[1]).toMatchObject({ illuminant: 'A', observer: '10', geometry: '45°a:0°' });
  });

  it('reports every bad line by its line number in the file, blank lines included', () => {
    const { rows, errors } = parseMeasurementCsv('L,a,b\n50,0,0\n\n101,0,0\n50,0\n50,0,0,extra\nx,y,z\n');
    expect(errors.map((e) => e.line)).toEqual([4, 5, 7]);
    expect(errors[0].errors[0]).toMatch(/L\*/);
    expect(errors[2].errors).toHaveLength(3);
    expect(rows).toHaveLength(2);
  });
});

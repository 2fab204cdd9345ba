import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  MORDANT_RANGES,
  gAlPerKgFibre,
  mordantChecks,
  mordantKind,
  type CheckChemical,
  type CheckStep,
} from '../../shared/compute/mordant-checks.ts';

// Ranges: common practice, recalled from memory, no published source (tests/reference/dye-facts.json, kind "recipe-range").
type Range = { kind: string; topic: string; parameter: string; range: [number, number]; source: string };
const facts = JSON.parse(readFileSync(new URL('../reference/dye-facts.json', import.meta.url), 'utf8')) as Range[];
const range = (start: string) => facts.find((f) => f.kind === 'recipe-range' && f.parameter.startsWith(start))!.range;
// Al fractions: IUPAC 2021 abridged weights, exact fractions (tests/reference/mordant-compounds.json).
type Compound = { formula: string; metal_mass_fraction: Record<string, number> };
const compounds = JSON.parse(
  readFileSync(new URL('../reference/mordant-compounds.json', import.meta.url), 'utf8'),
) as Compound[];
const al = (formula: string) => compounds.find((c) => c.formula === formula)!.metal_mass_fraction.Al;

const chemicals = new Map<number, CheckChemical>([
  [1, { id: 1, name: 'potash alum', formula: 'KAl(SO4)2·12H2O', role: 'mordant' }],
  [2, { id: 2, name: 'aluminium acetate (basic)', formula: 'Al(OH)(CH3COO)2', role: 'mordant' }],
  [3, { id: 3, name: 'tannic acid', formula: 'C76H52O46', role: 'tannin' }],
  [4, { id: 4, name: 'sodium carbonate (soda ash)', formula: 'Na2CO3', role: 'alkali' }],
  [5, { id: 5, name: 'aluminium sulfate', formula: 'Al2(SO4)3', role: 'mordant' }],
]);
const ing = (refId: number, percentOwf: number | null) => ({
  kind: 'chemical' as const,
  refId,
  name: chemicals.get(refId)?.name ?? 'x',
  percentOwf,
});
const alumBath = (p: number, position = 1): CheckStep => ({
  position,
  operation: 'mordant-bath',
  ingredients: [ing(1, p)],
});

describe('mordant ranges by fibre (common practice, recalled from memory)', () => {
  it('carries the ranges of the reference file', () => {
    const r = (kind: string, cls: string) => MORDANT_RANGES.find((x) => x.kind === kind && x.fibreClass === cls)!;
    expect([r('potash-alum', 'protein').low, r('potash-alum', 'protein').high]).toEqual(
      range('potash alum, protein fibres'),
    );
    expect([r('potash-alum', 'cellulose').low, r('potash-alum', 'cellulose').high]).toEqual(
      range('potash alum or aluminium sulfate, cellulose'),
    );
    expect([r('aluminium-acetate', 'cellulose').low, r('aluminium-acetate', 'cellulose').high]).toEqual(
      range('aluminium acetate, cellulose'),
    );
    expect([r('tannin', 'cellulose').low, r('tannin', 'cellulose').high]).toEqual(range('tannin'));
    expect(facts.filter((f) => f.kind === 'recipe-range').every((f) => /common practice/.test(f.source))).toBe(true);
  });

  it('tells alum, aluminium sulfate, aluminium acetate and tannin apart by formula and role', () => {
    expect(mordantKind(chemicals.get(1)!)).toBe('potash-alum');
    expect(mordantKind(chemicals.get(5)!)).toBe('aluminium-sulfate');
    expect(mordantKind(chemicals.get(2)!)).toBe('aluminium-acetate');
    expect(mordantKind(chemicals.get(3)!)).toBe('tannin');
    expect(mordantKind(chemicals.get(4)!)).toBeNull();
  });

  it('places alum on wool within 8–15 % owf and gives g Al per kg fibre (IUPAC 2021 fractions)', () => {
    const c = mordantChecks({ fibre: 'wool', steps: [alumBath(12)], chemicals });
    expect(c.fibreClass).toBe('protein');
    expect(c.mordant[0]).toMatchObject({ mordant: 'potash-alum', verdict: 'within', range: { low: 8, high: 15 } });
    // 12 % owf = 120 g alum per kg fibre × Al 0.056879 = 6.825 g Al/kg.
    expect(Math.abs(c.mordant[0].gAlPerKg! - 120 * al('KAl(SO4)2·12H2O'))).toBeLessThan(1e-3);
    expect(c.mordant[0].rangeGAlPerKg![0]).toBeCloseTo(80 * al('KAl(SO4)2·12H2O'), 3);
    expect(c.mordant[0].marking).toMatch(/common practice, recalled from memory/);
    expect(c.warnings).toEqual([]);
    expect(mordantChecks({ fibre: 'silk', steps: [alumBath(25)], chemicals }).mordant[0].verdict).toBe('above');
  });

  it('uses the cellulose range on cotton and warns when alum has no tannin or alkali step', () => {
    const bare = mordantChecks({ fibre: 'cotton', steps: [alumBath(10)], chemicals });
    expect(bare.mordant[0]).toMatchObject({ verdict: 'below', range: { low: 12, high: 20 } });
    expect(bare.warnings).toEqual([
      expect.objectContaining({ code: 'cellulose-alum-without-fixing', stepPosition: 1 }),
    ]);
    expect(bare.warnings[0].message).toMatch(/tannin/);
    const tannin = mordantChecks({
      fibre: 'cotton',
      steps: [{ position: 1, operation: 'tannin', ingredients: [ing(3, 8)] }, alumBath(15, 2)],
      chemicals,
    });
    expect(tannin.warnings).toEqual([]);
    expect(tannin.mordant.find((m) => m.mordant === 'tannin')).toMatchObject({ verdict: 'within', gAlPerKg: null });
    const soda = mordantChecks({
      fibre: 'linen',
      steps: [alumBath(15), { position: 2, operation: 'after-treatment', ingredients: [ing(4, 6)] }],
      chemicals,
    });
    expect(soda.warnings).toEqual([]);
    // Soda ash in a scour before the alum cleans the cloth; it does not fix the alum.
    const scour = mordantChecks({
      fibre: 'linen',
      steps: [{ position: 1, operation: 'scour', ingredients: [ing(4, 5)] }, alumBath(15, 2)],
      chemicals,
    });
    expect(scour.warnings).toHaveLength(1);
    const gall = mordantChecks({
      fibre: 'hemp',
      steps: [
        {
          position: 1,
          operation: 'dye-bath',
          ingredients: [{ kind: 'dyestuff', refId: 9, name: 'oak gall', percentOwf: 10 }],
        },
        alumBath(15, 2),
      ],
      chemicals,
      dyestuffClasses: new Map([[9, 'tannin']]),
    });
    expect(gall.warnings).toEqual([]);
  });

  it('compares aluminium acetate on plant fibres with 5–8 % owf; no warning for acetate; no range without a fibre', () => {
    const c = mordantChecks({
      fibre: 'cotton',
      steps: [{ position: 1, operation: 'mordant-bath', ingredients: [ing(2, 6)] }],
      chemicals,
    });
    expect(c.mordant[0]).toMatchObject({ mordant: 'aluminium-acetate', verdict: 'within' });
    expect(c.mordant[0].gAlPerKg).toBeCloseTo(60 * al('Al(OH)(CH3COO)2'), 3);
    expect(c.warnings).toEqual([]);
    const none = mordantChecks({ fibre: null, steps: [alumBath(12)], chemicals });
    expect(none.mordant[0]).toMatchObject({ verdict: 'no-range', range: null });
    expect(
      mordantChecks({
        fibre: 'wool',
        steps: [alumBath(12)].map((s) => ({ ...s, operation: 'print-paste' })),
        chemicals,
      }).mordant,
    ).toEqual([]);
  });

  it('computes g Al/kg as % owf × 10 × the Al mass fraction', () => {
    expect(gAlPerKgFibre(10, 'Al2(SO4)3')).toBeCloseTo(100 * al('Al2(SO4)3'), 3);
  });
});

import { describe, expect, it } from 'vitest';
import scales from '../reference/fastness-scales.json' with { type: 'json' };
import {
  changeGradeFromDifference,
  deltaEF,
  deltaEGS,
  greyScaleGrades,
  stainingGradeFromDifference,
} from '../../shared/compute/grey-scale.ts';
import { deltaE76 } from '../../shared/colour/index.ts';

// Instrumental grey-scale grades (ISO 105-A05 change in colour, ISO 105-A04 staining). The
// formulas are RECALLED FROM MEMORY (shared/compute/grey-scale.ts). What is checked here against
// an outside source: on neutral pairs (a* = b* = 0, where the standards' weighted differences
// reduce to |ΔL*|) the grades land on the grey scales' nominal CIELAB differences — ISO 105-A02
// (change in colour, read in a stored preview of the standard) and ISO 105-A03 (staining, from
// memory) — tests/reference/fastness-scales.json: the nominal difference gives the step's value
// within 0.05 grade, and every difference within the step's tolerance gives that step.
const grey = (L: number) => ({ L, a: 0, b: 0 });
const rows = (scale: string) => scales.filter((s) => s.scale === scale);

describe('grey-scale grades on neutral pairs at the nominal differences', () => {
  for (const [kind, scale] of [
    ['change', 'grey scale for change in colour'],
    ['staining', 'grey scale for staining'],
  ] as const)
    for (const s of rows(scale)) {
      it(`${kind} ${s.grade}: ΔE*ab ${s.dE_ab_nominal} ± ${s.tolerance}`, () => {
        const at = (d: number) => greyScaleGrades(grey(60), grey(60 - d))[kind];
        const nominal = at(s.dE_ab_nominal!);
        // Grade 1 sits at the end of the scale: the formula gives just under 1 (0.98) there.
        expect(Math.abs(nominal.grade - s.grade_numeric)).toBeLessThan(0.05);
        expect(nominal.step).toBe(s.grade);
        for (const d of [s.dE_ab_nominal! - s.tolerance!, s.dE_ab_nominal! + s.tolerance!])
          if (d >= 0) expect(at(d).step).toBe(s.grade);
      });
    }
});

describe('grey-scale formulas', () => {
  it('are continuous at their break points (ISO 105-A05 at 3.4; ISO 105-A04 within 0.01 grade at 4)', () => {
    expect(changeGradeFromDifference(3.4)).toBeCloseTo(5 - Math.log2(3.4 / 0.85), 12);
    expect(Math.abs(stainingGradeFromDifference(4) - (6.1 - 1.45 * Math.log(4)))).toBeLessThan(0.01);
  });
  it('weighted differences reduce to |ΔL*| on neutral pairs, and never exceed ΔE*ab on chromatic ones', () => {
    expect(deltaEF(grey(50), grey(47))).toBeCloseTo(3, 12);
    expect(deltaEGS(grey(50), grey(47))).toBeCloseTo(3, 12);
    const red = { L: 45, a: 50, b: 25 },
      redder = { L: 44, a: 55, b: 22 };
    expect(deltaEF(red, redder)).toBeLessThan(deltaE76(red, redder));
    expect(deltaEGS(red, redder)).toBeLessThan(deltaE76(red, redder));
  });
  it('an unchanged specimen is 5 on both scales', () => {
    const g = greyScaleGrades({ L: 40, a: 20, b: 10 }, { L: 40, a: 20, b: 10 });
    expect(g.change).toEqual({ grade: 5, step: '5', difference: 0 });
    expect(g.staining).toEqual({ grade: 5, step: '5', difference: 0 });
  });
});

describe('fastness records with readings', () => {
  it('take before/after readings alone or beside the grade, and name a bad reading beside its field', async () => {
    const { fastnessSchema } = await import('../../shared/schemas/fastness.ts');
    const pair = { before: grey(60), after: grey(56.6) };
    expect(fastnessSchema.safeParse({ washing: { readings: { change: pair } } }).success).toBe(true);
    expect(fastnessSchema.safeParse({ rubbingDry: { staining: '4', readings: { staining: pair } } }).success).toBe(
      true,
    );
    const bad = fastnessSchema.safeParse({
      washing: { change: '4', readings: { change: { ...pair, after: { L: 120, a: 0, b: 0 } } } },
    });
    expect(bad.success).toBe(false);
    expect(bad.error!.issues[0]).toMatchObject({
      path: ['washing', 'readings', 'change', 'after', 'L'],
      message: 'L* is 0–100',
    });
  });
});

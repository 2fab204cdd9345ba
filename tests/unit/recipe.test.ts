import { describe, expect, it } from 'vitest';
import {
  bathVolumeL,
  concentrationFromOwf,
  gramsFromOwf,
  roundTo,
  scaleRecipe,
  stepQuantities,
  type StepLike,
} from '../../shared/compute/recipe.ts';

describe('recipe arithmetic', () => {
  it('reproduces the worked example of BRIEF §4.1 (common practice): 250 g cotton, alum 15 % owf, 1:30 → 37.5 g in 7.5 L = 5.0 g/L', () => {
    expect(gramsFromOwf(15, 250)).toBeCloseTo(37.5, 10);
    expect(bathVolumeL(250, 30)).toBeCloseTo(7.5, 10);
    expect(concentrationFromOwf(15, 30)).toBeCloseTo(5.0, 10);
    const q = stepQuantities({ liquorRatio: 30, ingredients: [{ amount: 15, basis: 'owf' }] }, 250);
    expect(q.volumeL).toBeCloseTo(7.5, 10);
    expect(q.ingredients[0].grams).toBeCloseTo(37.5, 10);
    expect(q.ingredients[0].gPerL).toBeCloseTo(5.0, 10);
  });

  it('shows every basis on the other two: g/L needs a volume, grams become % owf', () => {
    // Same worked example read backwards (BRIEF §4.1, common practice): 5 g/L in 7.5 L is 37.5 g, which is 15 % owf on 250 g.
    const q = stepQuantities(
      {
        liquorRatio: 30,
        ingredients: [
          { amount: 5, basis: 'g/L' },
          { amount: 37.5, basis: 'g' },
        ],
      },
      250,
    );
    expect(q.ingredients[0]).toEqual({ grams: 37.5, gPerL: 5, percentOwf: 15 });
    expect(q.ingredients[1].percentOwf).toBeCloseTo(15, 10);
    expect(q.ingredients[1].gPerL).toBeCloseTo(5, 10);
    const noVolume = stepQuantities({ ingredients: [{ amount: 5, basis: 'g/L' }] }, 250);
    expect(noVolume.ingredients[0].grams).toBeNull();
    expect(noVolume.missing[0]).toMatch(/liquor ratio/);
  });

  it('uses a fixed bath volume in place of the liquor ratio when a step has one', () => {
    const q = stepQuantities({ liquorRatio: 30, volumeL: 2, ingredients: [{ amount: 40, basis: 'g/L' }] }, 250);
    expect(q.volumeL).toBe(2);
    expect(q.ingredients[0].grams).toBe(80);
  });
});

describe('scaling a recipe by dry mass', () => {
  const steps: StepLike[] = [
    {
      liquorRatio: 30,
      ingredients: [
        { amount: 15, basis: 'owf' },
        { amount: 6, basis: 'owf' },
      ],
    },
    {
      volumeL: 0.3,
      ingredients: [
        { amount: 40, basis: 'g/L' },
        { amount: 20, basis: 'g/L' },
      ],
    },
    {
      liquorRatio: 40,
      ingredients: [
        { amount: 60, basis: 'owf' },
        { amount: 2.5, basis: 'g' },
      ],
    },
  ];

  it('keeps % owf, g/L and liquor ratio; scales fixed grams and fixed volumes by the mass ratio', () => {
    const big = scaleRecipe(steps, 250, 1000);
    expect(big[0]).toEqual(steps[0]);
    expect(big[1].volumeL).toBeCloseTo(1.2, 10);
    expect(big[2].ingredients[1].amount).toBeCloseTo(10, 10);
    // Grams of every ingredient scale by exactly 4 (1000 g / 250 g); checked through the same BRIEF §4.1 formulas.
    for (let s = 0; s < steps.length; s++) {
      const a = stepQuantities(steps[s], 250).ingredients;
      const b = stepQuantities(big[s], 1000).ingredients;
      a.forEach((q, i) => expect(b[i].grams!).toBeCloseTo(q.grams! * 4, 9));
    }
  });

  it('round-trips: scaling up then back down returns the original within 0.01 g', () => {
    for (const to of [7, 10, 33.3, 1000, 12_345]) {
      const back = scaleRecipe(scaleRecipe(steps, 250, to), to, 250);
      back.forEach((step, s) => {
        const v0 = steps[s].volumeL;
        if (v0 == null) expect(step.volumeL ?? null).toBeNull();
        else expect(step.volumeL!).toBeCloseTo(v0, 9);
        step.ingredients.forEach((ing, i) => expect(roundTo(ing.amount)).toBe(roundTo(steps[s].ingredients[i].amount)));
      });
    }
  });

  it('refuses a zero or negative dry mass', () => {
    expect(() => scaleRecipe(steps, 250, 0)).toThrow(RangeError);
    expect(() => scaleRecipe(steps, -1, 10)).toThrow(RangeError);
  });
});

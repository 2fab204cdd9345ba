/**
 * Recipe arithmetic (BRIEF §4.1). All masses in grams, volumes in litres unless
 * the name says millilitres. Percent on weight of fibre (% owf) is relative to the
 * DRY fibre mass; liquor ratio 1:n means n litres of bath per kilogram of fibre.
 */
export type Basis = 'owf' | 'g/L' | 'g';
export const BASES: readonly Basis[] = ['owf', 'g/L', 'g'];

/** Grams of an ingredient at P % owf on a dry fibre mass. */
export const gramsFromOwf = (percentOwf: number, dryMassG: number) => (percentOwf / 100) * dryMassG;

/** Bath volume in litres for liquor ratio 1:n: fibre kg × n. */
export const bathVolumeL = (dryMassG: number, liquorRatio: number) => (dryMassG / 1000) * liquorRatio;

/** Concentration in g/L of P % owf at liquor ratio 1:n: 10·P/n (independent of the fibre mass). */
export const concentrationFromOwf = (percentOwf: number, liquorRatio: number) => (10 * percentOwf) / liquorRatio;

export type IngredientAmount = { amount: number; basis: Basis };
export type StepLike<I extends IngredientAmount = IngredientAmount> = {
  ingredients: I[];
  liquorRatio?: number | null;
  /** A bath of fixed volume (e.g. a print paste or a shared bath) instead of a liquor ratio. */
  volumeL?: number | null;
};

export type IngredientQuantity = {
  grams: number | null;
  gPerL: number | null;
  percentOwf: number | null;
};

export type StepQuantities = {
  volumeL: number | null;
  ingredients: IngredientQuantity[];
  /** Why a quantity could not be computed, in plain words, one per ingredient index. */
  missing: Array<string | null>;
};

/** The bath volume of a step: its own fixed volume, or fibre kg × n from its liquor ratio. */
export function stepVolumeL(step: Pick<StepLike, 'liquorRatio' | 'volumeL'>, dryMassG: number): number | null {
  if (step.volumeL != null && step.volumeL > 0) return step.volumeL;
  if (step.liquorRatio != null && step.liquorRatio > 0) return bathVolumeL(dryMassG, step.liquorRatio);
  return null;
}

/** One ingredient on all three bases, as far as the step's volume and the fibre mass allow. */
export function ingredientQuantity(
  ing: IngredientAmount,
  dryMassG: number,
  volumeL: number | null,
): IngredientQuantity & { missing: string | null } {
  let grams: number | null;
  if (ing.basis === 'owf') grams = gramsFromOwf(ing.amount, dryMassG);
  else if (ing.basis === 'g') grams = ing.amount;
  else grams = volumeL != null ? ing.amount * volumeL : null;
  const gPerL = ing.basis === 'g/L' ? ing.amount : grams != null && volumeL ? grams / volumeL : null;
  const percentOwf = ing.basis === 'owf' ? ing.amount : grams != null && dryMassG > 0 ? (grams / dryMassG) * 100 : null;
  const missing = grams == null ? 'Needs a liquor ratio or a bath volume to turn g/L into grams.' : null;
  return { grams, gPerL, percentOwf, missing };
}

/** Every computed quantity of a step, for display beside the recipe. */
export function stepQuantities(step: StepLike, dryMassG: number): StepQuantities {
  const volumeL = stepVolumeL(step, dryMassG);
  const rows = step.ingredients.map((ing) => ingredientQuantity(ing, dryMassG, volumeL));
  return {
    volumeL,
    ingredients: rows.map(({ grams, gPerL, percentOwf }) => ({ grams, gPerL, percentOwf })),
    missing: rows.map((r) => r.missing),
  };
}

/**
 * Scale a whole recipe to another dry fibre mass. % owf, g/L and the liquor ratio
 * are intensive and stay; fixed grams and fixed volumes scale with the mass ratio.
 * Scaling is always by mass, never by a count of swatches.
 */
export function scaleRecipe<I extends IngredientAmount, S extends StepLike<I>>(
  steps: readonly S[],
  fromDryMassG: number,
  toDryMassG: number,
): S[] {
  if (!(fromDryMassG > 0) || !(toDryMassG > 0)) throw new RangeError('Dry masses must be positive');
  const k = toDryMassG / fromDryMassG;
  return steps.map((step) => ({
    ...step,
    ...(step.volumeL != null ? { volumeL: step.volumeL * k } : {}),
    ingredients: step.ingredients.map((ing) => (ing.basis === 'g' ? { ...ing, amount: ing.amount * k } : { ...ing })),
  }));
}

/** Round for display and storage of scaled amounts (grams to 0.01 g, the resolution of a bench balance). */
export const roundTo = (x: number, decimals = 2) => {
  const f = 10 ** decimals;
  return Math.round(x * f) / f;
};

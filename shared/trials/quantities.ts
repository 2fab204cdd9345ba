import { pasteMakeUp, type PasteMakeUp } from '../compute/paste.ts';
import { scaleRecipe, stepQuantities, type IngredientQuantity } from '../compute/recipe.ts';
import type { Basis } from '../compute/recipe.ts';
import { recipeMass, type DryMassBasis } from '../compute/moisture.ts';

// Joins a stored recipe step to the shared recipe and paste arithmetic; the maths lives in shared/compute.

export type QIngredient = { kind: 'dyestuff' | 'chemical'; refId: number; name: string; amount: number; basis: Basis };
export type QStep = {
  operation: string;
  ingredients: QIngredient[];
  liquorRatio: number | null;
  paste: { volumeMl: number; stockGPerL?: number | null } | null;
};
/** The role of each chemical by id, to tell the mordant of a paste from its thickener. */
export type ChemicalRoles = ReadonlyMap<number, string>;

export type StepComputed = {
  /** Bath or paste volume in litres: fibre kg × n for 1:n, or the paste's final volume. */
  volumeL: number | null;
  ingredients: IngredientQuantity[];
  missing: Array<string | null>;
  paste: PasteMakeUp | null;
  pasteProblem: string | null;
};

export function computeStep(step: QStep, dryMassG: number, roles: ChemicalRoles): StepComputed {
  const volumeL = step.paste?.volumeMl ? step.paste.volumeMl / 1000 : null;
  const q = stepQuantities({ ingredients: step.ingredients, liquorRatio: step.liquorRatio, volumeL }, dryMassG);
  let paste: PasteMakeUp | null = null;
  let pasteProblem: string | null = null;
  if (step.paste?.volumeMl) {
    const perLitre = step.ingredients.filter((i) => i.kind === 'chemical' && i.basis === 'g/L');
    const mordants = perLitre.filter((i) => roles.get(i.refId) === 'mordant');
    const thickener = perLitre.find((i) => roles.get(i.refId) === 'thickener');
    try {
      // The stock solution named on the paste is the one its (first) mordant is drawn from.
      paste = pasteMakeUp({
        finalVolumeMl: step.paste.volumeMl,
        mordants: mordants.map((m, i) => ({
          name: m.name,
          gPerL: m.amount,
          stockGPerL: i === 0 ? (step.paste?.stockGPerL ?? null) : null,
        })),
        thickener: thickener ? { name: thickener.name, gPerL: thickener.amount } : null,
      });
    } catch (e) {
      pasteProblem = (e as Error).message;
    }
  }
  // A print paste is weighed per litre of paste and printed, not worked on the fibre: its g/L
  // ingredients are given as g/L of paste and grams for the paste volume, never as % owf.
  const ingredients =
    step.operation === 'print-paste'
      ? q.ingredients.map((x, i) => (step.ingredients[i]?.basis === 'g/L' ? { ...x, percentOwf: null } : x))
      : q.ingredients;
  return { volumeL: q.volumeL, ingredients, missing: q.missing, paste, pasteProblem };
}

/** Grams of one chemical in a step, from the recipe; null when the step does not say enough. */
export function gramsInStep(step: QStep, chemicalId: number, dryMassG: number, roles: ChemicalRoles): number | null {
  const c = computeStep(step, dryMassG, roles);
  let total: number | null = null;
  step.ingredients.forEach((ing, i) => {
    if (ing.kind !== 'chemical' || ing.refId !== chemicalId) return;
    const g = c.ingredients[i].grams;
    if (g != null) total = (total ?? 0) + g;
  });
  return total;
}

/** Scale stored steps to another dry mass (shared/compute's scaleRecipe; a paste's volume scales with the mass). */
export function scaleSteps<S extends QStep>(steps: readonly S[], fromDryMassG: number, toDryMassG: number): S[] {
  const like = steps.map((s) => ({ ...s, volumeL: s.paste ? s.paste.volumeMl / 1000 : null }));
  return scaleRecipe(like, fromDryMassG, toDryMassG).map(
    ({ volumeL, ...s }) =>
      ({
        ...s,
        paste: s.paste && volumeL != null ? { ...s.paste, volumeMl: volumeL * 1000 } : s.paste,
      }) as unknown as S,
  );
}

/**
 * The mass a trial's recipe is worked on: its dry mass as entered, brought to air-dry (commercial)
 * when it was weighed oven-dry (shared/compute/moisture.ts, ASTM D1909 regains recalled from memory).
 */
export const trialRecipeMass = (t: { dryMassG: number; dryMassBasis?: DryMassBasis | null; fibre?: string | null }) =>
  recipeMass(t.dryMassG, t.dryMassBasis, t.fibre);

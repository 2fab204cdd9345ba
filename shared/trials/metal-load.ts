import { compareMetalLoad, type ChemicalAmount, type MetalComparisonRow } from '../compute/chemistry.ts';

// "What this reproduction avoided": the historical and modern sides of every substitution, summed.

export type SubstitutionAmounts = {
  historical: { formula: string | null; grams: number | null } | null;
  modern: { formula: string | null; grams: number | null } | null;
};

export type TrialMetalLoad = {
  rows: MetalComparisonRow[];
  /** Substitutions left out of the sums because an amount or a formula is missing. */
  incomplete: number;
  fibreMassG: number;
};

const known = (x: { formula: string | null; grams: number | null } | null): x is ChemicalAmount & { grams: number } =>
  Boolean(x?.formula) && x?.grams != null;

/**
 * Metal before (historical chemicals) and after (their replacements) for one batch
 * and per kg of dry fibre. A practice with no chemical (e.g. "overdye with weld")
 * counts as no metal on its side.
 */
export function trialMetalLoad(subs: readonly SubstitutionAmounts[], fibreMassG: number): TrialMetalLoad {
  const before: ChemicalAmount[] = [];
  const after: ChemicalAmount[] = [];
  let incomplete = 0;
  for (const s of subs) {
    // A side with a formula but no amount cannot be weighed; the substitution is left out and counted.
    const unweighed = (x: SubstitutionAmounts['historical']) => Boolean(x?.formula) && x?.grams == null;
    if (unweighed(s.historical) || unweighed(s.modern)) {
      incomplete++;
      continue;
    }
    if (known(s.historical)) before.push(s.historical);
    if (known(s.modern)) after.push(s.modern);
  }
  return { rows: compareMetalLoad(before, after, fibreMassG), incomplete, fibreMassG };
}

import type { Cell, CellRecipe } from '../../../shared/compute/series.ts';
import type { Ingredient, Operation } from '../../models/trials.ts';

/**
 * How a stored series turns a cell into a recipe; expansion, scaling and the
 * materials list are the shared series module's (shared/compute/series.ts).
 */
export type MordantChem = { refId: number; name: string; owf: number };
export type StoredFactor = {
  name: string;
  levels: string[];
  role?: 'dyestuff' | 'tannin' | 'mordant' | 'other';
  refId?: number | null;
  refName?: string | null;
  mordants?: Array<{ level: string; chemicals: MordantChem[] }>;
};
export type PlannedStep = { operation: Operation; ingredients: Ingredient[] };

export function roleOf(f: StoredFactor) {
  if (f.role) return f.role;
  if (/tannin/i.test(f.name)) return 'tannin';
  if (/mordant/i.test(f.name)) return 'mordant';
  return 'other';
}

export { expandCells as expand, cellKey } from '../../../shared/compute/series.ts';

/** A level such as "25", "25 %" or "25 % owf" read as a number of % owf. */
const owfOf = (level: string) => {
  const n = Number.parseFloat(level);
  return Number.isFinite(n) ? n : null;
};

/** The recipe of one cell, amounts in % owf (scaled to grams by the dry mass). */
export function cellRecipe(cell: Cell, factors: StoredFactor[]): PlannedStep[] {
  const steps: PlannedStep[] = [];
  for (const f of factors.filter((x) => roleOf(x) === 'tannin')) {
    const p = owfOf(cell[f.name] ?? '');
    if (p && f.refId)
      steps.push({
        operation: 'tannin',
        ingredients: [{ kind: 'chemical', refId: f.refId, name: f.refName ?? f.name, amount: p, basis: 'owf' }],
      });
  }
  for (const f of factors.filter((x) => roleOf(x) === 'mordant')) {
    const chems = f.mordants?.find((m) => m.level === cell[f.name])?.chemicals ?? [];
    if (chems.length)
      steps.push({
        operation: 'mordant-bath',
        ingredients: chems.map((c) => ({
          kind: 'chemical',
          refId: c.refId,
          name: c.name,
          amount: c.owf,
          basis: 'owf',
        })),
      });
  }
  for (const f of factors.filter((x) => roleOf(x) === 'dyestuff')) {
    const p = owfOf(cell[f.name] ?? '');
    if (p && f.refId)
      steps.push({
        operation: 'dye-bath',
        ingredients: [{ kind: 'dyestuff', refId: f.refId, name: f.refName ?? f.name, amount: p, basis: 'owf' }],
      });
  }
  return steps;
}

/** Each cell's recipe at the series' dry mass and liquor ratio, as the shared series module takes it. */
export const cellRecipes = (
  cells: Cell[],
  factors: StoredFactor[],
  dryMassG: number,
  liquorRatio: number,
): CellRecipe[] =>
  cells.map((cell) => ({ cell, dryMassG, steps: cellRecipe(cell, factors).map((st) => ({ ...st, liquorRatio })) }));

export { gramsFromOwf, roundTo } from '../../../shared/compute/recipe.ts';
export { materialsList } from '../../../shared/compute/series.ts';

import { scaleRecipe, stepQuantities, type IngredientAmount, type StepLike } from './recipe.ts';

/**
 * Trial series (workshop planning): factors with levels expanded into cells, pruned,
 * each cell's recipe scaled to the cell's dry mass, and the materials to prepare.
 */
export type Factor = { name: string; levels: string[] };
export type Cell = Record<string, string>;

/** Cartesian product of the factors' levels, first factor varying slowest. */
export function expandCells(factors: readonly Factor[]): Cell[] {
  if (factors.length === 0) return [];
  const names = new Set<string>();
  for (const f of factors) {
    if (names.has(f.name)) throw new RangeError(`Factor "${f.name}" appears twice`);
    names.add(f.name);
    if (f.levels.length === 0) throw new RangeError(`Factor "${f.name}" has no levels`);
  }
  return factors.reduce<Cell[]>(
    (cells, f) => cells.flatMap((c) => f.levels.map((level) => ({ ...c, [f.name]: level }))),
    [{}],
  );
}

/** A stable key for a cell, independent of property order. */
export const cellKey = (cell: Cell) =>
  Object.keys(cell)
    .sort()
    .map((k) => `${k}=${cell[k]}`)
    .join('|');

/** Drop the cells the dyer pruned. */
export function pruneCells(cells: readonly Cell[], pruned: readonly Cell[]): Cell[] {
  const out = new Set(pruned.map(cellKey));
  return cells.filter((c) => !out.has(cellKey(c)));
}

export type SeriesIngredient = IngredientAmount & {
  kind: 'dyestuff' | 'chemical';
  refId?: number | null;
  name: string;
};
export type SeriesStep = StepLike<SeriesIngredient>;
export type CellRecipe = { cell: Cell; dryMassG: number; steps: SeriesStep[] };

/** Scale each cell's recipe (written for `fromDryMassG`) to the cell's own dry mass. */
export function scaleCells(
  recipes: ReadonlyArray<{ cell: Cell; steps: SeriesStep[]; fromDryMassG: number }>,
  toDryMassG: number | ((cell: Cell) => number),
): CellRecipe[] {
  return recipes.map((r) => {
    const dryMassG = typeof toDryMassG === 'function' ? toDryMassG(r.cell) : toDryMassG;
    return { cell: r.cell, dryMassG, steps: scaleRecipe(r.steps, r.fromDryMassG, dryMassG) };
  });
}

export type MaterialLine = {
  kind: 'dyestuff' | 'chemical';
  refId: number | null;
  name: string;
  grams: number;
  gramsWithAllowance: number;
};
export type MaterialsList = {
  deadVolumePct: number;
  participants: number;
  perParticipant: { lines: MaterialLine[]; fibreG: number; bathL: number; bathLWithAllowance: number };
  total: { lines: MaterialLine[]; fibreG: number; bathL: number; bathLWithAllowance: number };
  /** Ingredients whose grams could not be computed (g/L without a liquor ratio or volume). */
  unresolved: string[];
};

/**
 * Materials for one set of cells, summed per dyestuff and chemical, plus a dead-volume
 * allowance (liquid left in pots, tubes and on equipment) applied to baths and what
 * dissolves in them. For a workshop every participant makes every cell.
 */
export function materialsList(
  cells: readonly CellRecipe[],
  opts: { deadVolumePct?: number; participants?: number } = {},
): MaterialsList {
  const deadVolumePct = opts.deadVolumePct ?? 0;
  const participants = Math.max(1, opts.participants ?? 1);
  if (deadVolumePct < 0) throw new RangeError('The dead-volume allowance cannot be negative');
  const k = 1 + deadVolumePct / 100;
  const byKey = new Map<string, MaterialLine>();
  const unresolved = new Set<string>();
  let fibreG = 0;
  let bathL = 0;
  for (const c of cells) {
    fibreG += c.dryMassG;
    for (const step of c.steps) {
      const q = stepQuantities(step, c.dryMassG);
      bathL += q.volumeL ?? 0;
      step.ingredients.forEach((ing, i) => {
        const grams = q.ingredients[i].grams;
        if (grams == null) {
          unresolved.add(ing.name);
          return;
        }
        const key = `${ing.kind}:${ing.refId ?? ing.name}`;
        const line = byKey.get(key) ?? {
          kind: ing.kind,
          refId: ing.refId ?? null,
          name: ing.name,
          grams: 0,
          gramsWithAllowance: 0,
        };
        line.grams += grams;
        line.gramsWithAllowance = line.grams * k;
        byKey.set(key, line);
      });
    }
  }
  const lines = [...byKey.values()].sort((a, b) => a.kind.localeCompare(b.kind) || a.name.localeCompare(b.name));
  const times = (n: number) =>
    lines.map((l) => ({ ...l, grams: l.grams * n, gramsWithAllowance: l.gramsWithAllowance * n }));
  return {
    deadVolumePct,
    participants,
    perParticipant: { lines: times(1), fibreG, bathL, bathLWithAllowance: bathL * k },
    total: {
      lines: times(participants),
      fibreG: fibreG * participants,
      bathL: bathL * participants,
      bathLWithAllowance: bathL * k * participants,
    },
    unresolved: [...unresolved],
  };
}

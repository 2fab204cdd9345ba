import { cellKey, type Cell } from '../../../shared/schemas/series.ts';
import type { Ingredient, Operation } from '../../models/trials.ts';

/**
 * Interim series planning used by the series routes until the shared series
 * module (shared/compute/series.ts) takes it over: expansion into cells, the
 * recipe of one cell, and the materials list.
 */
export type MordantChem = { refId: number; name: string; owf: number };
export type StoredFactor = { name: string; levels: string[]; role?: 'dyestuff' | 'tannin' | 'mordant' | 'other'; refId?: number | null; refName?: string | null; mordants?: Array<{ level: string; chemicals: MordantChem[] }> };
export type PlannedStep = { operation: Operation; ingredients: Ingredient[] };

export function roleOf(f: StoredFactor) {
  if (f.role) return f.role;
  if (/tannin/i.test(f.name)) return 'tannin';
  if (/mordant/i.test(f.name)) return 'mordant';
  return 'other';
}

/** Every combination of levels, first factor varying slowest. */
export function expand(factors: Array<{ name: string; levels: string[] }>): Cell[] {
  return factors.reduce<Cell[]>((cells, f) => cells.flatMap((c) => f.levels.map((l) => ({ ...c, [f.name]: l }))), [{}]);
}

export const keysOf = (cells: Cell[], factors: StoredFactor[]) => cells.map((c) => cellKey(c, factors.map((f) => f.name)));

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
    if (p && f.refId) steps.push({ operation: 'tannin', ingredients: [{ kind: 'chemical', refId: f.refId, name: f.refName ?? f.name, amount: p, basis: 'owf' }] });
  }
  for (const f of factors.filter((x) => roleOf(x) === 'mordant')) {
    const chems = f.mordants?.find((m) => m.level === cell[f.name])?.chemicals ?? [];
    if (chems.length) steps.push({ operation: 'mordant-bath', ingredients: chems.map((c) => ({ kind: 'chemical', refId: c.refId, name: c.name, amount: c.owf, basis: 'owf' })) });
  }
  for (const f of factors.filter((x) => roleOf(x) === 'dyestuff')) {
    const p = owfOf(cell[f.name] ?? '');
    if (p && f.refId) steps.push({ operation: 'dye-bath', ingredients: [{ kind: 'dyestuff', refId: f.refId, name: f.refName ?? f.name, amount: p, basis: 'owf' }] });
  }
  return steps;
}

/** Mass (g) = P (% owf) / 100 × dry fibre mass (g) [BRIEF §4.1]. */
export const gramsFor = (owf: number, dryMassG: number) => Math.round(owf * dryMassG) / 100;

export type MaterialRow = { kind: 'dyestuff' | 'chemical'; refId: number; name: string; grams: number; withAllowanceG: number };

/** Materials for a set of cells, each dyed at dryMassG, with a dead-volume allowance in %. */
export function materials(cells: Cell[], factors: StoredFactor[], dryMassG: number, deadVolumePct: number, liquorRatio: number) {
  const rows = new Map<string, MaterialRow>();
  let liquorL = 0;
  for (const cell of cells) {
    for (const step of cellRecipe(cell, factors)) {
      liquorL += (dryMassG / 1000) * liquorRatio;
      for (const i of step.ingredients) {
        const key = `${i.kind}:${i.refId}`;
        const row = rows.get(key) ?? { kind: i.kind, refId: i.refId, name: i.name, grams: 0, withAllowanceG: 0 };
        row.grams += gramsFor(i.amount, dryMassG);
        rows.set(key, row);
      }
    }
  }
  const k = 1 + deadVolumePct / 100;
  const items = [...rows.values()].map((r) => ({ ...r, grams: round(r.grams), withAllowanceG: round(r.grams * k) }));
  return { items, liquorL: round(liquorL), liquorWithAllowanceL: round(liquorL * k), fibreG: round(cells.length * dryMassG), deadVolumePct };
}

const round = (x: number) => Math.round(x * 100) / 100;

import { ATOMIC_WEIGHTS, HEAVY_METALS } from '../data/atomic-weights.ts';

/** Element counts of a formula, e.g. { K: 1, Al: 1, S: 2, O: 20, H: 24 }. */
export type Composition = Record<string, number>;

export class FormulaError extends Error {
  constructor(
    public formula: string,
    message: string,
  ) {
    super(`${message} in formula "${formula}"`);
  }
}

// The dot of a hydrate may be written ·, •, ∙, * or a plain full stop.
const HYDRATE_DOT = /[·•∙*.]/;

function add(into: Composition, from: Composition, times: number) {
  for (const [el, n] of Object.entries(from)) into[el] = (into[el] ?? 0) + n * times;
}

/**
 * Parse a formula with nested ( ) or [ ] groups and hydrate parts:
 * "KAl(SO4)2·12H2O", "Pb(CH3COO)2.3H2O", "K2Cr2O7". Unknown elements are refused
 * so that a typo never yields a plausible-looking molar mass.
 */
export function parseFormula(formula: string): Composition {
  const src = formula.replace(/\s+/g, '');
  if (!src) throw new FormulaError(formula, 'Empty formula');
  const total: Composition = {};
  for (const part of src.split(HYDRATE_DOT)) {
    if (!part) throw new FormulaError(formula, 'Empty part around a hydrate dot');
    const lead = /^(\d+)/.exec(part);
    const coefficient = lead ? Number(lead[1]) : 1;
    const body = lead ? part.slice(lead[1].length) : part;
    add(total, parseGroup(formula, body), coefficient);
  }
  return total;
}

function parseGroup(formula: string, body: string): Composition {
  const stack: Composition[] = [{}];
  const closers: string[] = [];
  let i = 0;
  const readCount = () => {
    const m = /^\d+/.exec(body.slice(i));
    if (!m) return 1;
    i += m[0].length;
    const n = Number(m[0]);
    if (n === 0) throw new FormulaError(formula, 'A count of zero');
    return n;
  };
  while (i < body.length) {
    const ch = body[i];
    if (ch === '(' || ch === '[') {
      stack.push({});
      closers.push(ch === '(' ? ')' : ']');
      i++;
    } else if (ch === ')' || ch === ']') {
      if (closers.pop() !== ch) throw new FormulaError(formula, `Unmatched "${ch}"`);
      i++;
      const group = stack.pop()!;
      add(stack[stack.length - 1], group, readCount());
    } else {
      const m = /^[A-Z][a-z]?/.exec(body.slice(i));
      if (!m) throw new FormulaError(formula, `Unexpected "${ch}"`);
      if (ATOMIC_WEIGHTS[m[0]] === undefined) throw new FormulaError(formula, `Unknown element "${m[0]}"`);
      i += m[0].length;
      add(stack[stack.length - 1], { [m[0]]: 1 }, readCount());
    }
  }
  if (closers.length) throw new FormulaError(formula, 'Unclosed bracket');
  return stack[0];
}

/** Molar mass in g/mol from IUPAC 2021 abridged atomic weights. */
export function molarMass(formula: string): number {
  return Object.entries(parseFormula(formula)).reduce((sum, [el, n]) => sum + ATOMIC_WEIGHTS[el] * n, 0);
}

/** Mass fraction (0–1) of each element in the formula. */
export function massFractions(formula: string): Record<string, number> {
  const comp = parseFormula(formula);
  const m = molarMass(formula);
  return Object.fromEntries(Object.entries(comp).map(([el, n]) => [el, (ATOMIC_WEIGHTS[el] * n) / m]));
}

/** Mass fraction (0–1) of one element in the formula; 0 when it does not occur. */
export function metalMassFraction(formula: string, metal: string): number {
  return massFractions(formula)[metal] ?? 0;
}

/** Molar mass and metal fraction for a reference row; nulls when the formula is absent (gums, starches). */
export function describeChemical(formula: string | null, metal: string | null) {
  if (!formula) return { molarMass: null, metalMassFraction: null };
  return { molarMass: molarMass(formula), metalMassFraction: metal ? metalMassFraction(formula, metal) : null };
}

/** The metals a load reports: the mordant metals, toxic or not (Ca, Na, K are left out as counter-ions). */
export const LOAD_METALS = ['Al', 'Fe', 'Cu', 'Sn', 'Cr', 'Pb', 'As', 'Zn', 'Sb'] as const;
export type LoadMetal = (typeof LOAD_METALS)[number];
export const isHeavyMetal = (el: string) => (HEAVY_METALS as readonly string[]).includes(el);

export type ChemicalAmount = { formula: string | null; grams: number };
export type MetalLoad = Partial<Record<LoadMetal, number>>;

/** Grams of each metal in a set of chemical amounts: Σ mass × metal mass fraction. */
export function metalLoad(amounts: readonly ChemicalAmount[], metals: readonly LoadMetal[] = LOAD_METALS): MetalLoad {
  const load: MetalLoad = {};
  for (const { formula, grams } of amounts) {
    if (!formula || !(grams > 0)) continue;
    const fractions = massFractions(formula);
    for (const el of metals) {
      if (fractions[el]) load[el] = (load[el] ?? 0) + grams * fractions[el];
    }
  }
  return load;
}

/** A load expressed per kilogram of dry fibre (g metal / kg fibre). */
export function perKgFibre(load: MetalLoad, fibreMassG: number): MetalLoad {
  if (!(fibreMassG > 0)) throw new RangeError('Fibre mass must be positive');
  return Object.fromEntries(Object.entries(load).map(([el, g]) => [el, (g * 1000) / fibreMassG])) as MetalLoad;
}

export type MetalComparisonRow = {
  metal: LoadMetal;
  heavy: boolean;
  beforeG: number;
  afterG: number;
  /** Positive: grams of this metal the substitution kept out of the batch. */
  avoidedG: number;
  beforeGPerKgFibre: number | null;
  afterGPerKgFibre: number | null;
};

/** Historical vs modern metal load side by side, e.g. the grams of lead not used. */
export function compareMetalLoad(before: readonly ChemicalAmount[], after: readonly ChemicalAmount[], fibreMassG?: number): MetalComparisonRow[] {
  const b = metalLoad(before);
  const a = metalLoad(after);
  const perKg = (g: number) => (fibreMassG && fibreMassG > 0 ? (g * 1000) / fibreMassG : null);
  return LOAD_METALS.filter((el) => b[el] !== undefined || a[el] !== undefined).map((metal) => {
    const beforeG = b[metal] ?? 0;
    const afterG = a[metal] ?? 0;
    return { metal, heavy: isHeavyMetal(metal), beforeG, afterG, avoidedG: beforeG - afterG, beforeGPerKgFibre: perKg(beforeG), afterGPerKgFibre: perKg(afterG) };
  });
}

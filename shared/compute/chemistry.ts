import { ATOMIC_WEIGHTS, HEAVY_METALS } from '../data/atomic-weights.ts';

/** Element counts of a formula, e.g. { K: 1, Al: 1, S: 2, O: 20, H: 24 }. */
export type Composition = Record<string, number>;

export class FormulaError extends Error {
  /** 1-based position of the fault in the formula as written (what a person counts); null when the whole formula is at fault. */
  public position: number | null;
  /** The fault in people's words, with its position, e.g. `Unexpected "x" at position 7`. */
  public reason: string;
  constructor(
    public formula: string,
    message: string,
    index: number | null = null,
  ) {
    const reason = index === null ? message : `${message} at position ${index + 1}`;
    super(`${reason} in formula "${formula}"`);
    this.position = index === null ? null : index + 1;
    this.reason = reason;
  }
}

// The dot of a hydrate may be written ·, •, ∙, ⋅, * or a plain full stop. A full stop is read as a hydrate
// dot only where a part ends (after an element, a count or a closing bracket); inside a leading coefficient
// it is a decimal point, so "CaSO4.0.5H2O" reads as CaSO4 · 0.5 H2O and "Pb(CH3COO)2.3H2O" as Pb(CH3COO)2 · 3 H2O.
const HYDRATE_DOTS = '·•∙⋅*.';

/** Unicode vulgar fractions allowed as (part of) a hydrate coefficient, e.g. CaSO4·½H2O, 2CaSO4·1½H2O... */
const VULGAR: Record<string, number> = {
  '½': 1 / 2,
  '⅓': 1 / 3,
  '⅔': 2 / 3,
  '¼': 1 / 4,
  '¾': 3 / 4,
  '⅕': 1 / 5,
  '⅖': 2 / 5,
  '⅗': 3 / 5,
  '⅘': 4 / 5,
  '⅙': 1 / 6,
  '⅚': 5 / 6,
  '⅐': 1 / 7,
  '⅛': 1 / 8,
  '⅜': 3 / 8,
  '⅝': 5 / 8,
  '⅞': 7 / 8,
  '⅑': 1 / 9,
  '⅒': 1 / 10,
};

function add(into: Composition, from: Composition, times: number) {
  for (const [el, n] of Object.entries(from)) into[el] = (into[el] ?? 0) + n * times;
}

const show = (ch: string) => (/\s/.test(ch) ? 'space' : `"${ch}"`);

/**
 * Parse a formula with nested ( ) or [ ] groups and hydrate parts:
 * "KAl(SO4)2·12H2O", "Pb(CH3COO)2.3H2O", "CaSO4·0.5H2O", "CaSO4·½H2O", "Al2(SO4)3·14.3H2O", "K2Cr2O7".
 * A hydrate part may lead with a whole, decimal (0.5, 14.3), vulgar-fraction (½, 1½) or a/b (1/2) coefficient;
 * counts after elements and brackets are whole numbers. Unknown elements and anything that does not fit are
 * refused with the position of the fault, so that a typo never yields a plausible-looking molar mass.
 */
export function parseFormula(formula: string): Composition {
  const src = formula;
  let i = 0;
  const total: Composition = {};
  const skipSpace = () => {
    while (i < src.length && /\s/.test(src[i])) i++;
  };
  const fail = (message: string, at: number | null = i): never => {
    throw new FormulaError(formula, message, at);
  };
  const digits = () => {
    const start = i;
    while (i < src.length && src[i] >= '0' && src[i] <= '9') i++;
    return src.slice(start, i);
  };

  // A leading coefficient: 3, 0.5, 14.3, ½, 1½, 1/2.
  const readCoefficient = (): number => {
    const start = i;
    const whole = digits();
    let value = whole ? Number(whole) : 1;
    if (whole && src[i] === '.' && /[0-9]/.test(src[i + 1] ?? '')) {
      i++;
      value = Number(`${whole}.${digits()}`);
    } else if (whole && src[i] === '/' && /[0-9]/.test(src[i + 1] ?? '')) {
      i++;
      const den = Number(digits());
      if (den === 0) fail('A fraction over zero', start);
      value = Number(whole) / den;
    } else if (VULGAR[src[i]] !== undefined) {
      value = (whole ? Number(whole) : 0) + VULGAR[src[i]];
      i++;
    }
    if (i > start && !(value > 0)) fail('A coefficient of zero', start);
    return value;
  };

  // A whole-number count after an element or a closing bracket; 1 when absent.
  const readCount = (): number => {
    const start = i;
    const d = digits();
    if (!d) return 1;
    if (Number(d) === 0) fail('A count of zero', start);
    // "Fe1.5O" would otherwise read as Fe · 5 O: counts inside a part are whole numbers.
    if (d === '1' && src[i] === '.' && /[0-9]/.test(src[i + 1] ?? ''))
      fail('Unexpected "." (counts inside a formula are whole numbers)', i);
    return Number(d);
  };

  const readPart = (): Composition => {
    const partStart = i;
    const coefficient = readCoefficient();
    const stack: Composition[] = [{}];
    const openers: Array<{ closer: string; at: number }> = [];
    const bodyStart = i;
    while (i < src.length && !HYDRATE_DOTS.includes(src[i]) && !/\s/.test(src[i])) {
      const ch = src[i];
      if (ch === '(' || ch === '[') {
        stack.push({});
        openers.push({ closer: ch === '(' ? ')' : ']', at: i });
        i++;
      } else if (ch === ')' || ch === ']') {
        const open = openers.pop();
        if (!open || open.closer !== ch) fail(`Unmatched "${ch}"`);
        i++;
        if (Object.keys(stack[stack.length - 1]).length === 0) fail('Empty brackets', open!.at);
        const group = stack.pop()!;
        add(stack[stack.length - 1], group, readCount());
      } else if (ch >= 'A' && ch <= 'Z') {
        const symbol = /^[A-Z][a-z]?/.exec(src.slice(i))![0];
        if (ATOMIC_WEIGHTS[symbol] === undefined) fail(`Unknown element "${symbol}"`);
        i += symbol.length;
        add(stack[stack.length - 1], { [symbol]: 1 }, readCount());
      } else {
        fail(`Unexpected ${show(ch)}`);
      }
    }
    if (openers.length) fail(`Unclosed "${src[openers[openers.length - 1].at]}"`, openers[openers.length - 1].at);
    if (i === bodyStart) {
      if (i < src.length) fail(`Unexpected ${show(src[i])}`);
      fail(
        i > partStart ? 'An element is missing after the coefficient at the end' : 'An element is missing at the end',
        null,
      );
    }
    const part: Composition = {};
    add(part, stack[0], coefficient);
    return part;
  };

  skipSpace();
  if (i >= src.length) throw new FormulaError(formula, 'Empty formula');
  for (;;) {
    add(total, readPart(), 1);
    const spaceAt = i;
    skipSpace();
    if (i >= src.length) break;
    if (!HYDRATE_DOTS.includes(src[i])) fail(`Unexpected ${show(src[spaceAt])}`, spaceAt);
    const dotAt = i;
    i++;
    skipSpace();
    if (i >= src.length) fail('Nothing after the hydrate dot', dotAt);
  }
  return total;
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
export function compareMetalLoad(
  before: readonly ChemicalAmount[],
  after: readonly ChemicalAmount[],
  fibreMassG?: number,
): MetalComparisonRow[] {
  const b = metalLoad(before);
  const a = metalLoad(after);
  const perKg = (g: number) => (fibreMassG && fibreMassG > 0 ? (g * 1000) / fibreMassG : null);
  return LOAD_METALS.filter((el) => b[el] !== undefined || a[el] !== undefined).map((metal) => {
    const beforeG = b[metal] ?? 0;
    const afterG = a[metal] ?? 0;
    return {
      metal,
      heavy: isHeavyMetal(metal),
      beforeG,
      afterG,
      avoidedG: beforeG - afterG,
      beforeGPerKgFibre: perKg(beforeG),
      afterGPerKgFibre: perKg(afterG),
    };
  });
}

import { LOAD_METALS, metalMassFraction, molarMass, parseFormula, type Composition } from './chemistry.ts';

/**
 * What a bath's charge can make when its chemicals react in the pot (BRIEF §4.3): aluminium
 * acetate "red liquor" is made by double decomposition of alum with an acetate, the sulfate
 * leaving as an insoluble precipitate. The strength of such a bath is the product it can make,
 * limited by whichever reactant runs out first, never the total mass weighed in.
 *
 * Equations balanced here and checked atom by atom (tests/unit/stoichiometry.test.ts); the
 * chemistry of the preparation is textbook double decomposition, recalled from memory. Molar
 * masses from IUPAC 2021 abridged atomic weights (shared/data/atomic-weights.ts).
 */

export type Species = { name: string; formula: string; coefficient: number };
export type ProductSpecies = Species & {
  /** Where it ends up: in the liquor, or settled out as a sludge the dyer decants from. */
  fate: 'solution' | 'precipitate';
  /** The mordant the bath is made for; its concentration is the bath's strength. */
  active?: boolean;
};
export type Reaction = {
  id: string;
  name: string;
  /** Reactants matched to a batch's ingredients by the reference chemical's name. */
  reactants: Species[];
  products: ProductSpecies[];
  note: string;
  source: string;
};

const BASIC_AL_ACETATE = { name: 'aluminium acetate (basic)', formula: 'Al(OH)(CH3COO)2' };
const ALUM = { name: 'potash alum', formula: 'KAl(SO4)2·12H2O' };

export const REACTIONS: readonly Reaction[] = [
  {
    id: 'alum-calcium-acetate',
    name: 'Aluminium acetate from alum and calcium acetate',
    // 2 KAl(SO4)2·12H2O + 3 Ca(CH3COO)2 → 2 Al(OH)(CH3COO)2 + 2 CH3COOH + 3 CaSO4·2H2O↓ + K2SO4 + 16 H2O
    reactants: [
      { ...ALUM, coefficient: 2 },
      { name: 'calcium acetate', formula: 'Ca(CH3COO)2', coefficient: 3 },
    ],
    products: [
      { ...BASIC_AL_ACETATE, coefficient: 2, fate: 'solution', active: true },
      { name: 'acetic acid', formula: 'CH3COOH', coefficient: 2, fate: 'solution' },
      { name: 'calcium sulfate (gypsum)', formula: 'CaSO4·2H2O', coefficient: 3, fate: 'precipitate' },
      { name: 'potassium sulfate', formula: 'K2SO4', coefficient: 1, fate: 'solution' },
      { name: 'water', formula: 'H2O', coefficient: 16, fate: 'solution' },
    ],
    note: 'The gypsum settles; the clear liquor is decanted. In solution the acetate hydrolyses, so it is counted as the basic acetate.',
    source: 'double decomposition, balanced here; chemistry recalled from memory (textbook)',
  },
  {
    id: 'alum-lead-acetate',
    name: 'Red liquor from alum and sugar of lead (historical)',
    // 2 KAl(SO4)2·12H2O + 3 Pb(CH3COO)2·3H2O → 2 Al(OH)(CH3COO)2 + 2 CH3COOH + 3 PbSO4↓ + K2SO4 + 31 H2O
    reactants: [
      { ...ALUM, coefficient: 2 },
      { name: 'lead(II) acetate (sugar of lead)', formula: 'Pb(CH3COO)2·3H2O', coefficient: 3 },
    ],
    products: [
      { ...BASIC_AL_ACETATE, coefficient: 2, fate: 'solution', active: true },
      { name: 'acetic acid', formula: 'CH3COOH', coefficient: 2, fate: 'solution' },
      { name: 'lead(II) sulfate', formula: 'PbSO4', coefficient: 3, fate: 'precipitate' },
      { name: 'potassium sulfate', formula: 'K2SO4', coefficient: 1, fate: 'solution' },
      { name: 'water', formula: 'H2O', coefficient: 31, fate: 'solution' },
    ],
    note: 'Most of the lead leaves as insoluble lead sulfate in the sludge, not on the cloth: the sludge is hazardous waste.',
    source: 'double decomposition, balanced here; chemistry recalled from memory (textbook)',
  },
];

/** Σ coefficient × composition of one side of an equation. */
export function sideComposition(side: readonly Species[]): Composition {
  const total: Composition = {};
  for (const s of side)
    for (const [el, n] of Object.entries(parseFormula(s.formula))) total[el] = (total[el] ?? 0) + n * s.coefficient;
  return total;
}

/** Elements whose counts differ between the two sides (empty when the equation balances). */
export function imbalance(r: Reaction): Record<string, number> {
  const left = sideComposition(r.reactants);
  const right = sideComposition(r.products);
  const out: Record<string, number> = {};
  for (const el of new Set([...Object.keys(left), ...Object.keys(right)])) {
    const d = (right[el] ?? 0) - (left[el] ?? 0);
    if (Math.abs(d) > 1e-9) out[el] = d;
  }
  return out;
}

export type ReactionYield = {
  reaction: Reaction;
  /** Moles of reaction that run (the limiting reactant's moles ÷ its coefficient). */
  extentMol: number;
  limiting: string;
  products: Array<{ name: string; formula: string; grams: number; fate: ProductSpecies['fate']; active: boolean }>;
  /** Reactant left over unreacted (excess), in grams. */
  excess: Array<{ name: string; grams: number }>;
};

/** The reaction run to completion on the grams given for each reactant (by name). */
export function reactionYield(r: Reaction, gramsByName: Record<string, number>): ReactionYield {
  const moles = r.reactants.map((s) => ({ s, mol: (gramsByName[s.name] ?? 0) / molarMass(s.formula) }));
  const limit = moles.reduce((a, b) => (b.mol / b.s.coefficient < a.mol / a.s.coefficient ? b : a));
  const extentMol = limit.mol / limit.s.coefficient;
  return {
    reaction: r,
    extentMol,
    limiting: limit.s.name,
    products: r.products
      .filter((p) => p.formula !== 'H2O')
      .map((p) => ({
        name: p.name,
        formula: p.formula,
        grams: extentMol * p.coefficient * molarMass(p.formula),
        fate: p.fate,
        active: Boolean(p.active),
      })),
    excess: moles
      .map(({ s, mol }) => ({ name: s.name, grams: (mol - extentMol * s.coefficient) * molarMass(s.formula) }))
      .filter((x) => x.grams > 1e-9),
  };
}

export type BathProduct = ReactionYield & {
  volumeMl: number;
  /** The active product's concentration in the liquor, g/L: the bath's made strength. */
  activeGPerL: number;
  active: { name: string; formula: string; grams: number };
};

/**
 * The reaction a batch's ingredients make, if any: every reactant of a known reaction present.
 * Returns null for a bath whose chemicals are simply dissolved (its strength is what was weighed).
 */
export function bathProduct(
  ingredients: ReadonlyArray<{ name: string; grams: number }>,
  volumeMl: number,
): BathProduct | null {
  const grams: Record<string, number> = {};
  for (const i of ingredients) grams[i.name] = (grams[i.name] ?? 0) + i.grams;
  const r = REACTIONS.find((x) => x.reactants.every((s) => grams[s.name] > 0));
  if (!r || !(volumeMl > 0)) return null;
  const y = reactionYield(r, grams);
  const active = y.products.find((p) => p.active)!;
  return { ...y, volumeMl, active, activeGPerL: (active.grams * 1000) / volumeMl };
}

/** Grams of the other reactant that exactly match `grams` of the first (e.g. calcium acetate for 100 g alum). */
export function matchingReactant(r: Reaction, from: string, grams: number): Array<{ name: string; grams: number }> {
  const base = r.reactants.find((s) => s.name === from);
  if (!base) throw new RangeError(`${from} is not a reactant of ${r.name}`);
  const extent = grams / molarMass(base.formula) / base.coefficient;
  return r.reactants
    .filter((s) => s !== base)
    .map((s) => ({ name: s.name, grams: extent * s.coefficient * molarMass(s.formula) }));
}

export type MadeByReaction = {
  reaction: string;
  active: { name: string; formula: string; grams: number; gPerL: number };
  /** The mordant metal the active product carries, per litre of liquor as made. */
  metal: { symbol: string; gPerL: number } | null;
  limiting: string;
  excess: Array<{ name: string; grams: number }>;
  byProducts: Array<{ name: string; grams: number; fate: ProductSpecies['fate'] }>;
  note: string;
  source: string;
};

/** What a reacting bath makes, for display: the active product's grams and g/L, its metal, the by-products. */
export function madeByReaction(
  ingredients: ReadonlyArray<{ name: string; grams: number }>,
  volumeMl: number,
): MadeByReaction | null {
  const p = bathProduct(ingredients, volumeMl);
  if (!p) return null;
  const comp = parseFormula(p.active.formula);
  // The mordant metal the product carries, by the same mass fractions as every metal load (chemistry.ts).
  const metal = LOAD_METALS.find((m) => comp[m]);
  const metalGPerL = metal ? p.activeGPerL * metalMassFraction(p.active.formula, metal) : 0;
  return {
    reaction: p.reaction.name,
    active: { name: p.active.name, formula: p.active.formula, grams: p.active.grams, gPerL: p.activeGPerL },
    metal: metal ? { symbol: metal, gPerL: metalGPerL } : null,
    limiting: p.limiting,
    excess: p.excess,
    byProducts: p.products.filter((x) => !x.active).map((x) => ({ name: x.name, grams: x.grams, fate: x.fate })),
    note: p.reaction.note,
    source: p.reaction.source,
  };
}

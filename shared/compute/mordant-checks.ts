import { metalMassFraction } from './chemistry.ts';
import { matchFibre } from './moisture.ts';
import type { FibreClass } from '../data/moisture-regain.ts';

// Fibre-aware mordant checks: the amount of an aluminium mordant or a tannin beside the range dyers
// commonly use for the fibre, the aluminium it puts on each kg of fibre (chemistry.ts mass fractions,
// IUPAC 2021 weights), and a warning when alum on a cellulose fibre has no tannin or alkali step.
//
// Every range below is COMMON PRACTICE, RECALLED FROM MEMORY, with no published source: the same
// figures are kept, so marked, in tests/reference/dye-facts.json (kind "recipe-range"). They are a
// guide beside the recipe, not a rule: a dyer's own tests decide.

export const MORDANT_RANGE_MARKING = 'common practice, recalled from memory (no published source)';

export type MordantKind = 'potash-alum' | 'aluminium-sulfate' | 'aluminium-acetate' | 'tannin';

export type MordantRange = { kind: MordantKind; fibreClass: FibreClass; low: number; high: number; applies: string };

export const MORDANT_RANGES: readonly MordantRange[] = [
  { kind: 'potash-alum', fibreClass: 'protein', low: 8, high: 15, applies: 'potash alum on wool or silk' },
  {
    kind: 'potash-alum',
    fibreClass: 'cellulose',
    low: 12,
    high: 20,
    applies: 'potash alum on cotton, linen and other plant fibres, after a tannin step',
  },
  {
    kind: 'aluminium-sulfate',
    fibreClass: 'cellulose',
    low: 12,
    high: 20,
    applies: 'aluminium sulfate on cotton, linen and other plant fibres, after a tannin step',
  },
  {
    kind: 'aluminium-acetate',
    fibreClass: 'cellulose',
    low: 5,
    high: 8,
    applies: 'aluminium acetate on plant fibres (often followed by a chalk or bran bath)',
  },
  {
    kind: 'tannin',
    fibreClass: 'cellulose',
    low: 5,
    high: 15,
    applies: 'tannin (gall, sumac, tara, tannic acid) before alum on plant fibres',
  },
];

export type CheckChemical = { id: number; name: string; formula: string | null; role: string | null };
export type CheckIngredient = { kind: 'dyestuff' | 'chemical'; refId: number; name: string; percentOwf: number | null };
export type CheckStep = { position: number; operation: string; ingredients: CheckIngredient[] };

const ALKALI_FIXERS = new Set(['Na2CO3', 'CaCO3']);
const compact = (f: string | null) => (f ?? '').replace(/\s+/g, '');

/** Which kind of mordant a reference chemical is, from its formula and role; null for anything else. */
export function mordantKind(c: CheckChemical): MordantKind | null {
  if (c.role === 'tannin') return 'tannin';
  const f = compact(c.formula);
  if (!/Al(?![a-z])/.test(f)) return null;
  if (f.startsWith('KAl(SO4)2')) return 'potash-alum';
  if (/SO4/.test(f)) return 'aluminium-sulfate';
  if (/CH3COO/.test(f)) return 'aluminium-acetate';
  return null;
}

export type MordantCheck = {
  stepPosition: number;
  refId: number;
  name: string;
  mordant: MordantKind;
  percentOwf: number | null;
  range: { low: number; high: number; applies: string } | null;
  /** Where the amount sits against the range. */
  verdict: 'below' | 'within' | 'above' | 'no-range' | 'not-computed';
  /** Aluminium put on the fibre, g Al per kg of fibre (the chemical's Al mass fraction × % owf × 10). */
  gAlPerKg: number | null;
  /** The range in g Al per kg of fibre, for comparing alum with aluminium acetate. */
  rangeGAlPerKg: [number, number] | null;
  marking: string;
};

export type MordantWarning = {
  code: 'cellulose-alum-without-fixing';
  stepPosition: number;
  message: string;
  marking: string;
};

export type MordantChecks = {
  fibre: string | null;
  fibreClass: FibreClass | null;
  mordant: MordantCheck[];
  warnings: MordantWarning[];
};

/** Grams of Al per kg of fibre at P % owf of a chemical: P × 10 g/kg × Al fraction. */
export const gAlPerKgFibre = (percentOwf: number, formula: string) =>
  percentOwf * 10 * metalMassFraction(formula, 'Al');

/**
 * The checks for one recipe. `dyestuffClasses` names the dye class of each dyestuff (a dyestuff of class
 * "tannin", such as oak gall, is a tannin step). Print pastes are left out: a % owf means little there.
 */
export function mordantChecks(input: {
  fibre: string | null;
  steps: readonly CheckStep[];
  chemicals: ReadonlyMap<number, CheckChemical>;
  dyestuffClasses?: ReadonlyMap<number, string | null>;
}): MordantChecks {
  const f = matchFibre(input.fibre);
  const fibreClass = f?.class ?? null;
  const mordant: MordantCheck[] = [];
  // A tannin step anywhere counts (tannin before alum, or tannin–alum–tannin); soda ash or chalk counts
  // only in the alum step or after it, and never in a scour (soda ash there cleans, it does not fix).
  let tannin = false;
  let alkali = false;
  let alumSeen = false;
  for (const step of input.steps) {
    if (step.operation === 'tannin') tannin = true;
    const stepChems = step.ingredients
      .filter((i) => i.kind === 'chemical')
      .map((i) => input.chemicals.get(i.refId))
      .filter((c): c is CheckChemical => Boolean(c));
    if (
      stepChems.some((c) => {
        const k = mordantKind(c);
        return k === 'potash-alum' || k === 'aluminium-sulfate';
      })
    )
      alumSeen = true;
    if (alumSeen && step.operation !== 'scour' && stepChems.some((c) => ALKALI_FIXERS.has(compact(c.formula))))
      alkali = true;
    for (const ing of step.ingredients) {
      if (ing.kind === 'dyestuff') {
        if (input.dyestuffClasses?.get(ing.refId) === 'tannin') tannin = true;
        continue;
      }
      const c = input.chemicals.get(ing.refId);
      if (!c) continue;
      const kind = mordantKind(c);
      if (!kind) continue;
      if (kind === 'tannin') tannin = true;
      if (step.operation === 'print-paste') continue;
      const r = fibreClass
        ? (MORDANT_RANGES.find((x) => x.kind === kind && x.fibreClass === fibreClass) ?? null)
        : null;
      const p = ing.percentOwf;
      const withAl = kind !== 'tannin' && c.formula ? c.formula : null;
      mordant.push({
        stepPosition: step.position,
        refId: ing.refId,
        name: c.name,
        mordant: kind,
        percentOwf: p,
        range: r ? { low: r.low, high: r.high, applies: r.applies } : null,
        verdict: p == null ? 'not-computed' : !r ? 'no-range' : p < r.low ? 'below' : p > r.high ? 'above' : 'within',
        gAlPerKg: withAl && p != null ? gAlPerKgFibre(p, withAl) : null,
        rangeGAlPerKg: withAl && r ? [gAlPerKgFibre(r.low, withAl), gAlPerKgFibre(r.high, withAl)] : null,
        marking: MORDANT_RANGE_MARKING,
      });
    }
  }
  const warnings: MordantWarning[] = [];
  if (fibreClass === 'cellulose' && !tannin && !alkali) {
    const alum = mordant.find((m) => m.mordant === 'potash-alum' || m.mordant === 'aluminium-sulfate');
    if (alum) {
      warnings.push({
        code: 'cellulose-alum-without-fixing',
        stepPosition: alum.stepPosition,
        marking: MORDANT_RANGE_MARKING,
        message: `${f!.label[0].toUpperCase()}${f!.label.slice(1)} is a plant (cellulose) fibre: alum alone takes poorly and washes out. Add a tannin step (gall, sumac, tannic acid), or fix the alum with soda ash or chalk.`,
      });
    }
  }
  return { fibre: f?.label ?? null, fibreClass, mordant, warnings };
}

import {
  GROUP_FORMULAS,
  GROUP_LABELS,
  GROUP_ROLES,
  INCOMPATIBLE_PAIRS,
  type ChemicalGroup,
} from '../data/incompatible-pairs.ts';

// Dangerous pairs within one step (one bath or one paste): pure rules over the chemicals named in it.
// The pairs, their hazards and their sources are in shared/data/incompatible-pairs.ts.

const SUGARS = ['C6H12O6', 'C12H22O11'];

export type MixChemical = { id: number; name: string; formula: string | null; role: string | null };

const compact = (f: string | null) => (f ?? '').replace(/\s+/g, '').replace(/[•∙*.]/g, '·');

/** The groups a chemical belongs to, from its formula and its role in the reference list. */
export function chemicalGroups(c: MixChemical): ChemicalGroup[] {
  const f = compact(c.formula);
  const out = new Set<ChemicalGroup>();
  for (const [g, formulas] of Object.entries(GROUP_FORMULAS) as Array<[ChemicalGroup, readonly string[]]>) {
    if (f && formulas.map(compact).includes(f)) out.add(g);
  }
  const byRole = c.role ? GROUP_ROLES[c.role] : undefined;
  // A sugar reduces an indigo vat slowly and gives off nothing with acid: the reducer pairs are about sulfur reducers.
  if (byRole && !(byRole === 'reducer' && SUGARS.includes(f))) out.add(byRole);
  // Any arsenic compound (As not followed by a lower-case letter, so not "Ast…").
  if (/As(?![a-z])/.test(f) || /arsen/i.test(c.name)) out.add('arsenic');
  if (/hypochlorite/i.test(c.name)) {
    out.add('hypochlorite');
    out.add('oxidiser');
  }
  return [...out];
}

export type MixWarning = {
  code: string;
  stepPosition: number;
  /** The chemicals on each side of the pair (one side is "water" for quicklime: every bath has it). */
  chemicals: Array<{ id: number; name: string }>;
  message: string;
  hazard: string;
  source: string;
};

/** Every dangerous pair in one step, once per pair of groups. */
export function incompatibleInStep(stepPosition: number, chemicals: readonly MixChemical[]): MixWarning[] {
  const grouped = chemicals.map((c) => ({ c, groups: new Set(chemicalGroups(c)) }));
  const inGroup = (g: ChemicalGroup) => (g === 'water' ? [] : grouped.filter((x) => x.groups.has(g)).map((x) => x.c));
  const out: MixWarning[] = [];
  for (const p of INCOMPATIBLE_PAIRS) {
    const as = inGroup(p.a);
    const bs = inGroup(p.b);
    if (!as.length || (p.b !== 'water' && !bs.length)) continue;
    // One chemical in both groups (e.g. a hypochlorite that is also an oxidiser) is not a pair with itself.
    if (p.b !== 'water' && as.every((a) => bs.length === 1 && bs[0].id === a.id)) continue;
    const names = (xs: MixChemical[]) => [...new Set(xs.map((x) => x.name))].join(', ');
    const with_ = p.b === 'water' ? 'water' : names(bs);
    out.push({
      code: p.code,
      stepPosition,
      chemicals: [...new Map([...as, ...bs].map((x) => [x.id, { id: x.id, name: x.name }])).values()],
      message:
        p.b === 'water'
          ? `${names(as)}: ${p.hazard}`
          : `Do not combine ${names(as)} (${GROUP_LABELS[p.a]}) with ${with_} (${GROUP_LABELS[p.b]}). ${p.hazard}`,
      hazard: p.hazard,
      source: p.source,
    });
  }
  return out;
}

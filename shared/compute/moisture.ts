import { FIBRES, MOISTURE_REGAIN_SOURCE, type FibreEntry } from '../data/moisture-regain.ts';

// Air-dry versus oven-dry fibre mass, so that "% owf" means the same in every trial: recipe
// quantities are computed on the air-dry (commercial) mass; an oven-dry mass is brought to it with
// the fibre's commercial regain (ASTM D1909, values recalled from memory: shared/data/moisture-regain.ts).

export const DRY_MASS_BASES = ['air-dry', 'oven-dry'] as const;
export type DryMassBasis = (typeof DRY_MASS_BASES)[number];

/**
 * The fibre named in a free-text field ("wool flannel", "Linen, bleached"). Null when no known fibre
 * is named, or when two fibres of different kinds or regains are (a blend has no single regain).
 */
export function matchFibre(text: string | null | undefined): FibreEntry | null {
  if (!text) return null;
  const words = text
    .toLowerCase()
    .normalize('NFKD')
    .split(/[^a-z]+/)
    .filter(Boolean);
  const found = FIBRES.filter((f) => f.words.some((w) => words.includes(w)));
  if (!found.length) return null;
  const first = found[0];
  return found.every((f) => f.class === first.class && f.regainPct === first.regainPct) ? first : null;
}

/** Commercial (air-dry) mass from an oven-dry mass: m × (1 + R/100). */
export const airDryFromOvenDry = (ovenDryG: number, regainPct: number) => ovenDryG * (1 + regainPct / 100);
/** Oven-dry mass from a commercial (air-dry) mass: m ÷ (1 + R/100). */
export const ovenDryFromAirDry = (airDryG: number, regainPct: number) => airDryG / (1 + regainPct / 100);

export type RecipeMass = {
  enteredG: number;
  basis: DryMassBasis;
  /** The mass every % owf and liquor ratio of the recipe is worked on: air-dry (commercial). */
  recipeMassG: number;
  /** The other figure: oven-dry when air-dry was entered, air-dry when oven-dry was. Null without a regain. */
  otherG: number | null;
  fibre: string | null;
  regainPct: number | null;
  regainNote: string | null;
  /** Why the entered mass is used as it stands although it was oven-dry. */
  problem: string | null;
  source: string;
};

export function recipeMass(
  enteredG: number,
  basis: DryMassBasis | null | undefined,
  fibreText: string | null | undefined,
): RecipeMass {
  const b: DryMassBasis = basis === 'oven-dry' ? 'oven-dry' : 'air-dry';
  const f = matchFibre(fibreText);
  const regainPct = f?.regainPct ?? null;
  const base = {
    enteredG,
    basis: b,
    fibre: f?.label ?? null,
    regainPct,
    regainNote: f?.note ?? null,
    source: MOISTURE_REGAIN_SOURCE,
  };
  if (regainPct == null) {
    return {
      ...base,
      recipeMassG: enteredG,
      otherG: null,
      problem:
        b === 'oven-dry'
          ? 'No commercial regain is recorded for this fibre: the recipe is worked on the oven-dry mass as entered.'
          : null,
    };
  }
  return b === 'oven-dry'
    ? {
        ...base,
        recipeMassG: airDryFromOvenDry(enteredG, regainPct),
        otherG: airDryFromOvenDry(enteredG, regainPct),
        problem: null,
      }
    : { ...base, recipeMassG: enteredG, otherG: ovenDryFromAirDry(enteredG, regainPct), problem: null };
}

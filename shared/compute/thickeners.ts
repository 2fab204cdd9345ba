/**
 * Print-paste thickeners by kind, each with its usual loading in grams per litre of paste.
 * A weak gum such as gum arabic or British gum is used far thicker than guar or alginate.
 * The ranges are rules of thumb, not specifications: the grade in hand, the tool (brush, block)
 * and the cloth decide; check against the supplier's data.
 *
 * Where the figure is given in % w/w it is read as g per 100 g of paste and taken as ×10 g/L,
 * a paste being close to the density of water (about 1 kg/L).
 */

export type ThickenerRange = {
  /** Kind key, stable for tests and the API. */
  kind: string;
  label: string;
  min: number;
  max: number;
  source: string;
};

const DYE_FACTS =
  'common practice, no published source (tests/reference/dye-facts.json, printing thickener, % w/w × 10)';
const MEMORY = 'common practice, recalled from memory';

/** In the order they are matched: the more specific names first (British gum is a roasted starch). */
export const THICKENER_RANGES: readonly (ThickenerRange & { match: RegExp })[] = [
  { kind: 'guar', label: 'guar gum', min: 20, max: 50, source: DYE_FACTS, match: /\bguar\b/i },
  { kind: 'alginate', label: 'sodium alginate', min: 20, max: 40, source: DYE_FACTS, match: /alginate/i },
  {
    kind: 'gum-arabic',
    label: 'gum arabic',
    min: 200,
    max: 500,
    source: DYE_FACTS,
    match: /\b(gum arabic|gum acacia|acacia gum|arabic gum)\b/i,
  },
  { kind: 'tragacanth', label: 'gum tragacanth', min: 30, max: 80, source: MEMORY, match: /tragacanth/i },
  {
    kind: 'british-gum',
    label: 'British gum (dextrin)',
    min: 250,
    max: 600,
    source: MEMORY,
    match: /british gum|dextrin/i,
  },
  { kind: 'starch', label: 'starch (wheat)', min: 80, max: 150, source: MEMORY, match: /starch|flour/i },
];

/** The usual range for a thickener named like this, or null for one the app has no range for. */
export function thickenerRange(name: string): ThickenerRange | null {
  const hit = THICKENER_RANGES.find((t) => t.match.test(name));
  if (!hit) return null;
  const { match: _match, ...range } = hit;
  return range;
}

/** Is this loading outside the thickener's usual range? null when there is no range for it. */
export function outsideUsualRange(name: string, gPerL: number): boolean | null {
  const r = thickenerRange(name);
  return r ? gPerL < r.min || gPerL > r.max : null;
}

import { GHS_PICTOGRAMS, type GhsCode } from './ghs.ts';

/**
 * GHS pictograms from H statements, following the GHS hazard-class to pictogram assignments
 * (UN GHS, Annex 1; written from memory, to be checked against the current revision). Used only
 * for the pictograms on jar labels; the full caution is on the chemical's reference page and the
 * supplier's SDS.
 */
const RULES: Array<[RegExp, GhsCode]> = [
  [/^H(20[0-5]|240|241)/, 'GHS01'],
  [/^H(22[0-8]|24[12]|25[0-2]|26[01])/, 'GHS02'],
  [/^H27[0-2]/, 'GHS03'],
  [/^H28[01]/, 'GHS04'],
  [/^H(290|314|318)/, 'GHS05'],
  [/^H(300|301|310|311|330|331)/, 'GHS06'],
  [/^H(302|312|315|317|319|332|335|336)/, 'GHS07'],
  // H362 (effects on or via lactation) has no pictogram of its own (UN GHS, Annex 1, reproductive toxicity,
  // additional category; recalled from memory): a label shows GHS08 only for the other statements.
  [/^H(334|340|341|350|351|360|361|370|371|372|373|304)/, 'GHS08'],
  [/^H(400|410|411)/, 'GHS09'],
];

/** The pictograms the H statements call for, in GHS code order (H400 and H410 both call for GHS09, so the label rule of shared/compute/hazard-label.ts changes none). */
export function pictogramCodes(hStatements: string[]): GhsCode[] {
  const out = new Set<GhsCode>();
  for (const h of hStatements)
    for (const code of h.match(/H\d{3}/g) ?? []) for (const [re, ghs] of RULES) if (re.test(code)) out.add(ghs);
  // GHS precedence: no exclamation mark where skull and crossbones or corrosion already appears.
  if (out.has('GHS06') || out.has('GHS05')) out.delete('GHS07');
  return [...out].sort();
}

export const pictogramWords = (hStatements: string[]) => pictogramCodes(hStatements).map((c) => GHS_PICTOGRAMS[c]);

export type Hazard = { name: string; signalWord: 'Danger' | 'Warning' | null; hStatements: string[] };

/** The strongest signal word among the chemicals (Danger outranks Warning). */
export const strongestSignal = (hs: Hazard[]) =>
  hs.some((h) => h.signalWord === 'Danger') ? 'Danger' : hs.some((h) => h.signalWord === 'Warning') ? 'Warning' : null;

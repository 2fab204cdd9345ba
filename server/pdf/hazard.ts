/**
 * GHS pictogram words from H statements, following the GHS hazard-class to
 * pictogram assignments (UN GHS, Annex 1; written from memory, to be checked
 * against the current revision). Used only for the short words on jar labels;
 * the full caution is on the chemical's reference page and the supplier's SDS.
 */
const RULES: Array<[RegExp, string]> = [
  [/^H2(0[0-5]|2[0-8]|4[0-2]|5[0-2]|6[01])/, 'flame'],
  [/^H27[0-2]/, 'flame over circle'],
  [/^H28[01]/, 'gas cylinder'],
  [/^H(290|314|318)/, 'corrosion'],
  [/^H(300|301|310|311|330|331)/, 'skull and crossbones'],
  [/^H(302|312|315|317|319|332|335|336)/, 'exclamation mark'],
  [/^H(334|340|341|350|351|360|361|362|370|371|372|373|304)/, 'health hazard'],
  [/^H(400|410|411)/, 'environment'],
];

export function pictogramWords(hStatements: string[]): string[] {
  const out = new Set<string>();
  for (const h of hStatements) for (const code of h.match(/H\d{3}/g) ?? []) for (const [re, word] of RULES) if (re.test(code)) out.add(word);
  // GHS precedence: no exclamation mark where skull and crossbones or corrosion already appears.
  if (out.has('skull and crossbones') || out.has('corrosion')) out.delete('exclamation mark');
  return [...out];
}

export type Hazard = { name: string; signalWord: 'Danger' | 'Warning' | null; hStatements: string[] };

/** The strongest signal word among the chemicals (Danger outranks Warning). */
export const strongestSignal = (hs: Hazard[]) => (hs.some((h) => h.signalWord === 'Danger') ? 'Danger' : hs.some((h) => h.signalWord === 'Warning') ? 'Warning' : null);

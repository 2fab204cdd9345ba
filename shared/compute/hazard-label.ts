/**
 * How a chemical's H statements appear on a label.
 *
 * Precedence rule: where H410 ("Very toxic to aquatic life with long lasting effects") applies, H400
 * ("Very toxic to aquatic life") is not shown beside it; the label carries H410 alone. Source: Regulation
 * (EC) No 1272/2008 (CLP), Article 27 (hazard statements: no evident duplication or redundancy on the label),
 * as applied in Annex VI Table 3, whose labelling column lists H410 without H400 for substances classified
 * Aquatic Acute 1 and Aquatic Chronic 1 — recalled from memory; check the current consolidated text and the
 * ECHA Guidance on labelling and packaging. The classification itself keeps both statements.
 */
export const LABEL_PRECEDENCE_SOURCE =
  'CLP (Regulation (EC) No 1272/2008) Article 27 and Annex VI Table 3 labelling: H400 is not shown where H410 applies (recalled from memory)';

const codeOf = (h: string) => /^\s*(EUH\d{3}|H\d{3}[A-Za-z]*)/.exec(h)?.[1] ?? null;

/** The H statements as a label shows them: the classification's statements with H400 left off when H410 is present. */
export function labelStatements(hStatements: readonly string[]): string[] {
  const codes = new Set(hStatements.map(codeOf));
  return hStatements.filter((h) => !(codeOf(h) === 'H400' && codes.has('H410')));
}

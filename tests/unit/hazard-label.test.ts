import { describe, expect, it } from 'vitest';
import { labelStatements } from '../../shared/compute/hazard-label.ts';

// Source: Regulation (EC) No 1272/2008 (CLP), Article 27 (no evident duplication or redundancy on the label), as
// applied in Annex VI Table 3, whose labelling column lists H410 without H400 for Aquatic Acute 1 + Aquatic
// Chronic 1 (e.g. lead di(acetate), copper sulphate, potassium dichromate) — recalled from memory.
describe('label precedence: H410 rather than H400 + H410', () => {
  it('leaves H400 off where H410 applies, keeping every other statement in order', () => {
    expect(
      labelStatements([
        'H360Df May damage the unborn child.',
        'H373 …',
        'H400 Very toxic to aquatic life.',
        'H410 Very toxic to aquatic life with long lasting effects.',
      ]),
    ).toEqual([
      'H360Df May damage the unborn child.',
      'H373 …',
      'H410 Very toxic to aquatic life with long lasting effects.',
    ]);
  });

  it('keeps H400 alone, or beside H411/H412/H413 (no H410)', () => {
    expect(labelStatements(['H400 Very toxic to aquatic life.'])).toEqual(['H400 Very toxic to aquatic life.']);
    expect(labelStatements(['H400', 'H411'])).toEqual(['H400', 'H411']);
  });

  it('reads bare codes and leaves other statements (EUH, combined codes) as they are', () => {
    expect(labelStatements(['H410', 'H400'])).toEqual(['H410']);
    expect(
      labelStatements([
        'H302+H332 Harmful if swallowed or if inhaled.',
        'EUH031 Contact with acids liberates toxic gas.',
      ]),
    ).toEqual(['H302+H332 Harmful if swallowed or if inhaled.', 'EUH031 Contact with acids liberates toxic gas.']);
    expect(labelStatements([])).toEqual([]);
  });
});

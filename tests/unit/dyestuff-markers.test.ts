import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { suggestFromFindings } from '../../shared/compute/dyestuff-markers.ts';
import { MARKER_COMPOUNDS } from '../../shared/data/marker-compounds.ts';

// Check values: tests/reference/marker-compounds.json (Colour Index principal colorants, recalled from memory).
const ref = JSON.parse(readFileSync(path.join(__dirname, '../reference/marker-compounds.json'), 'utf8')) as Array<{
  dyestuff: string;
  markers: string[];
}>;

describe('marker compounds', () => {
  it.each(ref.map((r) => [r.dyestuff, r.markers] as const))('%s has %j among its markers', (dye, markers) => {
    const entry = MARKER_COMPOUNDS.find((m) => m.dyestuff === dye);
    expect(entry?.markers).toEqual(expect.arrayContaining([...markers]));
    expect(entry?.source).toBeTruthy();
  });
  it('suggests a dyestuff from a confirmed or probable marker only', () => {
    expect(
      suggestFromFindings([
        { substance: 'Alizarin', confidence: 'probable' },
        { substance: 'luteolin', confidence: 'possible' },
        { substance: 'carminic acid', confidence: 'not-found' },
      ]),
    ).toEqual([{ name: 'madder', kind: 'dyestuff', markers: ['alizarin'], confidence: 'probable' }]);
  });
  it('indigotin suggests indigo and woad (the same colorant); Fe suggests iron', () => {
    const s = suggestFromFindings([
      { substance: 'indigotin', confidence: 'confirmed' },
      { substance: 'Fe', confidence: 'confirmed' },
    ]);
    expect(s.map((x) => x.name)).toEqual(['indigo', 'woad', 'iron']);
  });
});

import { describe, expect, it } from 'vitest';
import ghs from '../reference/ghs.json' with { type: 'json' };
import seed from '../../server/seed/data/chemicals.json' with { type: 'json' };

// Check values: tests/reference/ghs.json (EU CLP Regulation (EC) No 1272/2008, Annex VI Table 3 entries and typical
// supplier classifications, all recalled from memory: to be verified against the current Annex VI and the SDS).
type SeedRow = {
  name: string;
  hStatements: string[];
  signalWord: string | null;
  hazardSource: string;
  hazardBasis?: string;
  caution: string;
};
const rows = seed as SeedRow[];
const byName = (name: string) => rows.find((r) => r.name === name)!;
const codes = (hs: string[]) => hs.map((h) => h.split(' ')[0]);

// ghs.json chemical → seed row.
const SEED_NAME: Record<string, string> = {
  'potassium aluminium sulfate dodecahydrate (potash alum)': 'potash alum',
  'aluminium sulfate, anhydrous': 'aluminium sulfate',
  'aluminium sulfate octadecahydrate (~18-hydrate)': 'aluminium sulfate octadecahydrate',
  'aluminium acetate, basic (aluminium hydroxide diacetate)': 'aluminium acetate (basic)',
  'iron(II) sulfate heptahydrate (ferrous sulfate)': 'iron(II) sulfate (copperas)',
  'iron(II) acetate': 'iron(II) acetate',
  'lead(II) acetate trihydrate (sugar of lead)': 'lead(II) acetate (sugar of lead)',
  'potassium dichromate': 'potassium dichromate',
  'copper(II) sulfate pentahydrate (blue vitriol)': 'copper(II) sulfate',
  'tin(II) chloride dihydrate (stannous chloride)': 'tin(II) chloride',
  'calcium hydroxide (slaked lime)': 'calcium hydroxide (slaked lime)',
  'calcium carbonate (chalk)': 'calcium carbonate (chalk)',
  'sodium carbonate, anhydrous (soda ash)': 'sodium carbonate (soda ash)',
  'oxalic acid dihydrate': 'oxalic acid',
  'tannic acid': 'tannic acid',
  'sodium hydroxide (caustic soda)': 'sodium hydroxide (caustic soda)',
  'sodium dithionite (hydrosulfite)': 'sodium dithionite (hydrosulfite)',
};

describe('hazard provenance of the seeded chemicals', () => {
  it('names a basis and a source for every chemical, and only these bases', () => {
    for (const r of rows.filter((x) => x.hazardBasis !== undefined)) {
      expect(['harmonised', 'supplier', 'memory'], r.name).toContain(r.hazardBasis);
      expect(r.hazardSource.length, r.name).toBeGreaterThan(0);
      expect(r.hazardSource.length, r.name).toBeLessThanOrEqual(255);
    }
  });

  it.each(ghs.map((g) => [g.chemical, g] as const))(
    '%s: basis and H statements agree with tests/reference/ghs.json',
    (_name, g) => {
      const row = byName(SEED_NAME[g.chemical]);
      expect(row, g.chemical).toBeDefined();
      const harmonised = g.classification_status.startsWith('harmonised');
      // Marked 'harmonised' only where ghs.json records an Annex VI entry; its index number is named in the source.
      expect(row.hazardBasis).toBe(harmonised ? 'harmonised' : 'memory');
      if (harmonised && 'annex_vi' in g && g.annex_vi) {
        const annex = g.annex_vi as { index_no: string; h_codes: Array<{ code: string }>; signal_word: string };
        expect(row.hazardSource).toContain(`Annex VI index ${annex.index_no}`);
        // Every harmonised H statement is shown (suppliers may add more, e.g. H290 on caustic soda).
        expect(codes(row.hStatements)).toEqual(expect.arrayContaining(annex.h_codes.map((h) => h.code)));
        expect(row.signalWord).toBe(annex.signal_word);
      }
    },
  );

  it('lead(II) acetate carries its reproductive and lactation statements (Annex VI 082-005-00-8 with Lact. H362, as recalled)', () => {
    expect(codes(byName('lead(II) acetate (sugar of lead)').hStatements)).toEqual([
      'H360Df',
      'H362',
      'H373',
      'H400',
      'H410',
    ]);
  });

  it('aluminium acetate warns that some grades are stabilised with boric acid (Annex VI: Repr. 1B H360FD, as recalled)', () => {
    const row = byName('aluminium acetate (basic)');
    expect(row.caution).toMatch(/boric acid/);
    expect(row.hazardSource).toMatch(/boric acid/);
  });
});

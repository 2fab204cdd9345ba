import { describe, expect, it } from 'vitest';
import { chemicalGroups, incompatibleInStep, type MixChemical } from '../../shared/compute/incompatible.ts';
import { INCOMPATIBLE_PAIRS } from '../../shared/data/incompatible-pairs.ts';

// Hazards recalled from memory (each pair names its source in shared/data/incompatible-pairs.ts);
// the formulas are those of the reference list (server/seed/data/chemicals.json).
const c = (id: number, name: string, formula: string | null, role: string): MixChemical => ({
  id,
  name,
  formula,
  role,
});
const dithionite = c(1, 'sodium dithionite (hydrosulfite)', 'Na2S2O4', 'reducer');
const tud = c(2, 'thiourea dioxide', 'CH4N2O2S', 'reducer');
const vinegar = c(3, 'acetic acid (vinegar, 5 %)', 'CH3COOH', 'acid');
const tartar = c(4, 'potassium hydrogen tartrate (cream of tartar)', 'KC4H5O6', 'assistant');
const dichromate = c(5, 'potassium dichromate', 'K2Cr2O7', 'mordant');
const arsenite = c(6, 'sodium arsenite', 'NaAsO2', 'assistant');
const quicklime = c(7, 'calcium oxide (quicklime)', 'CaO', 'alkali');
const alum = c(8, 'potash alum', 'KAl(SO4)2·12H2O', 'mordant');
const oxalic = c(9, 'oxalic acid', 'C2H2O4·2H2O', 'acid');
const bleach = c(10, 'sodium hypochlorite solution', 'NaClO', 'assistant');

describe('dangerous pairs in one step (recalled from memory; sources beside each pair)', () => {
  it('names a source for every pair', () => {
    for (const p of INCOMPATIBLE_PAIRS) expect(p.source.length, p.code).toBeGreaterThan(10);
  });

  it('groups chemicals by formula and role', () => {
    expect(chemicalGroups(dithionite)).toContain('reducer');
    expect(chemicalGroups(tartar)).toContain('acid');
    expect(chemicalGroups(dichromate)).toContain('oxidiser');
    expect(chemicalGroups(arsenite)).toContain('arsenic');
    expect(chemicalGroups(quicklime)).toEqual(expect.arrayContaining(['quicklime', 'strong-alkali']));
    expect(chemicalGroups(alum)).toEqual([]);
  });

  it('warns for a reducer with an acid: sulfur dioxide (EUH031)', () => {
    const w = incompatibleInStep(2, [dithionite, vinegar]);
    expect(w).toHaveLength(1);
    expect(w[0]).toMatchObject({ code: 'reducer-acid', stepPosition: 2 });
    expect(w[0].message).toMatch(/sulfur dioxide/);
    expect(w[0].source).toMatch(/EUH031/);
    expect(incompatibleInStep(1, [tud, tartar])[0].code).toBe('reducer-acid');
    expect(incompatibleInStep(1, [tud, oxalic])[0].code).toBe('reducer-acid');
  });

  it('warns for a reducer with an oxidiser, acid with arsenite, acid with hypochlorite, and quicklime in any bath', () => {
    expect(incompatibleInStep(1, [dithionite, dichromate]).map((w) => w.code)).toContain('reducer-oxidiser');
    expect(incompatibleInStep(1, [arsenite, vinegar]).map((w) => w.code)).toEqual(['arsenic-acid']);
    expect(incompatibleInStep(1, [bleach, vinegar]).map((w) => w.code)).toContain('hypochlorite-acid');
    const lime = incompatibleInStep(1, [quicklime]);
    expect(lime.map((w) => w.code)).toEqual(['quicklime-water']);
    expect(lime[0].message).toMatch(/heat/);
  });

  it('leaves safe steps alone', () => {
    expect(incompatibleInStep(1, [alum, tartar])).toEqual([]);
    expect(incompatibleInStep(1, [dithionite, c(11, 'calcium hydroxide (slaked lime)', 'Ca(OH)2', 'alkali')])).toEqual(
      [],
    );
    expect(incompatibleInStep(1, [bleach])).toEqual([]);
    // Fructose reduces a lime vat but is no sulfur reducer: vinegar with it gives off nothing.
    const fructose = c(12, 'fructose', 'C6H12O6', 'reducer');
    expect(chemicalGroups(fructose)).toEqual([]);
    expect(incompatibleInStep(1, [fructose, vinegar])).toEqual([]);
  });
});

import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { FIBRES } from '../../shared/data/moisture-regain.ts';
import { airDryFromOvenDry, matchFibre, ovenDryFromAirDry, recipeMass } from '../../shared/compute/moisture.ts';

// Check values: ASTM D1909 commercial moisture regains, recalled from memory (tests/reference/moisture-regain.json).
type Regain = { fibre: string; regain_percent: number; source: string; provenance: string };
const reference = JSON.parse(
  readFileSync(new URL('../reference/moisture-regain.json', import.meta.url), 'utf8'),
) as Regain[];

describe('commercial moisture regain (ASTM D1909, recalled from memory)', () => {
  it('holds the reference value for every fibre of the check file', () => {
    for (const r of reference) {
      const f = FIBRES.find((x) => x.label === r.fibre);
      expect(f, r.fibre).toBeDefined();
      expect(f!.regainPct).toBe(r.regain_percent);
      expect(r.source).toMatch(/ASTM D1909/);
    }
  });

  it('reads the fibre from free text and refuses a blend of different regains', () => {
    expect(matchFibre('Organic cotton calico')?.key).toBe('cotton');
    expect(matchFibre('wool flannel')?.regainPct).toBe(13.6);
    expect(matchFibre('Linen, bleached')?.class).toBe('cellulose');
    expect(matchFibre('silk habotai')?.class).toBe('protein');
    expect(matchFibre('cotton/linen union')).toBeNull();
    expect(matchFibre('polyester')).toBeNull();
    expect(matchFibre(null)).toBeNull();
  });

  it('works the recipe on the air-dry mass: oven-dry × (1 + regain)', () => {
    // 100 g oven-dry wool at 13.6 % regain is 113.6 g commercial.
    expect(airDryFromOvenDry(100, 13.6)).toBeCloseTo(113.6, 10);
    expect(ovenDryFromAirDry(113.6, 13.6)).toBeCloseTo(100, 10);
    const oven = recipeMass(100, 'oven-dry', 'wool');
    expect(oven).toMatchObject({
      basis: 'oven-dry',
      recipeMassG: expect.closeTo(113.6, 10),
      regainPct: 13.6,
      problem: null,
    });
    const air = recipeMass(108.5, 'air-dry', 'cotton');
    expect(air.recipeMassG).toBe(108.5);
    expect(air.otherG).toBeCloseTo(100, 10);
    expect(air.source).toMatch(/ASTM D1909/);
  });

  it('uses an oven-dry mass as entered, and says so, when the fibre has no recorded regain', () => {
    const m = recipeMass(50, 'oven-dry', 'mystery bast');
    expect(m.recipeMassG).toBe(50);
    expect(m.problem).toMatch(/No commercial regain/);
    expect(recipeMass(50, undefined, null)).toMatchObject({ basis: 'air-dry', recipeMassG: 50, problem: null });
  });
});

import { readFileSync } from 'node:fs';
import Color from 'colorjs.io';
import { describe, expect, it } from 'vitest';
import { deltaE00 } from '../../server/search/ciede2000.ts';
import { hexToLab, labToHex } from '../../shared/search/lab.ts';

type Pair = { pair: number; L1: number; a1: number; b1: number; L2: number; a2: number; b2: number; dE00: number };
const sharma: Pair[] = JSON.parse(readFileSync(new URL('../reference/ciede2000-sharma2005.json', import.meta.url), 'utf8'));
const srgb: Array<{ name: string; hex: string; L: number; a: number; b: number }> = JSON.parse(
  readFileSync(new URL('../reference/srgb-lab.json', import.meta.url), 'utf8'),
);

let seed = 7;
const rnd = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);

describe('hand-written CIEDE2000 used by the shade index', () => {
  it('matches every pair stored from Sharma, Wu & Dalal (2005) Table 1 to 4 decimals, both ways round', () => {
    expect(sharma.length).toBeGreaterThanOrEqual(17);
    for (const p of sharma) {
      const x = { L: p.L1, a: p.a1, b: p.b1 };
      const y = { L: p.L2, a: p.a2, b: p.b2 };
      expect(deltaE00(x, y), `pair ${p.pair}`).toBeCloseTo(p.dE00, 4);
      expect(deltaE00(y, x), `pair ${p.pair} reversed`).toBeCloseTo(p.dE00, 4);
    }
  });

  it('agrees with colorjs.io deltaE2000 (independent oracle) on 5 000 random pairs, including greys and near-identical colours', () => {
    let worst = 0;
    for (let i = 0; i < 5_000; i++) {
      const grey = i % 5 === 0;
      const x = { L: rnd() * 100, a: grey ? rnd() * 2 - 1 : rnd() * 200 - 100, b: grey ? rnd() * 2 - 1 : rnd() * 200 - 100 };
      const near = i % 3 === 0;
      const y = near ? { L: x.L + rnd() * 4 - 2, a: x.a + rnd() * 6 - 3, b: x.b + rnd() * 6 - 3 } : { L: rnd() * 100, a: rnd() * 200 - 100, b: rnd() * 200 - 100 };
      const oracle = new Color('lab', [x.L, x.a, x.b]).deltaE2000(new Color('lab', [y.L, y.a, y.b]));
      worst = Math.max(worst, Math.abs(deltaE00(x, y) - oracle));
    }
    expect(worst).toBeLessThan(1e-9);
  });
});

describe('hex ↔ CIELAB (D65) for the shade chooser', () => {
  it('reproduces tests/reference/srgb-lab.json (IEC 61966-2-1 + CIE 15) to 0.001', () => {
    const withHex = srgb.filter((r) => r.hex);
    expect(withHex.length).toBeGreaterThan(20);
    for (const r of withHex) {
      const lab = hexToLab(r.hex);
      expect(lab.L, r.name).toBeCloseTo(r.L, 3);
      expect(lab.a, r.name).toBeCloseTo(r.a, 3);
      expect(lab.b, r.name).toBeCloseTo(r.b, 3);
      expect(labToHex(lab)).toBe(r.hex.toLowerCase());
    }
  });
});

import { readFileSync } from 'node:fs';
import Color from 'colorjs.io';
import { describe, expect, it } from 'vitest';
import { deltaE00 } from '../../server/search/ciede2000.ts';
import { hexToLab, labToHex } from '../../shared/search/lab.ts';
import { deltaE00 as referenceDeltaE00 } from '../../shared/colour/difference.ts';
import { hexToLab as referenceHexToLab, labToHex as referenceLabToHex } from '../../shared/colour/convert.ts';

type Pair = { pair: number; L1: number; a1: number; b1: number; L2: number; a2: number; b2: number; dE00: number };
const sharma: Pair[] = JSON.parse(
  readFileSync(new URL('../reference/ciede2000-sharma2005.json', import.meta.url), 'utf8'),
);
const srgb: Array<{ name: string; hex: string; L: number; a: number; b: number }> = JSON.parse(
  readFileSync(new URL('../reference/srgb-lab.json', import.meta.url), 'utf8'),
);

let seed = 7;
const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;

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
      const x = {
        L: rnd() * 100,
        a: grey ? rnd() * 2 - 1 : rnd() * 200 - 100,
        b: grey ? rnd() * 2 - 1 : rnd() * 200 - 100,
      };
      const near = i % 3 === 0;
      const y = near
        ? { L: x.L + rnd() * 4 - 2, a: x.a + rnd() * 6 - 3, b: x.b + rnd() * 6 - 3 }
        : { L: rnd() * 100, a: rnd() * 200 - 100, b: rnd() * 200 - 100 };
      const oracle = new Color('lab', [x.L, x.a, x.b]).deltaE2000(new Color('lab', [y.L, y.a, y.b]));
      worst = Math.max(worst, Math.abs(deltaE00(x, y) - oracle));
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it('agrees with colorjs.io where the vector form of the hue terms has edge cases: opposite hues, greys, hue means near 0°/360°, 100° and 275°', () => {
    const pairs: Array<[number[], number[]]> = [
      [
        [50, 10, 0],
        [50, -10, 0],
      ], // exactly opposite on the a* axis
      [
        [50, 0, 12],
        [60, 0, -12],
      ], // exactly opposite on the b* axis
      [
        [40, 3, 4],
        [40, -6, -8],
      ], // opposite, different chroma
      [
        [50, 0, 0],
        [50, 20, -5],
      ], // one achromatic
      [
        [50, 0, 0],
        [52, 0, 0],
      ], // both achromatic
      [
        [50, 20, 0.5],
        [50, 20, -0.5],
      ], // hue mean at 0°/360°
      [
        [50, 20, 0.01],
        [50, 20, -0.03],
      ],
      [
        [50, -3.4, 19.7],
        [50, -3.6, 19.6],
      ], // hue mean near 100°
      [
        [50, 2, -25],
        [55, 1, -26],
      ], // near 275°, the rotation term at its strongest
    ];
    for (const [x, y] of pairs) {
      const a = { L: x[0], a: x[1], b: x[2] };
      const b = { L: y[0], a: y[1], b: y[2] };
      const oracle = new Color('lab', x as [number, number, number]).deltaE2000(
        new Color('lab', y as [number, number, number]),
      );
      expect(deltaE00(a, b), JSON.stringify([x, y])).toBeCloseTo(oracle, 9);
      expect(deltaE00(b, a), JSON.stringify([y, x])).toBeCloseTo(oracle, 9);
    }
    // Hues in the 90°–110° band on both sides of the 100° cut-off of the rotation term.
    let worst = 0;
    for (let i = 0; i < 2_000; i++) {
      const h1 = (90 + rnd() * 20) * (Math.PI / 180);
      const h2 = h1 + (rnd() - 0.5) * 0.2;
      const c1 = 5 + rnd() * 60;
      const c2 = c1 + rnd() * 6 - 3;
      const x: [number, number, number] = [rnd() * 100, c1 * Math.cos(h1), c1 * Math.sin(h1)];
      const y: [number, number, number] = [x[0] + rnd() * 4 - 2, c2 * Math.cos(h2), c2 * Math.sin(h2)];
      const oracle = new Color('lab', x).deltaE2000(new Color('lab', y));
      worst = Math.max(
        worst,
        Math.abs(deltaE00({ L: x[0], a: x[1], b: x[2] }, { L: y[0], a: y[1], b: y[2] }) - oracle),
      );
    }
    expect(worst).toBeLessThan(1e-9);
  });
});

describe('the fast kernel and the reference ΔE00 (shared/colour/difference.ts) are one formula', () => {
  it('agree to 1e-9 on the Sharma, Wu & Dalal (2005) pairs and on 5 000 random pairs', () => {
    for (const p of sharma) {
      const x = { L: p.L1, a: p.a1, b: p.b1 };
      const y = { L: p.L2, a: p.a2, b: p.b2 };
      expect(Math.abs(deltaE00(x, y) - referenceDeltaE00(x, y)), `pair ${p.pair}`).toBeLessThan(1e-9);
    }
    let worst = 0;
    for (let i = 0; i < 5_000; i++) {
      const x = { L: rnd() * 100, a: rnd() * 200 - 100, b: rnd() * 200 - 100 };
      const y =
        i % 2
          ? { L: x.L + rnd() * 4 - 2, a: x.a + rnd() * 6 - 3, b: x.b + rnd() * 6 - 3 }
          : { L: rnd() * 100, a: rnd() * 200 - 100, b: rnd() * 200 - 100 };
      worst = Math.max(worst, Math.abs(deltaE00(x, y) - referenceDeltaE00(x, y)));
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
      // The shade chooser's conversion is the reference one (shared/colour/convert.ts), not a copy.
      expect(lab).toEqual(referenceHexToLab(r.hex));
      expect(labToHex(lab)).toBe(referenceLabToHex(lab));
      expect(lab.L, r.name).toBeCloseTo(r.L, 3);
      expect(lab.a, r.name).toBeCloseTo(r.a, 3);
      expect(lab.b, r.name).toBeCloseTo(r.b, 3);
      expect(labToHex(lab)).toBe(r.hex.toLowerCase());
    }
  });
});

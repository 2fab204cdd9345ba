import Color from 'colorjs.io';
import { converter, differenceHueChroma } from 'culori';
import { describe, expect, it } from 'vitest';
import { deltaE76, differenceReport, labComponents, type Lab } from '../../shared/colour/index.ts';

// The signed CIELAB components ΔL*, ΔC*ab, ΔH*ab (CIE 15:2018 §8.2, sample minus standard) and the
// words built from them. Oracles: culori (an independent colour library) for chroma and |ΔH*ab|;
// colorjs.io's own LCh conversion for the direction of the hue-angle change; and the CIE 15 identity
// ΔE*ab² = ΔL*² + ΔC*ab² + ΔH*ab².

const lch = converter('lch65');
const fromLch = (L: number, C: number, h: number): Lab => ({
  L,
  a: C * Math.cos((h * Math.PI) / 180),
  b: C * Math.sin((h * Math.PI) / 180),
});
const asCulori = (x: Lab) => {
  const c = lch({ mode: 'lab65', l: x.L, a: x.a, b: x.b });
  return { c: c.c, h: c.h ?? 0 };
};
const hueOf = (x: Lab) => new Color('lab', [x.L, x.a, x.b]).to('lch').coords[2] as number;

// Standard hues around the circle, with the words a ±4° rotation must give. The hue families are
// the plain-words ones of shared/colour/hues.ts (red below 45° and from 352°, orange to 75°, yellow to
// 115°, green to 200°, blue to 310°, purple to 352°); the words follow the hue circle
// red → yellow → green → blue → purple → red.
const HUES: Array<[name: string, L: number, C: number, h: number, up: string, down: string]> = [
  ['madder red', 44, 55, 28, 'yellower', 'bluer'],
  ['red near 0°', 45, 40, 2, 'yellower', 'bluer'],
  ['red just below 360°', 40, 35, 355, 'yellower', 'bluer'],
  ['orange', 60, 50, 58, 'yellower', 'redder'],
  ['weld yellow', 82, 62, 94, 'greener', 'redder'],
  ['weld green', 52, 35, 133, 'bluer', 'yellower'],
  ['bottle green', 30, 22, 160, 'bluer', 'yellower'],
  ['teal', 50, 25, 195, 'bluer', 'yellower'],
  ['indigo blue', 30, 30, 274, 'redder', 'greener'],
  ['light blue', 65, 25, 240, 'redder', 'greener'],
  ['navy', 13, 80, 306, 'redder', 'greener'],
  ['madder purple', 34, 18, 333, 'redder', 'bluer'],
  ['lilac', 66, 20, 317, 'redder', 'bluer'],
];

describe('difference words follow the direction of the hue change', () => {
  it.each(HUES)('%s: +4° is %s… −4° is …', (_, L, C, h, up, down) => {
    const standard = fromLch(L, C, h);
    const plus = differenceReport(standard, fromLch(L, C, h + 4));
    const minus = differenceReport(standard, fromLch(L, C, h - 4));
    // A pure rotation changes neither lightness nor chroma.
    expect(plus.words).toEqual([up]);
    expect(minus.words).toEqual([down]);
    expect(plus.dH).toBeGreaterThan(0);
    expect(minus.dH).toBeLessThan(0);
    expect(Math.abs(plus.dL) + Math.abs(plus.dC)).toBeLessThan(1e-9);
    // |ΔH*ab| = 2C·sin(2°) for a rotation by 4° at constant chroma.
    expect(Math.abs(plus.dH)).toBeCloseTo(2 * C * Math.sin((2 * Math.PI) / 180), 9);
  });

  it('names the shifts that were wrong before: a purple turning red, a red turning yellow', () => {
    // A purple (h 333°) whose hue moved towards red (h 345°): redder, not "greener, yellower".
    const purple = fromLch(34, 18, 333);
    expect(differenceReport(purple, fromLch(34, 18, 345)).words).toEqual(['redder']);
    // A madder red (h 28°) whose hue moved towards yellow (h 38°): yellower, not "greener".
    const red = fromLch(44, 55, 28);
    expect(differenceReport(red, fromLch(44, 55, 38)).words).toEqual(['yellower']);
  });

  it('puts pure lightness and chroma changes into words, and nothing else', () => {
    const s = fromLch(50, 40, 30);
    expect(differenceReport(s, fromLch(53, 40, 30)).words).toEqual(['lighter']);
    expect(differenceReport(s, fromLch(47, 40, 30)).words).toEqual(['darker']);
    expect(differenceReport(s, fromLch(50, 44, 30)).words).toEqual(['brighter']);
    expect(differenceReport(s, fromLch(50, 36, 30)).words).toEqual(['duller']);
    expect(differenceReport(s, fromLch(48, 44, 34)).words).toEqual(['darker', 'brighter', 'yellower']);
    expect(differenceReport(s, s).words).toEqual([]);
  });

  it('leaves out a component that is small beside the others (under 10 % of ΔE*ab², common practice)', () => {
    const s = fromLch(50, 40, 30);
    // ΔL* = −1 beside ΔC* = +8: 1/65 of ΔE*ab².
    expect(differenceReport(s, fromLch(49, 48, 30)).words).toEqual(['brighter']);
    // A tiny difference in every component says nothing.
    expect(differenceReport(s, fromLch(50.1, 40.1, 30.1)).words).toEqual([]);
  });

  it('a neutral standard has no hue to turn: the difference is chroma', () => {
    const grey = { L: 50, a: 0, b: 0 };
    const r = differenceReport(grey, { L: 50, a: 3, b: 4 });
    expect(r.dH).toBe(0);
    expect(r.dC).toBeCloseTo(5, 12);
    expect(r.words).toEqual(['brighter']);
  });
});

describe('ΔL*, ΔC*ab, ΔH*ab against independent computations', () => {
  // Deterministic pseudo-random pairs spread over the gamut, small and large differences, hue angles across 0°/360°.
  let seed = 12345;
  const rand = () => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
  const pairs: Array<[Lab, Lab]> = [];
  for (let i = 0; i < 400; i++) {
    const s = fromLch(10 + 85 * rand(), 1 + 80 * rand(), 360 * rand());
    const spread = i % 2 ? 3 : 40;
    pairs.push([
      s,
      { L: s.L + spread * (rand() - 0.5), a: s.a + spread * (rand() - 0.5), b: s.b + spread * (rand() - 0.5) },
    ]);
  }

  it('ΔC*ab equals the difference of culori chromas, |ΔH*ab| equals culori differenceHueChroma', () => {
    const dHue = differenceHueChroma;
    for (const [s, t] of pairs) {
      const c = labComponents(s, t);
      const cs = asCulori(s),
        ct = asCulori(t);
      expect(c.dL).toBeCloseTo(t.L - s.L, 12);
      expect(c.dC).toBeCloseTo(ct.c - cs.c, 9);
      // culori's sign depends on how the angles are written, so only the magnitude is compared.
      expect(Math.abs(c.dH)).toBeCloseTo(Math.abs(dHue(cs, ct)), 9);
    }
  });

  it('the components add up to ΔE*ab in quadrature (CIE 15)', () => {
    for (const [s, t] of pairs) {
      const c = labComponents(s, t);
      expect(Math.hypot(c.dL, c.dC, c.dH)).toBeCloseTo(deltaE76(s, t), 9);
    }
  });

  it('ΔH*ab is positive exactly when colorjs.io sees the hue angle grow (the short way round)', () => {
    for (const [s, t] of pairs) {
      let dh = hueOf(t) - hueOf(s);
      if (dh > 180) dh -= 360;
      if (dh < -180) dh += 360;
      const { dH } = labComponents(s, t);
      if (Math.abs(dh) > 1e-6 && Math.abs(dh) < 179.999) expect(Math.sign(dH)).toBe(Math.sign(dh));
    }
  });
});

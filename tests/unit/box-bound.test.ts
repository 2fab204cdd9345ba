import Color from 'colorjs.io';
import { describe, expect, it } from 'vitest';
import { boundQuery, boxBounds } from '../../server/search/box-bound.ts';
import { deltaE00 } from '../../server/search/ciede2000.ts';

let seed = 4242;
const rnd = () => (seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648;
const gauss = () => Math.sqrt(-2 * Math.log(1 - rnd())) * Math.cos(2 * Math.PI * rnd());

// Queries biased to where CIEDE2000 is awkward: greys (G large, hue undefined), blues near h = 275° (the rotation
// term), the a*b* origin exactly, and colours on the opposite side of the origin from the box.
function query(i: number) {
  const k = i % 6;
  if (k === 0) return { L: rnd() * 100, a: gauss() * 2, b: gauss() * 2 };
  if (k === 1) {
    const h = ((255 + rnd() * 40) * Math.PI) / 180;
    const c = 5 + rnd() * 50;
    return { L: rnd() * 100, a: c * Math.cos(h), b: c * Math.sin(h) };
  }
  if (k === 2) return { L: rnd() * 100, a: 0, b: 0 };
  return { L: rnd() * 100, a: rnd() * 200 - 100, b: rnd() * 200 - 100 };
}

function box(q: { L: number; a: number; b: number }, i: number) {
  const size = [0.5, 1, 2, 2, 6, 25][i % 6];
  const k = i % 4;
  // Near the query, straddling the origin, mirrored through the origin, or anywhere.
  const c =
    k === 0
      ? { L: q.L + gauss() * 6, a: q.a + gauss() * 12, b: q.b + gauss() * 12 }
      : k === 1
        ? { L: q.L + gauss() * 6, a: gauss() * 3 - size / 2, b: gauss() * 3 - size / 2 }
        : k === 2
          ? { L: q.L + gauss() * 6, a: -q.a + gauss() * 3, b: -q.b + gauss() * 3 }
          : { L: rnd() * 100, a: rnd() * 200 - 100, b: rnd() * 200 - 100 };
  return {
    L0: c.L,
    L1: c.L + size * (0.2 + rnd()),
    a0: c.a,
    a1: c.a + size * (0.2 + rnd()),
    b0: c.b,
    b1: c.b + size * (0.2 + rnd()),
  };
}

describe('ΔE00 bounds over an L*a*b* box (box-bound.ts)', () => {
  it('hold for every sampled point (corners, edges, inside) of 60 000 boxes: lower ≤ ΔE00 ≤ upper', () => {
    const broken: unknown[] = [];
    let tightLower = 0;
    let counted = 0;
    for (let i = 0; i < 60_000; i++) {
      const q = query(i);
      const bx = box(q, i);
      const { lower, upper } = boxBounds(boundQuery(q.L, q.a, q.b), bx.L0, bx.L1, bx.a0, bx.a1, bx.b0, bx.b1);
      let min = Infinity;
      let max = 0;
      for (let k = 0; k < 30; k++) {
        // The 8 corners, then points on faces and edges, then anywhere inside.
        const t =
          k < 8
            ? [k & 1, (k >> 1) & 1, (k >> 2) & 1]
            : k < 20
              ? [rnd(), rnd() < 0.5 ? 0 : 1, rnd()]
              : [rnd(), rnd(), rnd()];
        const p = {
          L: bx.L0 + t[0] * (bx.L1 - bx.L0),
          a: bx.a0 + t[1] * (bx.a1 - bx.a0),
          b: bx.b0 + t[2] * (bx.b1 - bx.b0),
        };
        const d = deltaE00(q, p);
        min = Math.min(min, d);
        max = Math.max(max, d);
      }
      if (lower > min + 1e-12 || upper < max - 1e-12) broken.push({ q, bx, lower, upper, min, max });
      if (min > 1) {
        counted++;
        if (lower > 0.7 * min) tightLower++;
      }
    }
    expect(broken).toEqual([]);
    // The bounds have teeth: most boxes get a lower bound within 30 % of the true minimum.
    expect(tightLower / counted).toBeGreaterThan(0.6);
  });

  it('agree with colorjs.io (independent oracle) at the corners of unit cells around blue and grey queries', () => {
    for (let i = 0; i < 2_000; i++) {
      const q = query(i % 3 === 0 ? 1 : i % 3 === 1 ? 0 : 2);
      const L0 = Math.floor(q.L + gauss() * 4);
      const a0 = Math.floor(q.a + gauss() * 6);
      const b0 = Math.floor(q.b + gauss() * 6);
      const { lower, upper } = boxBounds(boundQuery(q.L, q.a, q.b), L0, L0 + 1, a0, a0 + 1, b0, b0 + 1);
      for (let k = 0; k < 8; k++) {
        const p: [number, number, number] = [L0 + (k & 1), a0 + ((k >> 1) & 1), b0 + ((k >> 2) & 1)];
        const d = new Color('lab', [q.L, q.a, q.b]).deltaE2000(new Color('lab', p));
        expect(d).toBeGreaterThanOrEqual(lower - 1e-9);
        expect(d).toBeLessThanOrEqual(upper + 1e-9);
      }
    }
  });
});

/**
 * hex ↔ CIELAB (D65, 2°) for the shade chooser and the shade API: IEC 61966-2-1
 * transfer function and primaries, CIE 15 CIELAB, white Xn,Yn,Zn = 0.950456, 1,
 * 1.089058. Kept here so search does not wait on other modules; pure, used by
 * client and server.
 */
export type Lab = { L: number; a: number; b: number };

const M = [
  [0.41239079926595934, 0.357584339383878, 0.1804807884018343],
  [0.21263900587151027, 0.715168678767756, 0.07219231536073371],
  [0.01933081871559182, 0.11919477979462598, 0.9505321522496607],
];
const MINV = [
  [3.2409699419045226, -1.537383177570094, -0.4986107602930034],
  [-0.9692436362808796, 1.8759675015077202, 0.04155505740717559],
  [0.05563007969699366, -0.20397695888897652, 1.0569715142428786],
];
const WHITE = [0.950456, 1, 1.089058];
const E = 216 / 24389;
const K = 24389 / 27;

const toLinear = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
const fromLinear = (c: number) => (c <= 0.0031308 ? 12.92 * c : 1.055 * c ** (1 / 2.4) - 0.055);
const f = (t: number) => (t > E ? Math.cbrt(t) : (K * t + 16) / 116);
const fInv = (t: number) => (t ** 3 > E ? t ** 3 : (116 * t - 16) / K);

export const HEX_RE = /^#?[0-9a-fA-F]{6}$/;

export function hexToLab(hex: string): Lab {
  const h = hex.replace('#', '');
  const rgb = [0, 2, 4].map((i) => toLinear(parseInt(h.slice(i, i + 2), 16) / 255));
  const [x, y, z] = M.map((row, i) => (row[0] * rgb[0] + row[1] * rgb[1] + row[2] * rgb[2]) / WHITE[i]);
  const fy = f(y);
  return { L: 116 * fy - 16, a: 500 * (f(x) - fy), b: 200 * (fy - f(z)) };
}

/** The nearest displayable sRGB colour (channels clipped). */
export function labToHex({ L, a, b }: Lab): string {
  const fy = (L + 16) / 116;
  const xyz = [fInv(fy + a / 500) * WHITE[0], (L > K * E ? fy ** 3 : L / K) * WHITE[1], fInv(fy - b / 200) * WHITE[2]];
  const out = MINV.map((row) => fromLinear(row[0] * xyz[0] + row[1] * xyz[1] + row[2] * xyz[2]));
  return `#${out.map((c) => Math.round(Math.min(1, Math.max(0, c)) * 255).toString(16).padStart(2, '0')).join('')}`;
}

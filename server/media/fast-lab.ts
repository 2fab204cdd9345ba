import { D65_WHITE, linearRgbToXyz, xyzToLinearRgb } from '../../shared/colour/index.ts';
import Color from 'colorjs.io';

// Palette extraction converts tens of thousands of colours per photo, too many for
// colorjs.io's object API. These tables and matrices are taken from colorjs.io once
// (so its definitions of sRGB and D65 hold), and tests/unit/palette.test.ts checks
// the fast path against the reference conversion (shared/colour/convert.ts, colorjs.io).

const STEPS = 4096;
let tables: {
  decode8: Float64Array;
  decode: Float64Array;
  encode: Float64Array;
  toXyz: number[][];
  fromXyz: number[][];
} | null = null;

function build() {
  const decode8 = new Float64Array(256);
  for (let i = 0; i < 256; i++) decode8[i] = new Color('srgb', [i / 255, 0, 0]).to('srgb-linear').coords[0] as number;
  const decode = new Float64Array(STEPS + 1);
  for (let i = 0; i <= STEPS; i++)
    decode[i] = new Color('srgb', [i / STEPS, 0, 0]).to('srgb-linear').coords[0] as number;
  const encode = new Float64Array(STEPS + 1);
  // Encoding is sampled on a square-root scale so dark values keep their precision.
  for (let i = 0; i <= STEPS; i++)
    encode[i] = new Color('srgb-linear', [(i / STEPS) ** 2, 0, 0]).to('srgb').coords[0] as number;
  const toXyz = [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ].map((e) => linearRgbToXyz(e as [number, number, number]));
  const fromXyz = [
    [1, 0, 0],
    [0, 1, 0],
    [0, 0, 1],
  ].map((e) => xyzToLinearRgb(e as [number, number, number]));
  // Columns of the conversion are the images of the unit vectors; transpose into rows.
  const rows = (cols: number[][]) => [0, 1, 2].map((i) => cols.map((c) => c[i]));
  tables = { decode8, decode, encode, toXyz: rows(toXyz), fromXyz: rows(fromXyz) };
  return tables;
}

const t = () => tables ?? build();

/** Linear light of an 8-bit sRGB value. */
export const decode8 = (v: number) => t().decode8[v];

/**
 * Linear light of an sRGB value on 0–255 (fractional allowed, e.g. a mean). Values outside 0–255
 * (colours outside sRGB, from a wide-gamut photo) follow the curve's extension: mirrored below 0,
 * the power law above 255, as colorjs.io extends sRGB.
 */
export function decode(v: number): number {
  if (v < 0) return -decode(-v);
  if (v > 255) return ((v / 255 + 0.055) / 1.055) ** 2.4;
  const x = (v / 255) * STEPS;
  const i = Math.min(STEPS - 1, Math.floor(x));
  const d = t().decode;
  return d[i] + (d[i + 1] - d[i]) * (x - i);
}

/** The sRGB value on 0–255 (fractional, unclipped) of a linear-light value: the inverse of decode(). */
export function encodeValue(lin: number): number {
  if (lin < 0) return -encodeValue(-lin);
  if (lin > 1) return 255 * (1.055 * lin ** (1 / 2.4) - 0.055);
  const x = Math.sqrt(lin) * STEPS;
  const i = Math.min(STEPS - 1, Math.floor(x));
  const e = t().encode;
  return (e[i] + (e[i + 1] - e[i]) * (x - i)) * 255;
}

/** 8-bit sRGB value of a linear-light value (clipped to 0–1). */
export function encode8(lin: number): number {
  const x = Math.sqrt(Math.min(1, Math.max(0, lin))) * STEPS;
  const i = Math.min(STEPS - 1, Math.floor(x));
  const e = t().encode;
  return Math.round((e[i] + (e[i + 1] - e[i]) * (x - i)) * 255);
}

export const rgbToXyzMatrix = () => t().toXyz;
export const xyzToRgbMatrix = () => t().fromXyz;

// CIE 15 constants for the XYZ → L*a*b* step.
const EPS = 216 / 24389;
const KAPPA = 24389 / 27;
const f = (v: number) => (v > EPS ? Math.cbrt(v) : (KAPPA * v + 16) / 116);

/** Linear sRGB (0–1) to CIELAB D65, written into out[o..o+2]. */
export function linearToLab(r: number, g: number, b: number, out: Float64Array | number[], o = 0) {
  const m = t().toXyz;
  const fx = f((m[0][0] * r + m[0][1] * g + m[0][2] * b) / D65_WHITE[0]);
  const fy = f((m[1][0] * r + m[1][1] * g + m[1][2] * b) / D65_WHITE[1]);
  const fz = f((m[2][0] * r + m[2][1] * g + m[2][2] * b) / D65_WHITE[2]);
  out[o] = 116 * fy - 16;
  out[o + 1] = 500 * (fx - fy);
  out[o + 2] = 200 * (fy - fz);
}

/** sRGB on 0–255 (fractional allowed) to CIELAB D65. */
export function srgbToLabFast(r: number, g: number, b: number): [number, number, number] {
  const out = [0, 0, 0];
  linearToLab(decode(r), decode(g), decode(b), out);
  return out as [number, number, number];
}

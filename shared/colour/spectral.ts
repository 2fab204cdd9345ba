// Reflectance spectrum → CIE XYZ → CIELAB under a chosen illuminant and standard observer.
//
// Tables: the CIE 1931 2° and 1964 10° colour-matching functions (1 nm, 360–830 nm) and the
// relative spectral power of D65, D50, A, FL2, FL11 and LED-B3 (5 nm), from CIE 015:2018 and
// its datasets, shipped in shared/data/cie/ (source in its README).
//
// Method, following ASTM E308 as the general-purpose colour-science library (0.4.x) implements
// it, so its figures are the check values (tests/reference/spectra-check.json):
// - the 5 nm illuminant is brought to 1 nm by linear interpolation and carried flat beyond its
//   ends (this reproduces the check values' whites to 1e-6; Sprague or cubic-spline interpolation
//   moves the whites of the spiky F11 and LED-B3 by up to 1e-3 and does not);
// - 1 and 5 nm data are summed directly against the tables at the data's own interval, the
//   reflectance carried flat beyond its measured ends (CIE 015:2018 §7.2.1);
// - 10 and 20 nm data use tristimulus weighting factors computed from the 1 nm tables by the
//   ASTM E2022 method (Lagrange interpolating coefficients, 3 points in the first and last
//   interval and 4 inside), the weights outside the measured range added to the end weights
//   (ASTM E308 §7.3, the practice its Tables 5 and 6 follow). No bandpass correction is made:
//   readings are taken as the instrument reports them.
// Normalisation: k makes Y of the perfect reflecting diffuser 100 (CIE 015:2018 §7.1).
import cmfsData from '../data/cie/cmfs.json' with { type: 'json' };
import illuminantData from '../data/cie/illuminants.json' with { type: 'json' };
import type { Lab } from './convert.ts';

import type { SpectralIlluminant, SpectralObserver } from './spectral-words.ts';
export * from './spectral-words.ts';

/** A reflectance spectrum as fractions 0–1 at startNm, startNm + intervalNm, …. */
export type Spectrum = { startNm: number; intervalNm: number; values: number[] };
export type XYZ = { X: number; Y: number; Z: number };

const TABLE_NAME: Record<SpectralIlluminant, keyof typeof illuminantData.illuminants> = {
  D65: 'D65',
  D50: 'D50',
  A: 'A',
  F2: 'FL2',
  F11: 'FL11',
  'LED-B3': 'LED-B3',
};

type Table = { startNm: number; intervalNm: number; values: number[] };
const CMF_START = 360;
const CMF_END = 830;

/** The spectrum's end wavelength. */
export const spectrumEndNm = (s: Spectrum) => s.startNm + s.intervalNm * (s.values.length - 1);

/** Values read as percentages when any exceeds 1.5 (no real reflectance above 150 % of the white). */
export function toFractions(values: number[], unit?: 'fraction' | 'percent'): number[] {
  const percent = unit ? unit === 'percent' : values.some((v) => v > 1.5);
  return percent ? values.map((v) => v / 100) : values;
}

/** Uniformly spaced data onto 1 nm steps by linear interpolation. */
function linearTo1nm(y: number[], interval: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < y.length - 1; i++)
    for (let j = 0; j < interval; j++) out.push(y[i] + ((y[i + 1] - y[i]) * j) / interval);
  out.push(y[y.length - 1]);
  return out;
}

/** A table at 1 nm over 360–830 nm: interpolated if coarser, carried flat beyond its ends. */
function onCmfRange(t: Table): number[] {
  const fine = t.intervalNm === 1 ? t.values : linearTo1nm(t.values, t.intervalNm);
  const end = t.startNm + fine.length - 1;
  const out: number[] = [];
  for (let w = CMF_START; w <= CMF_END; w++) {
    const i = Math.min(end, Math.max(t.startNm, w)) - t.startNm;
    out.push(fine[i]);
  }
  return out;
}

type Fine = { S: number[]; x: number[]; y: number[]; z: number[] };
const fineCache = new Map<string, Fine>();
function fineTables(illuminant: SpectralIlluminant, observer: SpectralObserver): Fine {
  const key = `${illuminant}/${observer}`;
  let f = fineCache.get(key);
  if (!f) {
    const o = cmfsData.observers[observer];
    f = { S: onCmfRange(illuminantData.illuminants[TABLE_NAME[illuminant]]), x: o.xbar, y: o.ybar, z: o.zbar };
    fineCache.set(key, f);
  }
  return f;
}

/** Lagrange basis of `n` points at nodes 0 … n−1, evaluated at r. */
function lagrange(r: number, n: number): number[] {
  return Array.from({ length: n }, (_, j) => {
    let p = 1;
    for (let i = 0; i < n; i++) if (i !== j) p *= (r - i) / (j - i);
    return p;
  });
}

/**
 * ASTM E2022 tristimulus weighting factors (unnormalised) at `interval` nm from the 1 nm
 * products S·x̄, S·ȳ, S·z̄ (index 0 = `first` nm), as colour-science's
 * tristimulus_weighting_factors_ASTME2022: each 1 nm product is shared among the nearest
 * coarse points by its Lagrange coefficients; a last incomplete interval goes to the last point.
 */
function e2022Weights(products: number[][], interval: number): number[][] {
  const wc = products.length;
  const ic = Math.floor((wc - 1) / interval) + 1;
  const W = Array.from({ length: ic }, (_, i) => [...products[i * interval]]);
  const rc = interval - 1;
  const boundary = Array.from({ length: rc }, (_, j) => lagrange((j + 1) / interval, 3));
  const inner = Array.from({ length: rc }, (_, j) => lagrange(1 + (j + 1) / interval, 4));
  const icm = ic - 1;
  const lastFull = (ic - 1) * interval; // index of the last coarse point
  for (let c = 0; c < 3; c++) {
    // First interval: 3-point coefficients on points 0, 1, 2.
    for (let j = 0; j < rc; j++) for (let k = 0; k < 3; k++) W[k][c] += boundary[j][k] * products[j + 1][c];
    // Last interval: the same, mirrored, on the last three points.
    const wlif = lastFull - interval + 1;
    for (let j = 0; j < rc; j++)
      for (let k = icm; k > icm - 3; k--) W[k][c] += boundary[rc - j - 1][icm - k] * products[j + wlif][c];
    // Inner intervals: 4-point coefficients.
    for (let j = 0; j < ic - 3; j++)
      for (let k = 0; k < rc; k++) {
        const wi = interval * (j + 1) + 1 + k;
        for (let m = 0; m < 4; m++) W[j + m][c] += inner[k][m] * products[wi][c];
      }
    // A last incomplete interval.
    for (let j = lastFull + 1; j < wc; j++) W[icm][c] += products[j][c];
  }
  return W;
}

type Weights = { startNm: number; intervalNm: number; W: number[][] };
const weightCache = new Map<string, Weights>();

/** Normalised weights (Σ W_Y = 1) at the spectrum's interval on a grid through its start. */
function weightsFor(illuminant: SpectralIlluminant, observer: SpectralObserver, startNm: number, intervalNm: number) {
  // Align the grid with the data: it starts at the first wavelength ≥ 360 nm on the data's grid.
  const gridStart = startNm - intervalNm * Math.floor((startNm - CMF_START) / intervalNm);
  const key = `${illuminant}/${observer}/${gridStart}/${intervalNm}`;
  let w = weightCache.get(key);
  if (!w) {
    const { S, x, y, z } = fineTables(illuminant, observer);
    const products = S.map((s, i) => [s * x[i], s * y[i], s * z[i]]);
    const skip = gridStart - CMF_START;
    let W: number[][];
    if (intervalNm <= 5) {
      // Direct summation at the data's interval (CIE 015:2018 §7.1; ASTM E308 §7.2 for 1 and 5 nm).
      W = [];
      for (let i = skip; i < products.length; i += intervalNm) W.push([...products[i]]);
      // At 5 nm the wavelengths below a grid that starts after 360 nm are carried by the first point.
      for (let i = 0; i < skip; i++) for (let c = 0; c < 3; c++) W[0][c] += products[i][c] / intervalNm;
    } else {
      W = e2022Weights(products.slice(skip), intervalNm);
      // The 1 nm products below the grid (under 380 nm, where the CMFs are all but zero) join the first weight.
      for (let i = 0; i < skip; i++) for (let c = 0; c < 3; c++) W[0][c] += products[i][c];
    }
    const k = 1 / W.reduce((s, r) => s + r[1], 0);
    w = { startNm: gridStart, intervalNm, W: W.map((r) => r.map((v) => v * k)) };
    weightCache.set(key, w);
  }
  return w;
}

/**
 * Tristimulus values of a reflectance spectrum (fractions 0–1) and of the perfect white under
 * the illuminant, scaled so the white's Y = 100. The weights outside the measured range are
 * added to the first and last measured wavelengths (ASTM E308 §7.3).
 */
export function spectrumToXyz(
  spectrum: Spectrum,
  illuminant: SpectralIlluminant,
  observer: SpectralObserver,
): { XYZ: XYZ; white: XYZ } {
  const { startNm, intervalNm, values } = spectrum;
  const { startNm: gridStart, W } = weightsFor(illuminant, observer, startNm, intervalNm);
  const first = (startNm - gridStart) / intervalNm;
  const last = first + values.length - 1;
  const sum = [0, 0, 0],
    white = [0, 0, 0];
  W.forEach((w, i) => {
    const r = values[Math.min(last, Math.max(first, i)) - first];
    for (let c = 0; c < 3; c++) {
      sum[c] += w[c] * r;
      white[c] += w[c];
    }
  });
  const xyz = (v: number[]): XYZ => ({ X: v[0] * 100, Y: v[1] * 100, Z: v[2] * 100 });
  return { XYZ: xyz(sum), white: xyz(white) };
}

/** CIE 1976 L*a*b* from XYZ and the reference white's XYZ (CIE 015:2018 §8.2.1, ε = 216/24389, κ = 24389/27). */
export function xyzToLabWith(XYZ: XYZ, white: XYZ): Lab {
  const f = (t: number) => (t > 216 / 24389 ? Math.cbrt(t) : ((24389 / 27) * t + 16) / 116);
  const fx = f(XYZ.X / white.X),
    fy = f(XYZ.Y / white.Y),
    fz = f(XYZ.Z / white.Z);
  return { L: 116 * fy - 16, a: 500 * (fx - fy), b: 200 * (fy - fz) };
}

/** L*a*b* of a reflectance spectrum under one illuminant and observer, the white being the perfect diffuser under it. */
export function spectrumToLab(spectrum: Spectrum, illuminant: SpectralIlluminant, observer: SpectralObserver) {
  const { XYZ, white } = spectrumToXyz(spectrum, illuminant, observer);
  return { XYZ, white, lab: xyzToLabWith(XYZ, white) };
}

/** The illuminant's white chromaticity x, y for the observer, summed at 5 nm (the illuminant tables' own interval). */
export function whiteChromaticity(illuminant: SpectralIlluminant, observer: SpectralObserver) {
  const { white } = spectrumToXyz({ startNm: 380, intervalNm: 5, values: Array(81).fill(1) }, illuminant, observer);
  const sum = white.X + white.Y + white.Z;
  return { x: white.X / sum, y: white.Y / sum };
}

/** The method in one line, for answers and screens. */
export const SPECTRAL_METHOD =
  'CIE 015:2018 tables; ASTM E308 (weights by the ASTM E2022 method for 10 and 20 nm data, direct summation for 1 and 5 nm)';

export const CIE_TABLES_SOURCE = `${cmfsData.source}; ${illuminantData.source}`;

// Single-constant Kubelka–Munk for dyed textiles, and recipe ladders interpolated in strength.
//
// Sources:
// - The Kubelka–Munk function of an opaque layer, K/S = (1 − R)² / 2R, and its inverse,
//   R = 1 + K/S − √((K/S)² + 2·K/S): Kubelka & Munk (1931), "Ein Beitrag zur Optik der Farbanstriche",
//   Z. techn. Physik 12, 593–601; in this form in E. Allen, "Colorant formulation and shading", ch. 7 of
//   Optical Radiation Measurements vol. 2 (Academic Press, 1980), eqs. 19–20. Checked against an independent
//   implementation on npm (spectral.js, tests/unit/kubelka-munk.test.ts).
// - Single-constant theory for dyed textiles: the fibre scatters, the dyes only absorb, so at each wavelength
//   K/S of the dyeing is the substrate's plus the sum of each dye's unit K/S times its concentration on the fibre,
//   i.e. K/S is linear in concentration (R. McDonald (ed.), Colour Physics for Industry, 2nd ed., SDC 1997,
//   chapter on recipe prediction; recalled from memory, not checked against the page). Dye uptake is not linear
//   in the amount put in the bath at high strengths (the fibre's sites fill), so between two rungs of a
//   ladder K/S is interpolated linearly, not fitted by one line through all rungs (common practice).
// - No Saunderson correction: readings are used as the instrument reports them (specular included or not as
//   measured), the same for every rung of a ladder, which is what interpolation needs.
import type { Lab } from '../colour/convert.ts';
import { deltaE00 } from '../colour/difference.ts';
import { spectrumToLab, type Spectrum, type SpectralIlluminant, type SpectralObserver } from '../colour/spectral.ts';

/** Reflectance floor: K/S grows without bound as R → 0 (a reading of 0 is below any instrument's noise). */
const R_MIN = 1e-4;

/** K/S of an opaque layer from its reflectance factor (0–1). */
export function ksFromR(R: number): number {
  const r = Math.min(1, Math.max(R_MIN, R));
  return (1 - r) ** 2 / (2 * r);
}

/** Reflectance factor (0–1) of an opaque layer from its K/S (≥ 0). */
export function rFromKs(ks: number): number {
  if (!(ks > 0)) return 1;
  return 1 + ks - Math.sqrt(ks * ks + 2 * ks);
}

/** Wavelength grid the rungs of a ladder share: their common range, at the coarsest of their steps. */
export function commonGrid(spectra: Spectrum[]): { startNm: number; intervalNm: number; n: number } | null {
  if (!spectra.length) return null;
  const start = Math.max(...spectra.map((s) => s.startNm));
  const end = Math.min(...spectra.map((s) => s.startNm + s.intervalNm * (s.values.length - 1)));
  const step = Math.max(...spectra.map((s) => s.intervalNm));
  if (end - start < step) return null;
  // The grid starts on the common start and keeps whole steps inside the common range.
  return { startNm: start, intervalNm: step, n: Math.floor((end - start) / step) + 1 };
}

/** A spectrum's value at any wavelength inside its range, by linear interpolation. */
export function reflectanceAt(s: Spectrum, nm: number): number {
  const x = (nm - s.startNm) / s.intervalNm;
  const i = Math.min(s.values.length - 2, Math.max(0, Math.floor(x)));
  const t = Math.min(1, Math.max(0, x - i));
  return s.values[i] + (s.values[i + 1] - s.values[i]) * t;
}

export function resample(s: Spectrum, grid: { startNm: number; intervalNm: number; n: number }): Spectrum {
  const values = Array.from({ length: grid.n }, (_x, k) => reflectanceAt(s, grid.startNm + k * grid.intervalNm));
  return { startNm: grid.startNm, intervalNm: grid.intervalNm, values };
}

/** One rung: the strength of the varied ingredient (e.g. % owf) and the result's colour, with its spectrum if read. */
export type Rung = { strength: number; lab: Lab; spectrum?: Spectrum | null };
export type Conditions = { illuminant: SpectralIlluminant; observer: SpectralObserver };
export type LadderPrediction = {
  lab: Lab;
  /** The predicted reflectance spectrum, when every rung has one. */
  spectrum: Spectrum | null;
  method: 'kubelka-munk' | 'lab-path';
  /** Outside the ladder's strengths: the nearest two rungs' trend carried on. */
  extrapolated: boolean;
};

/** The two rungs to interpolate (or extrapolate) between, and the fraction of the way from the first to the second. */
function bracket(xs: number[], x: number): { i: number; t: number; extrapolated: boolean } {
  const n = xs.length;
  let i = 0;
  while (i < n - 2 && x > xs[i + 1]) i++;
  const t = (x - xs[i]) / (xs[i + 1] - xs[i]);
  return { i, t, extrapolated: x < xs[0] - 1e-9 || x > xs[n - 1] + 1e-9 };
}

/**
 * The colour a ladder predicts at `strength`. Rungs must have distinct strengths (> 0); at least two.
 * With a spectrum on every rung: K/S at each wavelength interpolated linearly in strength (single-constant
 * Kubelka–Munk), back to reflectance, then to L*a*b* under `conditions`. Otherwise: L*a*b* interpolated along the
 * ladder's measured path, in log strength (ladders are usually geometric: 5, 10, 20, 40 % owf).
 */
export function predictOnLadder(rungs: Rung[], strength: number, conditions: Conditions): LadderPrediction {
  const sorted = [...rungs].sort((x, y) => x.strength - y.strength);
  if (sorted.length < 2) throw new Error('A ladder needs at least two rungs');
  const spectra = sorted.map((r) => r.spectrum ?? null);
  const grid = spectra.every(Boolean) ? commonGrid(spectra as Spectrum[]) : null;
  if (grid) {
    const ks = (spectra as Spectrum[]).map((s) => resample(s, grid).values.map(ksFromR));
    const { i, t, extrapolated } = bracket(
      sorted.map((r) => r.strength),
      strength,
    );
    const values = ks[i].map((k0, w) => rFromKs(Math.max(0, k0 + (ks[i + 1][w] - k0) * t)));
    const spectrum = { startNm: grid.startNm, intervalNm: grid.intervalNm, values };
    return {
      lab: spectrumToLab(spectrum, conditions.illuminant, conditions.observer).lab,
      spectrum,
      method: 'kubelka-munk',
      extrapolated,
    };
  }
  const { i, t, extrapolated } = bracket(
    sorted.map((r) => Math.log(r.strength)),
    Math.log(strength),
  );
  const [p, q] = [sorted[i].lab, sorted[i + 1].lab];
  const L = Math.min(100, Math.max(0, p.L + (q.L - p.L) * t));
  return {
    lab: { L, a: p.a + (q.a - p.a) * t, b: p.b + (q.b - p.b) * t },
    spectrum: null,
    method: 'lab-path',
    extrapolated,
  };
}

/** How far past the ladder's ends a strength may be looked for (a flagged extrapolation), as a factor. */
const REACH = 1.5;

/**
 * The strength on a ladder whose predicted colour is nearest the target (ΔE00), searched over the ladder's range and
 * a little beyond (flagged): a log-spaced scan, then golden-section refinement around the best point.
 */
export function strengthForTarget(
  rungs: Rung[],
  target: Lab,
  conditions: Conditions,
): { strength: number; prediction: LadderPrediction; deltaE00: number } {
  const xs = rungs.map((r) => r.strength);
  const lo = Math.log(Math.min(...xs) / REACH);
  const hi = Math.log(Math.max(...xs) * REACH);
  const cost = (u: number) => deltaE00(target, predictOnLadder(rungs, Math.exp(u), conditions).lab);
  const N = 60;
  let best = lo;
  let bestCost = Infinity;
  for (let k = 0; k <= N; k++) {
    const u = lo + ((hi - lo) * k) / N;
    const c = cost(u);
    if (c < bestCost) [best, bestCost] = [u, c];
  }
  // Golden-section search in the scan's neighbouring cells.
  let a = Math.max(lo, best - (hi - lo) / N);
  let b = Math.min(hi, best + (hi - lo) / N);
  const g = (Math.sqrt(5) - 1) / 2;
  let c = b - g * (b - a);
  let d = a + g * (b - a);
  let fc = cost(c);
  let fd = cost(d);
  for (let k = 0; k < 40; k++) {
    if (fc < fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - g * (b - a);
      fc = cost(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + g * (b - a);
      fd = cost(d);
    }
  }
  const refined = fc < fd ? c : d;
  const strength = Math.exp(Math.min(fc, fd) < bestCost ? refined : best);
  const prediction = predictOnLadder(rungs, strength, conditions);
  return { strength, prediction, deltaE00: deltaE00(target, prediction.lab) };
}

/**
 * Leave-one-out on one ladder: each inner rung predicted from the others at its own strength, and the ΔE00 between
 * prediction and reading. End rungs are left out (predicting them would be an extrapolation, which suggestions flag
 * rather than trust). Empty for a ladder of fewer than three rungs.
 */
export function leaveOneOut(rungs: Rung[], conditions: Conditions): number[] {
  const sorted = [...rungs].sort((x, y) => x.strength - y.strength);
  const out: number[] = [];
  for (let i = 1; i < sorted.length - 1; i++) {
    const rest = sorted.filter((_r, j) => j !== i);
    const actual = sorted[i].spectrum
      ? spectrumToLab(sorted[i].spectrum!, conditions.illuminant, conditions.observer).lab
      : sorted[i].lab;
    out.push(deltaE00(actual, predictOnLadder(rest, sorted[i].strength, conditions).lab));
  }
  return out;
}

/** The p-th quantile (0–1) of a list, by linear interpolation between order statistics (R's type 7). */
export function quantile(xs: number[], p: number): number {
  if (!xs.length) return NaN;
  const s = [...xs].sort((x, y) => x - y);
  const h = (s.length - 1) * p;
  const i = Math.floor(h);
  return s[i] + (s[Math.min(s.length - 1, i + 1)] - s[i]) * (h - i);
}

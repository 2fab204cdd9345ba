import Color from 'colorjs.io';
import type { Lab } from './convert.ts';

// colorjs.io's difference formulas read their input as 'lab' coordinates. Passing
// our stored D65 values straight in as those coordinates applies the formulas to
// the numbers as given (no D65→D50 round trip), as the published test data expects.
const raw = ({ L, a, b }: Lab) => new Color('lab', [L, a, b]);

/** CIEDE2000 (kL = kC = kH = 1). Symmetric. */
export function deltaE00(ref: Lab, sample: Lab): number {
  return raw(ref).deltaE2000(raw(sample));
}

/** CMC(l:c); the first colour is the standard (the original), so the order matters. */
export function deltaECMC(ref: Lab, sample: Lab, l: number, c: number): number {
  return raw(ref).deltaECMC(raw(sample), { l, c });
}

/** CIE 1976 ΔE*ab: plain Euclidean distance in CIELAB. */
export function deltaE76(x: Lab, y: Lab): number {
  return Math.hypot(x.L - y.L, x.a - y.a, x.b - y.b);
}

export type Verdict = 'match' | 'close' | 'near' | 'different';
export type Bands = { match: number; close: number; near: number };

/** ΔE00 upper bounds of each verdict: common practice for textile matching, adjustable by an admin. */
export const DEFAULT_BANDS: Bands = { match: 1, close: 2, near: 4 };

export function verdictFor(deltaE: number, bands: Bands = DEFAULT_BANDS): Verdict {
  if (deltaE <= bands.match) return 'match';
  if (deltaE <= bands.close) return 'close';
  if (deltaE <= bands.near) return 'near';
  return 'different';
}

/** Differences smaller than this (in L*, C*, a* or b* units) are not put into words. */
const WORD_THRESHOLD = 0.5;

/** How the sample differs from the original, in plain dyers' words, plus the numbers. */
export function differenceReport(ref: Lab, sample: Lab, bands: Bands = DEFAULT_BANDS) {
  const dE = deltaE00(ref, sample);
  const dL = sample.L - ref.L;
  const dC = Math.hypot(sample.a, sample.b) - Math.hypot(ref.a, ref.b);
  const da = sample.a - ref.a;
  const db = sample.b - ref.b;
  const words: string[] = [];
  if (Math.abs(dL) >= WORD_THRESHOLD) words.push(dL > 0 ? 'lighter' : 'darker');
  if (Math.abs(dC) >= WORD_THRESHOLD) words.push(dC > 0 ? 'brighter' : 'duller');
  if (Math.abs(da) >= WORD_THRESHOLD) words.push(da > 0 ? 'redder' : 'greener');
  if (Math.abs(db) >= WORD_THRESHOLD) words.push(db > 0 ? 'yellower' : 'bluer');
  return {
    deltaE00: dE,
    cmc21: deltaECMC(ref, sample, 2, 1),
    cmc11: deltaECMC(ref, sample, 1, 1),
    dL, dC, da, db,
    words,
    verdict: verdictFor(dE, bands),
  };
}

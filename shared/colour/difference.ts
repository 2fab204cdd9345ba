import Color from 'colorjs.io';
import { labToLch, type Lab } from './convert.ts';
import { hueFamily, type HueFamily } from './hues.ts';

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

/**
 * The signed CIELAB components of a difference (CIE 15:2018 §8.2), sample minus standard:
 * ΔL*, ΔC*ab and ΔH*ab = 2·√(C*₁·C*₂)·sin(Δh/2), where Δh is the hue-angle change taken the
 * short way round (−180° < Δh ≤ 180°), so ΔH* is positive when the hue angle grows
 * (anticlockwise on the a*b* plane). ΔL*² + ΔC*² + ΔH*² = ΔE*ab².
 */
export function labComponents(standard: Lab, sample: Lab) {
  const s = labToLch(standard),
    t = labToLch(sample);
  let dh = t.h - s.h;
  if (dh > 180) dh -= 360;
  else if (dh <= -180) dh += 360;
  // A neutral colour has no hue: its hue difference is all chroma.
  const dH = s.C === 0 || t.C === 0 ? 0 : 2 * Math.sqrt(s.C * t.C) * Math.sin((dh * Math.PI) / 360);
  return { dL: t.L - s.L, dC: t.C - s.C, dH, dh: s.C === 0 || t.C === 0 ? 0 : dh };
}

export type HueWord = 'redder' | 'yellower' | 'greener' | 'bluer';

/**
 * Which way a hue moves, in dyers' words, by the standard's hue family (shared with the shade
 * names, ./hues.ts) and the sign of the hue-angle change. On the a*b* plane hue angles run
 * red → yellow → green → blue → purple → red, so a growing angle takes a red or an orange towards
 * yellow, a yellow towards green, a green towards blue, a blue or a purple towards red, and a
 * shrinking one the other way. Common practice of colour-difference reports.
 */
const HUE_MOVES: Record<HueFamily, [up: HueWord, down: HueWord]> = {
  red: ['yellower', 'bluer'],
  orange: ['yellower', 'redder'],
  yellow: ['greener', 'redder'],
  green: ['bluer', 'yellower'],
  blue: ['redder', 'greener'],
  purple: ['redder', 'bluer'],
};

export function hueWord(standardHue: number, dh: number): HueWord | null {
  if (dh === 0) return null;
  const [up, down] = HUE_MOVES[hueFamily(standardHue)];
  return dh > 0 ? up : down;
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

/**
 * A component is put into words when it carries at least this share of ΔE*ab² (the three
 * components' squares add up to it) and is at least WORD_MIN units: a component too small to
 * see beside the others would only mislead. Common practice, not a published rule.
 */
export const WORD_SHARE = 0.1;
export const WORD_MIN = 0.25;

/** How the sample differs from the original (the standard), in plain dyers' words, plus the numbers. */
export function differenceReport(ref: Lab, sample: Lab, bands: Bands = DEFAULT_BANDS) {
  const dE = deltaE00(ref, sample);
  const { dL, dC, dH, dh } = labComponents(ref, sample);
  const dEab = deltaE76(ref, sample);
  const matters = (v: number) => Math.abs(v) >= WORD_MIN && v * v >= WORD_SHARE * dEab * dEab;
  const words: string[] = [];
  if (matters(dL)) words.push(dL > 0 ? 'lighter' : 'darker');
  if (matters(dC)) words.push(dC > 0 ? 'brighter' : 'duller');
  const hue = matters(dH) ? hueWord(labToLch(ref).h, dh) : null;
  if (hue) words.push(hue);
  return {
    deltaE00: dE,
    cmc21: deltaECMC(ref, sample, 2, 1),
    cmc11: deltaECMC(ref, sample, 1, 1),
    deltaEab: dEab,
    dL,
    dC,
    dH,
    /** Hue-angle change in degrees (−180 to 180), sample minus standard. */
    dh,
    da: sample.a - ref.a,
    db: sample.b - ref.b,
    words,
    verdict: verdictFor(dE, bands),
  };
}

/**
 * Instrumental grey-scale grades from two CIELAB readings (the standards ask for D65 and the 10°
 * observer), as a number and as the nearest step of the grey scale (5, 4-5, 4 … 1).
 *
 * - Change in colour, ISO 105-A05: GS = 5 − ΔE_F/1.7 for ΔE_F ≤ 3.4, else 5 − log₂(ΔE_F/0.85).
 * - Staining, ISO 105-A04: GS = 5 − 0.23·ΔE_GS for ΔE_GS ≤ 4, else 6.1 − 1.45·ln ΔE_GS.
 *
 * RECALLED FROM MEMORY, not read in the standards (the team's reference note on grey-scale grades, kept outside this repository):
 * both grade formulas and their break points; the weighted difference ΔE_F of ISO 105-A05 (its
 * chroma and hue weights and the blue-region term D below); ΔE_GS = ΔE*ab − 0.4·√(ΔE*ab² − ΔL*²)
 * of ISO 105-A04. What is checked (tests/unit/grey-scale.test.ts): on neutral pairs, where every
 * weight drops out and ΔE_F = ΔE_GS = ΔE*ab = |ΔL*|, the grades fall on the nominal colour
 * differences of the grey scales (ISO 105-A02 change in colour, read in a stored preview of the
 * standard; ISO 105-A03 staining, from memory; tests/reference/fastness-scales.json), every
 * difference within a step's tolerance giving that step. The break points make each formula
 * continuous (ISO 105-A05 exactly at 3.4; ISO 105-A04 within 0.01 grade at 4).
 */
import { labComponents, labToLch, type Lab } from '../colour/index.ts';
import { greyGradeFromValue, type GreyGrade } from './fastness.ts';

/** ISO 105-A05's ΔE_F (recalled from memory; see above). */
export function deltaEF(standard: Lab, sample: Lab): number {
  const { dL, dC, dH } = labComponents(standard, sample);
  const s = labToLch(standard),
    t = labToLch(sample);
  const Cm = (s.C + t.C) / 2;
  // Mean hue, the short way round; a neutral colour takes the other's hue.
  let hm: number;
  if (s.C === 0 || t.C === 0) hm = s.C === 0 ? t.h : s.h;
  else {
    hm = (s.h + t.h) / 2;
    if (Math.abs(s.h - t.h) > 180) hm = (hm + 180) % 360;
  }
  const off = Math.abs(hm - 280);
  const X = ((off <= 180 ? off : 360 - off) / 30) ** 2;
  // Correction for blues, where the eye weighs a chroma change differently (h ≈ 280°).
  const D = (dC * Cm * Math.exp(-X)) / 100;
  const dCF = (dC - D) / (1 + ((20 * Cm) / 1000) ** 2);
  const dHF = (dH - D) / (1 + ((10 * Cm) / 1000) ** 2);
  return Math.hypot(dL, dCF, dHF);
}

/** ISO 105-A04's ΔE_GS (recalled from memory): ΔE*ab less 0.4 of its chromatic part. */
export function deltaEGS(standard: Lab, sample: Lab): number {
  const dL = sample.L - standard.L;
  const dE = Math.hypot(dL, sample.a - standard.a, sample.b - standard.b);
  return dE - 0.4 * Math.sqrt(Math.max(0, dE * dE - dL * dL));
}

/** Grade for change in colour from ΔE_F (ISO 105-A05, recalled from memory). */
export const changeGradeFromDifference = (dEF: number) => (dEF <= 3.4 ? 5 - dEF / 1.7 : 5 - Math.log2(dEF / 0.85));

/** Grade for staining from ΔE_GS (ISO 105-A04, recalled from memory). */
export const stainingGradeFromDifference = (dEGS: number) =>
  dEGS <= 4 ? 5 - 0.23 * dEGS : 6.1 - 1.45 * Math.log(dEGS);

export type GreyScaleResult = { grade: number; step: GreyGrade; difference: number };

/**
 * Both grades for a pair: the original (before the test, or the undyed adjacent fabric) is the
 * reference, the tested specimen (or the stained adjacent fabric) the sample. The number is
 * given to 0.01 grade; the step is the nearest half grade within 1–5.
 */
export function greyScaleGrades(reference: Lab, sample: Lab): { change: GreyScaleResult; staining: GreyScaleResult } {
  const grade = (g: number, difference: number): GreyScaleResult => ({
    grade: Math.round(g * 100) / 100,
    step: greyGradeFromValue(g),
    difference: Math.round(difference * 1000) / 1000,
  });
  const dEF = deltaEF(reference, sample);
  const dEGS = deltaEGS(reference, sample);
  return {
    change: grade(changeGradeFromDifference(dEF), dEF),
    staining: grade(stainingGradeFromDifference(dEGS), dEGS),
  };
}

export const GREY_SCALE_SOURCES = {
  change: 'ISO 105-A05 (instrumental assessment of change in colour); formula recalled from memory',
  staining: 'ISO 105-A04 (instrumental assessment of staining); formula recalled from memory',
} as const;

import { deltaE00, labComponents, type Lab } from '../colour/index.ts';
import type { GreyGrade } from './fastness.ts';
import { greyScaleGrades } from './grey-scale.ts';

/**
 * A fading pair: the protected area (a fold, a seam allowance, the back of a hem) stands for the colour as made,
 * the faded area for the colour as seen. The protected side is the standard, as the original is in ISO 105-A05.
 * ΔE00 is CIE 15 / CIEDE2000 through colorjs.io; the components are ΔL*, ΔC*ab, ΔH*ab (shared/colour/difference.ts).
 */
export type A05Grade = { grade: number; step: GreyGrade };

/** The ISO 105-A05 grade for change in colour (shared/compute/grey-scale.ts): protected = reference, faded = sample. */
export function a05ChangeGrade(protectedLab: Lab, fadedLab: Lab): A05Grade | null {
  const { grade, step } = greyScaleGrades(protectedLab, fadedLab).change;
  return { grade, step };
}

export function fadingReport(protectedLab: Lab, fadedLab: Lab) {
  return {
    deltaE00: deltaE00(protectedLab, fadedLab),
    components: labComponents(protectedLab, fadedLab),
    a05: a05ChangeGrade(protectedLab, fadedLab),
  };
}

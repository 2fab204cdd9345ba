import { deltaE00, labComponents, type Lab } from '../colour/index.ts';
import type { GreyGrade } from './fastness.ts';

/**
 * A fading pair: the protected area (a fold, a seam allowance, the back of a hem) stands for the colour as made,
 * the faded area for the colour as seen. The protected side is the standard, as the original is in ISO 105-A05.
 * ΔE00 is CIE 15 / CIEDE2000 through colorjs.io; the components are ΔL*, ΔC*ab, ΔH*ab (shared/colour/difference.ts).
 */
export type A05Grade = { grade: number; step: GreyGrade };

/**
 * HOOK for the ISO 105-A05 grade for change in colour. Another helper writes it (shared/compute/grey-scale.ts,
 * `greyScaleGrades(reference, sample).change`, on branch i17-spectral); it was not on main when this was written.
 * Once it is, return that here (reference = protected, sample = faded). Until then: null, and the UI says
 * "grade not yet computed".
 */
export function a05ChangeGrade(_protectedLab: Lab, _fadedLab: Lab): A05Grade | null {
  return null;
}

export function fadingReport(protectedLab: Lab, fadedLab: Lab) {
  return {
    deltaE00: deltaE00(protectedLab, fadedLab),
    components: labComponents(protectedLab, fadedLab),
    a05: a05ChangeGrade(protectedLab, fadedLab),
  };
}

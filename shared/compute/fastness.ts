/**
 * Colour-fastness grades. Grey scales (ISO 105-A02 change in colour, ISO 105-A03
 * staining) run 5 (no change) to 1 with half grades written "4-5"; the blue wool
 * references of light fastness (ISO 105-B02) run 1 (very low) to 8 (outstanding).
 * A test done without the standard's apparatus is recorded as informal.
 */
export const GREY_GRADES = ['5', '4-5', '4', '3-4', '3', '2-3', '2', '1-2', '1'] as const;
export type GreyGrade = (typeof GREY_GRADES)[number];
export const BLUE_WOOL_GRADES = ['1', '2', '3', '4', '5', '6', '7', '8'] as const;
export type BlueWoolGrade = (typeof BLUE_WOOL_GRADES)[number];

/** "3-4" → 3.5; a half grade sits midway between its two whole grades. */
export function gradeValue(grade: GreyGrade | BlueWoolGrade): number {
  const [a, b] = grade.split('-').map(Number);
  return b === undefined ? a : (a + b) / 2;
}

/** 3.5 → "3-4"; values are snapped to the nearest half grade within 1–5. */
export function greyGradeFromValue(value: number): GreyGrade {
  const v = Math.min(5, Math.max(1, Math.round(value * 2) / 2));
  return (Number.isInteger(v) ? String(v) : `${v - 0.5}-${v + 0.5}`) as GreyGrade;
}

/**
 * Nominal CIELAB ΔE*ab of each grey-scale step (ISO 105-A02 change in colour and
 * ISO 105-A03 staining), recalled from memory: a guide for reading an instrumental
 * difference, not a substitute for the visual assessment the standards describe.
 */
export const GREY_SCALE_NOMINAL_DE: Record<'change' | 'staining', Record<GreyGrade, number>> = {
  change: { '5': 0, '4-5': 0.8, '4': 1.7, '3-4': 2.5, '3': 3.4, '2-3': 4.8, '2': 6.8, '1-2': 9.6, '1': 13.6 },
  staining: { '5': 0, '4-5': 2.2, '4': 4.3, '3-4': 6.0, '3': 8.5, '2-3': 12.0, '2': 16.9, '1-2': 24.0, '1': 34.1 },
};

/** The grey-scale step whose nominal ΔE*ab is nearest to a measured difference. */
export function nearestGreyGrade(deltaEab: number, scale: 'change' | 'staining'): GreyGrade {
  const table = GREY_SCALE_NOMINAL_DE[scale];
  let best: GreyGrade = '5';
  for (const g of GREY_GRADES) if (Math.abs(table[g] - deltaEab) < Math.abs(table[best] - deltaEab)) best = g;
  return best;
}

export const FASTNESS_TESTS = {
  light: { standard: 'ISO 105-B02', scale: 'blue wool 1–8' },
  washing: { standard: 'ISO 105-C06', scale: 'grey scale 1–5 (change in colour, ISO 105-A02; staining, ISO 105-A03)' },
  rubbingDry: { standard: 'ISO 105-X12', scale: 'grey scale 1–5 (staining, ISO 105-A03)' },
  rubbingWet: { standard: 'ISO 105-X12', scale: 'grey scale 1–5 (staining, ISO 105-A03)' },
} as const;

/*
 * Hue families by CIELAB hue angle h_ab, the one table behind plain shade names and the hue words
 * of colour differences. Boundaries are common practice (where dyers and conservators put them),
 * not a published table:
 * - scarlet sits at h_ab ≈ 42°, so red runs to 45°;
 * - light yellows (cream, lemon, the sRGB yellow primary at 103°) lie past 100°, so yellow runs to 115°;
 * - the sRGB blue primary and a navy (#000080) sit at h_ab ≈ 306° and a practitioner calls both
 *   blue, so blue runs to 310°; violet, lilac, lavender and madder purples lie beyond.
 */
export type HueFamily = 'red' | 'orange' | 'yellow' | 'green' | 'blue' | 'purple';

export const HUE_FAMILIES: ReadonlyArray<readonly [upTo: number, family: HueFamily]> = [
  [45, 'red'],
  [75, 'orange'],
  [115, 'yellow'],
  [200, 'green'],
  [310, 'blue'],
  [352, 'purple'],
  [361, 'red'],
];

/** The family of a hue angle in degrees (any angle; taken modulo 360). */
export function hueFamily(h: number): HueFamily {
  const x = ((h % 360) + 360) % 360;
  return HUE_FAMILIES.find(([upTo]) => x < upTo)![1];
}

/**
 * The 24-patch colour rendition chart's published values: McCamy, Marcus & Davidson (1976), "A color-rendition
 * chart", J. Applied Photographic Engineering 2(3):95–99 (CIE xyY under illuminant C, 2°), here as CIELAB D65
 * after a Bradford adaptation C → D65, computed with colour-science 0.4.6 from its dataset of the 1976 values
 * (team reference folder reference/cie/colour-rendition-chart-1976.json; the test copy is
 * tests/reference/colour-rendition-chart-1976.json). Patch order: row by row from dark skin (1) to black (24).
 */
export const CHART_1976_SOURCE =
  'McCamy, Marcus & Davidson (1976), J. Applied Photographic Engineering 2(3):95–99; xyY (illuminant C) adapted to D65 by Bradford (colour-science 0.4.6)';

export const CHART_1976: ReadonlyArray<{ patch: number; name: string; lab: { L: number; a: number; b: number } }> = [
  { patch: 1, name: 'dark skin', lab: { L: 37.921, a: 12.813, b: 14.421 } },
  { patch: 2, name: 'light skin', lab: { L: 66.373, a: 14.098, b: 16.924 } },
  { patch: 3, name: 'blue sky', lab: { L: 51.018, a: -0.545, b: -22.075 } },
  { patch: 4, name: 'foliage', lab: { L: 43.276, a: -16.855, b: 22.022 } },
  { patch: 5, name: 'blue flower', lab: { L: 56.258, a: 12.277, b: -25.512 } },
  { patch: 6, name: 'bluish green', lab: { L: 71.678, a: -31.749, b: 1.266 } },
  { patch: 7, name: 'orange', lab: { L: 61.686, a: 29.279, b: 57.969 } },
  { patch: 8, name: 'purplish blue', lab: { L: 41.033, a: 16.689, b: -43.325 } },
  { patch: 9, name: 'moderate red', lab: { L: 51.462, a: 44.672, b: 14.582 } },
  { patch: 10, name: 'purple', lab: { L: 30.639, a: 26.113, b: -23.62 } },
  { patch: 11, name: 'yellow green', lab: { L: 72.574, a: -28.058, b: 59.276 } },
  { patch: 12, name: 'orange yellow', lab: { L: 71.643, a: 13.904, b: 66.57 } },
  { patch: 13, name: 'blue', lab: { L: 29.414, a: 26.675, b: -51.716 } },
  { patch: 14, name: 'green', lab: { L: 55.623, a: -41.769, b: 33.676 } },
  { patch: 15, name: 'red', lab: { L: 41.08, a: 52.851, b: 25.664 } },
  { patch: 16, name: 'yellow', lab: { L: 81.453, a: -2.855, b: 78.926 } },
  { patch: 17, name: 'magenta', lab: { L: 51.377, a: 50.297, b: -16.203 } },
  { patch: 18, name: 'cyan', lab: { L: 51.567, a: -23.6, b: -26.603 } },
  { patch: 19, name: 'white 9.5 (.05 D)', lab: { L: 96.001, a: -0.051, b: 0.06 } },
  { patch: 20, name: 'neutral 8 (.23 D)', lab: { L: 81.347, a: -0.044, b: 0.052 } },
  { patch: 21, name: 'neutral 6.5 (.44 D)', lab: { L: 66.673, a: -0.037, b: 0.044 } },
  { patch: 22, name: 'neutral 5 (.70 D)', lab: { L: 51.576, a: -0.031, b: 0.036 } },
  { patch: 23, name: 'neutral 3.5 (1.05 D)', lab: { L: 35.984, a: -0.023, b: 0.028 } },
  { patch: 24, name: 'black 2 (1.5 D)', lab: { L: 20.557, a: -0.017, b: 0.019 } },
];

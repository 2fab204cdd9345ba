import Color from 'colorjs.io';
import sharp from 'sharp';
import { CHART_COLUMNS, CHART_ROWS, homography, project, type Point } from '../../shared/compute/chart.ts';
import type { Lab } from '../../shared/colour/index.ts';

/**
 * A synthetic photo of a 24-patch colour chart lying on a cloth with dyed stripes, taken through a known
 * projective warp (the chart tilted and rotated) and a known colour distortion (a 3×3 cross-talk and cast
 * matrix in linear light, then a slight power curve, as a camera's rendering might). Colours are converted
 * with colorjs.io, never with the code under test.
 */

export type Distortion = { matrix: number[][]; power: number };
/** A warm cast with channel cross-talk, and a slight gamma error. */
export const DISTORTION: Distortion = {
  matrix: [
    [0.92, 0.1, 0.0],
    [0.04, 0.82, 0.06],
    [0.01, 0.09, 0.66],
  ],
  power: 1.04,
};

const lin = (lab: Lab) => new Color('lab-d65', [lab.L, lab.a, lab.b]).to('srgb-linear').coords.map(Number);

function capture(l: number[], d: Distortion): number[] {
  return [0, 1, 2].map((i) => {
    const v = d.matrix[i][0] * l[0] + d.matrix[i][1] * l[1] + d.matrix[i][2] * l[2];
    return Math.max(0, v) ** d.power;
  });
}

const to8 = (v: number) => {
  const s = new Color('srgb-linear', [v, 0, 0]).to('srgb').coords[0] as number;
  return Math.round(Math.min(1, Math.max(0, s)) * 255);
};

export type ChartScene = {
  width: number;
  height: number;
  corners: Point[];
  patches: Lab[];
  textiles: Array<{ name: string; lab: Lab; rect: { x: number; y: number; w: number; h: number } }>;
  ground: Lab;
};

export const TEXTILES: ChartScene['textiles'] = [
  { name: 'madder red', lab: { L: 42, a: 45, b: 25 }, rect: { x: 1220, y: 80, w: 300, h: 180 } },
  { name: 'indigo', lab: { L: 34, a: 3, b: -26 }, rect: { x: 1220, y: 300, w: 300, h: 180 } },
  { name: 'weld yellow', lab: { L: 76, a: 3, b: 58 }, rect: { x: 1220, y: 520, w: 300, h: 180 } },
  { name: 'walnut brown', lab: { L: 40, a: 9, b: 19 }, rect: { x: 1220, y: 740, w: 300, h: 180 } },
  { name: 'weld on indigo green', lab: { L: 48, a: -28, b: 20 }, rect: { x: 300, y: 900, w: 700, h: 120 } },
];

/** The scene drawn as an 8-bit sRGB PNG (the chart's corner-patch centres are `corners`, in marking order). */
export async function chartPhoto(
  patches: Lab[],
  distortion: Distortion = DISTORTION,
): Promise<{ buffer: Buffer; scene: ChartScene }> {
  const width = 1600,
    height = 1100;
  const corners: Point[] = [
    { x: 250, y: 230 },
    { x: 1010, y: 170 },
    { x: 1060, y: 700 },
    { x: 280, y: 760 },
  ];
  const grid: Point[] = [
    { x: 0, y: 0 },
    { x: CHART_COLUMNS - 1, y: 0 },
    { x: CHART_COLUMNS - 1, y: CHART_ROWS - 1 },
    { x: 0, y: CHART_ROWS - 1 },
  ];
  const back = homography(corners, grid)!;
  const ground: Lab = { L: 82, a: 2, b: 9 };
  const frame: Lab = { L: 14, a: 0, b: 0 };
  const px = (lab: Lab) => capture(lin(lab), distortion).map(to8);
  const patchPx = patches.map(px),
    framePx = px(frame),
    groundPx = px(ground);
  const textilePx = TEXTILES.map((t) => px(t.lab));
  const data = Buffer.alloc(width * height * 3);
  for (let y = 0; y < height; y++)
    for (let x = 0; x < width; x++) {
      let c = groundPx;
      const g = project(back, { x: x + 0.5, y: y + 0.5 });
      if (g.x > -0.65 && g.x < CHART_COLUMNS - 0.35 && g.y > -0.65 && g.y < CHART_ROWS - 0.35) {
        const col = Math.round(g.x),
          row = Math.round(g.y);
        c =
          Math.abs(g.x - col) < 0.42 &&
          Math.abs(g.y - row) < 0.42 &&
          col >= 0 &&
          row >= 0 &&
          col < CHART_COLUMNS &&
          row < CHART_ROWS
            ? patchPx[row * CHART_COLUMNS + col]
            : framePx;
      } else {
        const t = TEXTILES.findIndex(
          (t) => x >= t.rect.x && x < t.rect.x + t.rect.w && y >= t.rect.y && y < t.rect.y + t.rect.h,
        );
        if (t >= 0) c = textilePx[t];
      }
      data.set(c, (y * width + x) * 3);
    }
  const buffer = await sharp(data, { raw: { width, height, channels: 3 } })
    .png()
    .toBuffer();
  return { buffer, scene: { width, height, corners, patches, textiles: TEXTILES, ground } };
}

import Color from 'colorjs.io';
import { deltaE00, type Lab } from '../colour/index.ts';

/**
 * A 24-patch colour rendition chart (6 columns × 4 rows) marked in a photo by the centres of its four
 * corner patches, and the colour correction it gives. Pure: the sampling of the photo is in
 * server/media/chart.ts.
 *
 * Geometry: the four corners (patch 1 dark skin, patch 6 bluish green, patch 24 black, patch 19 white, in that
 * order) fix a projective mapping (a homography, solved by the 4-point direct linear transform; Hartley &
 * Zisserman, Multiple View Geometry, 2nd ed., §4.1) from chart grid coordinates (column 0–5, row 0–3) to photo
 * pixels, so a rotated or tilted chart works.
 *
 * Correction: a 3×3 matrix M on linear-light sRGB, fitted by least squares so that M · measured ≈ reference
 * for the 24 patches. Two fits are offered: plain least squares, and 'white-preserving' (the same fit with the
 * constraint that the white patch maps exactly to its reference, by a Lagrange multiplier per row). The
 * synthetic-chart test (tests/unit/chart.test.ts) measures both; the default is the one that did better there.
 */

export type Point = { x: number; y: number };
export type Lin = [number, number, number];
export type M3 = [Lin, Lin, Lin];
export const CHART_COLUMNS = 6;
export const CHART_ROWS = 4;
export const CHART_PATCHES = CHART_COLUMNS * CHART_ROWS;
/** Grid position of each corner, in the order the user marks them: patches 1, 6, 24, 19. */
export const CORNER_GRID: readonly Point[] = [
  { x: 0, y: 0 },
  { x: CHART_COLUMNS - 1, y: 0 },
  { x: CHART_COLUMNS - 1, y: CHART_ROWS - 1 },
  { x: 0, y: CHART_ROWS - 1 },
];
export const CORNER_NAMES = ['patch 1 (dark skin)', 'patch 6 (bluish green)', 'patch 24 (black)', 'patch 19 (white)'];
/** Index (0-based) of the white patch (19), used by the white-preserving fit. */
export const WHITE_PATCH = 18;
/** Side of the sampled box as a fraction of the patch pitch: the middle 40 %, well clear of the black gaps between patches. */
export const SAMPLE_FRACTION = 0.4;

/** Solve A x = b (n×n) by Gaussian elimination with partial pivoting; null when singular. */
function solve(A: number[][], b: number[]): number[] | null {
  const n = b.length;
  const m = A.map((row, i) => [...row, b[i]]);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r][c]) > Math.abs(m[p][c])) p = r;
    if (Math.abs(m[p][c]) < 1e-12) return null;
    [m[c], m[p]] = [m[p], m[c]];
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const f = m[r][c] / m[c][c];
      for (let k = c; k <= n; k++) m[r][k] -= f * m[c][k];
    }
  }
  return m.map((row, i) => row[n] / row[i]);
}

/** The homography (row-major, h33 = 1) taking the four `from` points to the four `to` points; null when degenerate. */
export function homography(from: readonly Point[], to: readonly Point[]): number[] | null {
  const A: number[][] = [];
  const b: number[] = [];
  for (let i = 0; i < 4; i++) {
    const { x, y } = from[i],
      { x: u, y: v } = to[i];
    A.push([x, y, 1, 0, 0, 0, -u * x, -u * y]);
    b.push(u);
    A.push([0, 0, 0, x, y, 1, -v * x, -v * y]);
    b.push(v);
  }
  const h = solve(A, b);
  return h ? [...h, 1] : null;
}

export function project(h: readonly number[], p: Point): Point {
  const w = h[6] * p.x + h[7] * p.y + h[8];
  return { x: (h[0] * p.x + h[1] * p.y + h[2]) / w, y: (h[3] * p.x + h[4] * p.y + h[5]) / w };
}

/** True when the four points, in order, make a convex quadrilateral (all turns the same way, none flat). */
export function isConvexQuad(p: readonly Point[]): boolean {
  if (p.length !== 4) return false;
  let sign = 0;
  for (let i = 0; i < 4; i++) {
    const a = p[i],
      b = p[(i + 1) % 4],
      c = p[(i + 2) % 4];
    const cross = (b.x - a.x) * (c.y - b.y) - (b.y - a.y) * (c.x - b.x);
    if (Math.abs(cross) < 1e-9) return false;
    const s = Math.sign(cross);
    if (sign && s !== sign) return false;
    sign = s;
  }
  return true;
}

export type PatchGeometry = {
  patch: number;
  centre: Point;
  /** half the side of the sampled square, px */ half: number;
};

/**
 * All 24 patch centres from the four corner centres, with the sampling box of each: a square of
 * SAMPLE_FRACTION of the local patch pitch (the shorter of the distances to the projected
 * neighbours), so a chart seen in perspective is sampled inside each patch.
 */
export function patchGeometry(corners: readonly Point[]): PatchGeometry[] {
  const h = homography(CORNER_GRID, corners);
  if (!h) throw new Error('The four corners do not make a quadrilateral.');
  const out: PatchGeometry[] = [];
  for (let row = 0; row < CHART_ROWS; row++)
    for (let col = 0; col < CHART_COLUMNS; col++) {
      const c = project(h, { x: col, y: row });
      const dx = project(h, { x: col + 0.5, y: row }),
        dy = project(h, { x: col, y: row + 0.5 });
      const pitch = 2 * Math.min(Math.hypot(dx.x - c.x, dx.y - c.y), Math.hypot(dy.x - c.x, dy.y - c.y));
      out.push({ patch: row * CHART_COLUMNS + col + 1, centre: c, half: (SAMPLE_FRACTION * pitch) / 2 });
    }
  return out;
}

/** The chart's outline in photo pixels: the corner centres pushed out by half a patch (plus a small margin). */
export function chartOutline(corners: readonly Point[], margin = 0.6): Point[] {
  const h = homography(CORNER_GRID, corners);
  if (!h) throw new Error('The four corners do not make a quadrilateral.');
  return [
    { x: -margin, y: -margin },
    { x: CHART_COLUMNS - 1 + margin, y: -margin },
    { x: CHART_COLUMNS - 1 + margin, y: CHART_ROWS - 1 + margin },
    { x: -margin, y: CHART_ROWS - 1 + margin },
  ].map((p) => project(h, p));
}

// ---- colour ----

/** CIELAB D65 to linear-light sRGB (unclipped), through colorjs.io. */
export const labToLinear = ({ L, a, b }: Lab): Lin =>
  new Color('lab-d65', [L, a, b]).to('srgb-linear').coords.map(Number) as Lin;
/** Linear-light sRGB to CIELAB D65, through colorjs.io. */
export function linearToLab(rgb: Lin): Lab {
  const [L, a, b] = new Color('srgb-linear', rgb).to('lab-d65').coords.map(Number);
  return { L, a, b };
}

export const applyMatrix = (m: M3, v: Lin): Lin =>
  [0, 1, 2].map((i) => m[i][0] * v[0] + m[i][1] * v[1] + m[i][2] * v[2]) as Lin;

export const FIT_METHODS = ['least-squares', 'white-preserving'] as const;
export type FitMethod = (typeof FIT_METHODS)[number];

/**
 * The 3×3 matrix M minimising Σ |M·measured_i − reference_i|² over the patches (normal equations per output
 * channel); 'white-preserving' adds the constraint M·measured_w = reference_w for the white patch:
 * m = m₀ − G⁻¹w (wᵀG⁻¹w)⁻¹ (wᵀm₀ − r), with G = AᵀA and m₀ the unconstrained row.
 */
export function fitMatrix(measured: Lin[], reference: Lin[], method: FitMethod = 'least-squares'): M3 {
  const G = [0, 1, 2].map((i) => [0, 1, 2].map((j) => measured.reduce((s, m) => s + m[i] * m[j], 0)));
  const rows: Lin[] = [];
  for (let ch = 0; ch < 3; ch++) {
    const rhs = [0, 1, 2].map((i) => measured.reduce((s, m, k) => s + m[i] * reference[k][ch], 0));
    const m0 = solve(G, rhs);
    if (!m0) throw new Error('The chart patches do not determine a correction (too few distinct colours).');
    if (method === 'white-preserving') {
      const w = measured[WHITE_PATCH];
      const Giw = solve(G, [...w])!;
      const denom = w[0] * Giw[0] + w[1] * Giw[1] + w[2] * Giw[2];
      const excess = w[0] * m0[0] + w[1] * m0[1] + w[2] * m0[2] - reference[WHITE_PATCH][ch];
      rows.push([0, 1, 2].map((i) => m0[i] - (Giw[i] * excess) / denom) as Lin);
    } else rows.push(m0 as Lin);
  }
  return rows as M3;
}

// ---- grades ----

/** A tolerance level: the capture earns it when its mean (and, if given, maximum) ΔE00 are within. */
export type ToleranceLevel = { name: string; meanDeltaE00: number; maxDeltaE00?: number | null };
export type ToleranceLevels = { levels: ToleranceLevel[]; source: string };

/**
 * Imaging-guideline levels for colour accuracy on a colour target, best first. Recalled from memory: the US
 * Federal Agencies Digital Guidelines Initiative, Technical Guidelines for Digitizing Cultural Heritage
 * Materials (2016), colour accuracy as mean ΔE2000 over the target — 4 stars ≤ 2, 3 stars ≤ 4, 2 stars ≤ 5,
 * 1 star ≤ 8. Check against the current edition before relying on them; admins can replace them.
 */
export const DEFAULT_TOLERANCES: ToleranceLevels = {
  levels: [
    { name: '4 stars', meanDeltaE00: 2 },
    { name: '3 stars', meanDeltaE00: 4 },
    { name: '2 stars', meanDeltaE00: 5 },
    { name: '1 star', meanDeltaE00: 8 },
  ],
  source:
    'Federal Agencies Digital Guidelines Initiative, Technical Guidelines for Digitizing Cultural Heritage Materials (2016), mean ΔE2000 on the target (recalled from memory)',
};

/** The best level the figures meet, or null (below every level). */
export function gradeCapture(mean: number, max: number, levels: ToleranceLevel[]): string | null {
  const sorted = [...levels].sort((x, y) => x.meanDeltaE00 - y.meanDeltaE00);
  for (const l of sorted) if (mean <= l.meanDeltaE00 && (l.maxDeltaE00 == null || max <= l.maxDeltaE00)) return l.name;
  return null;
}

// ---- the whole evaluation ----

export type ChartPatchResult = {
  patch: number;
  name: string;
  centre: Point;
  half: number;
  measured: Lab;
  corrected: Lab;
  reference: Lab;
  deltaE00Before: number;
  deltaE00After: number;
};

export type ChartEvaluation = {
  matrix: M3;
  method: FitMethod;
  patches: ChartPatchResult[];
  before: { mean: number; max: number };
  after: { mean: number; max: number };
  grade: { before: string | null; after: string | null };
};

const stats = (xs: number[]) => ({ mean: xs.reduce((s, x) => s + x, 0) / xs.length, max: Math.max(...xs) });

/**
 * Fit and report: `samples` are the 24 patches' linear-light sRGB as measured in the photo (same order as
 * `reference`, patch 1 first), `geometry` their positions. ΔE00 before is measured against reference, after
 * is the corrected measurement against reference.
 */
export function evaluateChart(
  samples: Lin[],
  geometry: PatchGeometry[],
  reference: ReadonlyArray<{ name: string; lab: Lab }>,
  tolerances: ToleranceLevel[] = DEFAULT_TOLERANCES.levels,
  method: FitMethod = 'least-squares',
): ChartEvaluation {
  const refLin = reference.map((r) => labToLinear(r.lab));
  const matrix = fitMatrix(samples, refLin, method);
  const patches = samples.map((s, i): ChartPatchResult => {
    const measured = linearToLab(s);
    const corrected = linearToLab(applyMatrix(matrix, s));
    return {
      patch: i + 1,
      name: reference[i].name,
      centre: geometry[i].centre,
      half: geometry[i].half,
      measured,
      corrected,
      reference: reference[i].lab,
      deltaE00Before: deltaE00(reference[i].lab, measured),
      deltaE00After: deltaE00(reference[i].lab, corrected),
    };
  });
  const before = stats(patches.map((p) => p.deltaE00Before));
  const after = stats(patches.map((p) => p.deltaE00After));
  return {
    matrix,
    method,
    patches,
    before,
    after,
    grade: {
      before: gradeCapture(before.mean, before.max, tolerances),
      after: gradeCapture(after.mean, after.max, tolerances),
    },
  };
}

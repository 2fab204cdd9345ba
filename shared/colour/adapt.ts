import { D65_WHITE, type Xyz } from './convert.ts';

type M3 = [Xyz, Xyz, Xyz];

// The Bradford cone-response matrix (Lam 1985, as adopted in CIECAM97s and ICC v4).
const BRADFORD: M3 = [
  [0.8951, 0.2664, -0.1614],
  [-0.7502, 1.7135, 0.0367],
  [0.0389, -0.0685, 1.0296],
];

const mulV = (m: M3, v: Xyz): Xyz => [0, 1, 2].map((i) => m[i][0] * v[0] + m[i][1] * v[1] + m[i][2] * v[2]) as Xyz;
const mulM = (x: M3, y: M3): M3 =>
  [0, 1, 2].map((i) => [0, 1, 2].map((j) => x[i][0] * y[0][j] + x[i][1] * y[1][j] + x[i][2] * y[2][j])) as M3;

function invert(m: M3): M3 {
  const [[a, b, c], [d, e, f], [g, h, i]] = m;
  const A = e * i - f * h,
    B = -(d * i - f * g),
    C = d * h - e * g;
  const det = a * A + b * B + c * C;
  return [
    [A / det, -(b * i - c * h) / det, (b * f - c * e) / det],
    [B / det, (a * i - c * g) / det, -(a * f - c * d) / det],
    [C / det, -(a * h - b * g) / det, (a * e - b * d) / det],
  ];
}

const BRADFORD_INV = invert(BRADFORD);

/**
 * The Bradford chromatic adaptation matrix from sourceWhite to targetWhite (XYZ).
 * Only the chromaticity of the source white matters: it is scaled to the target's Y
 * first, so a grey patch fixes the colour cast without changing exposure.
 */
export function bradfordMatrix(sourceWhite: Xyz, targetWhite: Xyz = D65_WHITE): M3 {
  const scaled = sourceWhite.map((v) => (v * targetWhite[1]) / sourceWhite[1]) as Xyz;
  const s = mulV(BRADFORD, scaled);
  const d = mulV(BRADFORD, targetWhite);
  const diag: M3 = [
    [d[0] / s[0], 0, 0],
    [0, d[1] / s[1], 0],
    [0, 0, d[2] / s[2]],
  ];
  return mulM(BRADFORD_INV, mulM(diag, BRADFORD));
}

export function applyMatrix(m: M3, xyz: Xyz): Xyz {
  return mulV(m, xyz);
}

export type { M3 };

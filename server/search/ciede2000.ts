/**
 * CIEDE2000 (CIE 142-2001) written out by hand for the shade index: the re-rank
 * runs it on tens of thousands of candidates per query, so it avoids objects,
 * allocations and trigonometry where it can. Follows the implementation notes of
 * Sharma, Wu & Dalal (2005), including their hue-mean and hue-difference rules;
 * kL = kC = kH = 1.
 */
const DEG = Math.PI / 180;
const P25_7 = 25 ** 7;
const TWO_PI = 2 * Math.PI;
// Constants of the T term, expanded with multiple-angle identities so it costs one cos and one sin, not four cosines.
const COS30 = Math.cos(30 * DEG);
const SIN30 = Math.sin(30 * DEG);
const COS6 = Math.cos(6 * DEG);
const SIN6 = Math.sin(6 * DEG);
const COS63 = Math.cos(63 * DEG);
const SIN63 = Math.sin(63 * DEG);
const pow7 = (x: number) => {
  const x3 = x * x * x;
  return x3 * x3 * x;
};

export type Lab = { L: number; a: number; b: number };

/** Slots of the kernel's argument block: the reference colour (with its chroma √(a²+b²)), then the result. */
export const K_L = 0;
export const K_A = 1;
export const K_B = 2;
export const K_C = 3;
export const K_OUT = 4;
export const kernelBlock = () => new Float64Array(5);

/**
 * ΔE00 from the reference colour in `k` to colour j of the columns L, A, B, C (C = √(a²+b²), stored so an index
 * need not recompute it); the result goes to k[K_OUT]. The index calls this for every candidate, so it takes only
 * arrays and an integer and returns nothing: a function that is not inlined boxes every floating-point argument
 * and result on the heap, and that garbage (megabytes a query) was costing more than the arithmetic.
 *
 * The hue terms are worked out with vectors instead of angles, which is the same arithmetic without the
 * trigonometry (the re-rank's cost was mostly atan2, sin and cos):
 * - ΔH'² = 4·C1'C2'·sin²(Δh'/2) = 2(C1'C2' − a1'a2' − b1b2), its sign that of Δh' (the cross product a1'b2 − b1a2');
 * - Sharma's hue-mean rule picks the bisector of the shorter arc between h1' and h2', so cos h̄' and sin h̄' are the
 *   components of the normalised sum of the two unit hue vectors;
 * - the rotation term's exp(−((h̄'−275°)/25°)²) is below 1e-21 for h̄' in [0°, 100°], too small to change a
 *   double, so h̄' in degrees (one atan2) is needed only outside that range.
 * Exactly opposite hues (the bisector is undefined there) take the angle route, as Sharma et al. write it.
 */
export function deltaE00Kernel(
  k: Float64Array,
  L: Float64Array,
  A: Float64Array,
  B: Float64Array,
  C: Float64Array,
  j: number,
): void {
  const L1 = k[K_L];
  const a1 = k[K_A];
  const b1 = k[K_B];
  const L2 = L[j];
  const a2 = A[j];
  const b2 = B[j];
  const cBar = (k[K_C] + C[j]) / 2;
  const cBar7 = pow7(cBar);
  const g = 0.5 * (1 - Math.sqrt(cBar7 / (cBar7 + P25_7)));
  const a1p = a1 * (1 + g);
  const a2p = a2 * (1 + g);
  const c1p = Math.sqrt(a1p * a1p + b1 * b1);
  const c2p = Math.sqrt(a2p * a2p + b2 * b2);
  const cProd = c1p * c2p;
  let dH = 0;
  let ch: number;
  let shh: number;
  if (cProd === 0) {
    // An achromatic colour has hue 0 (Sharma note 1) and h̄' = h1' + h2': the other colour's hue, or 0.
    if (c1p !== 0) {
      ch = a1p / c1p;
      shh = b1 / c1p;
    } else if (c2p !== 0) {
      ch = a2p / c2p;
      shh = b2 / c2p;
    } else {
      ch = 1;
      shh = 0;
    }
  } else {
    const cross = a1p * b2 - b1 * a2p;
    const dot = a1p * a2p + b1 * b2;
    if (cross === 0 && dot < 0) {
      angleRoute(a1p, b1, a2p, b2, c1p, c2p);
      dH = ANGLES[0];
      ch = ANGLES[1];
      shh = ANGLES[2];
    } else {
      const ux = a1p / c1p + a2p / c2p;
      const uy = b1 / c1p + b2 / c2p;
      const n = Math.sqrt(ux * ux + uy * uy);
      const dH2 = 2 * (cProd - dot);
      dH = dH2 <= 0 ? 0 : cross < 0 ? -Math.sqrt(dH2) : Math.sqrt(dH2);
      ch = ux / n;
      shh = uy / n;
    }
  }
  const dL = L2 - L1;
  const dC = c2p - c1p;
  const lBar = (L1 + L2) / 2;
  const cBarP = (c1p + c2p) / 2;
  // T = 1 − 0.17 cos(h̄−30°) + 0.24 cos 2h̄ + 0.32 cos(3h̄+6°) − 0.20 cos(4h̄−63°)
  const cos2 = 2 * ch * ch - 1;
  const sin2 = 2 * shh * ch;
  const cos3 = ch * (4 * ch * ch - 3);
  const sin3 = shh * (3 - 4 * shh * shh);
  const cos4 = 2 * cos2 * cos2 - 1;
  const sin4 = 2 * sin2 * cos2;
  const t =
    1 -
    0.17 * (ch * COS30 + shh * SIN30) +
    0.24 * cos2 +
    0.32 * (cos3 * COS6 - sin3 * SIN6) -
    0.2 * (cos4 * COS63 + sin4 * SIN63);
  const lm = (lBar - 50) * (lBar - 50);
  const sl = 1 + (0.015 * lm) / Math.sqrt(20 + lm);
  const sc = 1 + 0.045 * cBarP;
  const sh = 1 + 0.015 * cBarP * t;
  const x = dL / sl;
  const y = dC / sc;
  const z = dH / sh;
  let rt = 0;
  if (shh < 0 || ch < COS100) {
    // h̄' in degrees on [0°, 360°), as the formula's Gaussian in (h̄' − 275°) reads it (not wrapped).
    let hDeg = Math.atan2(shh, ch) / DEG;
    if (hDeg < 0) hDeg += 360;
    const hd = (hDeg - 275) / 25;
    const dTheta = 30 * DEG * Math.exp(-hd * hd);
    const cBarP7 = pow7(cBarP);
    rt = -2 * Math.sqrt(cBarP7 / (cBarP7 + P25_7)) * Math.sin(2 * dTheta);
  }
  k[K_OUT] = Math.sqrt(x * x + y * y + z * z + rt * y * z);
}

// cos 100°: within h̄' ∈ [0°, 100°] the rotation term is negligible (see deltaE00Kernel).
const COS100 = Math.cos(100 * DEG);

/** ΔH', cos h̄', sin h̄' through angles, as Sharma et al. (2005) write them: for exactly opposite hues. */
const ANGLES = new Float64Array(3);
function angleRoute(a1p: number, b1: number, a2p: number, b2: number, c1p: number, c2p: number): void {
  let h1p = Math.atan2(b1, a1p);
  if (h1p < 0) h1p += TWO_PI;
  let h2p = Math.atan2(b2, a2p);
  if (h2p < 0) h2p += TWO_PI;
  let dh = h2p - h1p;
  if (dh > Math.PI) dh -= TWO_PI;
  else if (dh < -Math.PI) dh += TWO_PI;
  let hBar = h1p + h2p;
  if (Math.abs(h1p - h2p) <= Math.PI) hBar /= 2;
  else hBar = hBar < TWO_PI ? (hBar + TWO_PI) / 2 : (hBar - TWO_PI) / 2;
  ANGLES[0] = 2 * Math.sqrt(c1p * c2p) * Math.sin(dh / 2);
  ANGLES[1] = Math.cos(hBar);
  ANGLES[2] = Math.sin(hBar);
}

const ONE = {
  k: kernelBlock(),
  L: new Float64Array(1),
  A: new Float64Array(1),
  B: new Float64Array(1),
  C: new Float64Array(1),
};

/** ΔE00 between a reference (standard) and a sample. */
export function deltaE00(ref: Lab, sample: Lab): number {
  const { k, L, A, B, C } = ONE;
  k[K_L] = ref.L;
  k[K_A] = ref.a;
  k[K_B] = ref.b;
  k[K_C] = Math.sqrt(ref.a * ref.a + ref.b * ref.b);
  L[0] = sample.L;
  A[0] = sample.a;
  B[0] = sample.b;
  C[0] = Math.sqrt(sample.a * sample.a + sample.b * sample.b);
  deltaE00Kernel(k, L, A, B, C, 0);
  return k[K_OUT];
}

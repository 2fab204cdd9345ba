/**
 * Lower and upper bounds on CIEDE2000 from one query colour to EVERY colour in
 * an axis-aligned L*a*b* box (a grid cell or a block of cells). The shade index
 * walks its grid with them: blocks whose lower bound exceeds the radius are
 * skipped, so the walk follows the real shape of the ΔE00 tolerance region (long
 * along chroma, short along hue, tilted near blue) instead of the round
 * ellipsoid of shade-bounds.ts; cells whose upper bound is within the radius
 * match as a whole. It is interval arithmetic on the formula's own terms
 * (CIE 142-2001; Sharma, Wu & Dalal 2005):
 *
 *   ΔE00² = (ΔL'/SL)² + x² + y² + RT·x·y,   x = ΔC'/SC,  y = ΔH'/SH.
 *
 * 1. RT = −sin(2Δθ)·RC ≤ 0, with |RT| between a smallest and a largest value
 *    (below). Where the signs of ΔC' and ΔH' are known and opposite, the sum is
 *    x² + y² + |RT|·|x|·|y|; where they are known and equal, x² + y² − |RT|·|x|·|y|;
 *    otherwise it lies between x² + y² ∓ |RT|max·|x|·|y|. Each is bounded over
 *    the box of |x|, |y| exactly: increasing forms at the box's corners, the
 *    convex u² + v² − R·u·v at its corners (largest) or on its edges (smallest).
 * 2. Each term is bounded separately over the box, which is safe because every
 *    term lies between its own extremes at every point. The lightness term
 *    depends only on L* and the rest only on a*, b*, so the index works them out
 *    once per L* slice and once per a*b* rectangle (lightnessTerms, chromaHueTerms)
 *    and adds them.
 *    - |ΔL'| lies between the gap from the query's L* to the box and the far
 *      edge; SL (growing with |L̄ − 50|) between its values at the mean
 *      lightnesses closest to and furthest from 50.
 *    - C2 (unprimed chroma) lies between the box's nearest and furthest points
 *      from the a*b* origin, so C̄ does, and G (decreasing in C̄) lies in
 *      [G(C̄max), G(C̄min)]: s = 1 + G ∈ [s_lo, s_hi]. The query's C1' and the
 *      box's primed rectangle (a' = a·s) follow, so |ΔC'| lies between the gap
 *      and the spread of the C1' and C2' ranges, and SC = 1 + 0.045·C̄' between
 *      its values at C̄'min and C̄'max.
 *    - ΔH' = 2√(C1'C2')·sin(|Δh'|/2), with |Δh'| between the angular gap and
 *      spread of the query's primed hue (a short arc as s varies) and the
 *      rectangle's hue arc (< 180° when it does not hold the origin; a
 *      rectangle that holds the origin gives no hue information: 0 to 180°).
 *    - The mean hue h̄' is the bisector of the shorter arc from h1' to h2'
 *      (Sharma's rule), so it lies in the arc of half-sums of the two hue
 *      ranges, or within 90° of the query's hue when h2' may be opposite it.
 *      Over that arc T lies between its smallest and largest values (T_BIN_MIN,
 *      T_BIN_MAX: sampled every 0.1° and padded by T's slope bound 2.41/rad),
 *      T > 0, so SH = 1 + 0.015·C̄'·T lies between its values at the extremes;
 *      Δθ ≤ 30°·exp(−(d/25°)²) with d the circular distance from the arc to
 *      275° (the formula's linear |h̄' − 275°| is never smaller); and
 *      |RT| ≤ RC(C̄'max)·sin 2Δθmax. Likewise |RT| ≥ RC(C̄'min)·sin 2Δθmin with
 *      Δθmin from the arc's point furthest from 275° on [0°, 360°) (0 when the
 *      arc crosses 0°).
 *    When the query is achromatic (C1' = 0), ΔH' = 0 and h̄' = h2'.
 * Lower bounds are shrunk and upper bounds grown by a hair for floating-point
 * rounding. Checked against exact ΔE00 at random points of random boxes in
 * tests/unit/box-bound.test.ts.
 */
const DEG = Math.PI / 180;
const P25_7 = 25 ** 7;

const tOf = (hDeg: number) => {
  const h = hDeg * DEG;
  return (
    1 -
    0.17 * Math.cos(h - 30 * DEG) +
    0.24 * Math.cos(2 * h) +
    0.32 * Math.cos(3 * h + 6 * DEG) -
    0.2 * Math.cos(4 * h - 63 * DEG)
  );
};
// |dT/dh| ≤ 0.17 + 2·0.24 + 3·0.32 + 4·0.20 = 2.41 per radian; samples every 0.1° leave at most 0.05° to a true maximum.
const T_PAD = 2.41 * 0.05 * DEG;
const T_BIN_MAX = new Float64Array(360);
for (let i = 0; i < 360; i++) {
  let m = -Infinity;
  for (let j = 0; j <= 10; j++) m = Math.max(m, tOf(i + j / 10));
  T_BIN_MAX[i] = m + T_PAD;
}
const T_BIN_MIN = new Float64Array(360);
for (let i = 0; i < 360; i++) {
  let m = Infinity;
  for (let j = 0; j <= 10; j++) m = Math.min(m, tOf(i + j / 10));
  T_BIN_MIN[i] = m - T_PAD;
}
const T_MAX_ALL = Math.max(...T_BIN_MAX);
const T_MIN_ALL = Math.min(...T_BIN_MIN);

/** Largest and smallest T over the hue arc [start, start + width] (degrees). */
function tOver(start: number, width: number): void {
  if (width >= 60) {
    tMax = T_MAX_ALL;
    tMin = T_MIN_ALL;
    return;
  }
  tMax = -Infinity;
  tMin = Infinity;
  for (let i = Math.floor(start), end = Math.floor(start + width); i <= end; i++) {
    const bin = ((i % 360) + 360) % 360;
    if (T_BIN_MAX[bin] > tMax) tMax = T_BIN_MAX[bin];
    if (T_BIN_MIN[bin] < tMin) tMin = T_BIN_MIN[bin];
  }
}
let tMax = 0;
let tMin = 0;

const wrap180 = (deg: number) => {
  let d = deg % 360;
  if (d > 180) d -= 360;
  else if (d <= -180) d += 360;
  return d;
};
const pow7 = (x: number) => {
  const x3 = x * x * x;
  return x3 * x3 * x;
};
const gOf = (cBar: number) => {
  const c7 = pow7(cBar);
  return 0.5 * (1 - Math.sqrt(c7 / (c7 + P25_7)));
};
const rcOf = (cBarP: number) => {
  const c7 = pow7(cBarP);
  return 2 * Math.sqrt(c7 / (c7 + P25_7));
};
const slOf = (lBar: number) => {
  const m = (lBar - 50) * (lBar - 50);
  return 1 + (0.015 * m) / Math.sqrt(20 + m);
};
const norm = (x: number, y: number) => Math.sqrt(x * x + y * y);
/** Distance from the origin to the nearest and the furthest point of a rectangle. */
const nearest = (x0: number, x1: number, y0: number, y1: number) =>
  norm(x0 > 0 ? x0 : x1 < 0 ? -x1 : 0, y0 > 0 ? y0 : y1 < 0 ? -y1 : 0);
const furthest = (x0: number, x1: number, y0: number, y1: number) => norm(Math.max(-x0, x1), Math.max(-y0, y1));

/** Circular distance (degrees) from `point` to the arc [start, start + width]. */
function arcDistance(point: number, start: number, width: number): number {
  if (width >= 360) return 0;
  const u = (((point - start) % 360) + 360) % 360;
  return u <= width ? 0 : Math.min(u - width, 360 - u);
}

export type BoundQuery = { L: number; a: number; b: number; C: number; hRef: number };
export const boundQuery = (L: number, a: number, b: number): BoundQuery => ({
  L,
  a,
  b,
  C: norm(a, b),
  hRef: Math.atan2(b, a) / DEG,
});

/** A pair of bounds on squared terms of ΔE00, written by the functions below (reused, so the walk allocates nothing). */
export type Terms = { lo: number; hi: number };

/** Bounds on (ΔL'/SL)² over the L* slice [L0, L1]. */
export function lightnessTerms(q: BoundQuery, L0: number, L1: number, out: Terms): void {
  const dL = L0 > q.L ? L0 - q.L : L1 < q.L ? q.L - L1 : 0;
  const dLMax = Math.max(Math.abs(L0 - q.L), Math.abs(L1 - q.L));
  const mLo = (q.L + L0) / 2 - 50;
  const mHi = (q.L + L1) / 2 - 50;
  const slMax = slOf(50 + Math.max(Math.abs(mLo), Math.abs(mHi)));
  const slMin = slOf(50 + (mLo <= 0 && mHi >= 0 ? 0 : Math.min(Math.abs(mLo), Math.abs(mHi))));
  out.lo = (dL / slMax) * (dL / slMax);
  out.hi = (dLMax / slMin) * (dLMax / slMin);
}

/** Corner hue (degrees) of the primed rectangle, relative to `centre`. */
const relHue = (x: number, y: number, centre: number) => wrap180(Math.atan2(y, x) / DEG - centre);
const circ = (x: number, y: number) => Math.abs(wrap180(x - y));

/** Bounds on x² + y² + RT·x·y (the chroma and hue part of ΔE00²) over the a*b* rectangle [a0, a1] × [b0, b1]. */
export function chromaHueTerms(q: BoundQuery, a0: number, a1: number, b0: number, b1: number, out: Terms): void {
  // Chroma, through G's range over the rectangle.
  const sLo = 1 + gOf((q.C + furthest(a0, a1, b0, b1)) / 2);
  const sHi = 1 + gOf((q.C + nearest(a0, a1, b0, b1)) / 2);
  const c1Lo = norm(q.a * sLo, q.b);
  const c1Hi = norm(q.a * sHi, q.b);
  const pa0 = Math.min(a0 * sLo, a0 * sHi);
  const pa1 = Math.max(a1 * sLo, a1 * sHi);
  const c2Lo = nearest(pa0, pa1, b0, b1);
  const c2Hi = furthest(pa0, pa1, b0, b1);
  const dC = Math.max(0, c2Lo - c1Hi, c1Lo - c2Hi);
  const dCMax = Math.max(c2Hi - c1Lo, c1Hi - c2Lo);
  const cBarPMax = (c1Hi + c2Hi) / 2;
  const cBarPMin = (c1Lo + c2Lo) / 2;

  // Hue: the gap |Δh'| and its largest value, and the arc [hStart, hStart + hWidth] holding h̄' (degrees).
  let dh = 0;
  let dhMax = 180;
  // The sign of ΔH' (that of Δh') when the whole rectangle lies on one side of the query's hue; 0 when unknown.
  let hueSign = 0;
  let hStart = 0;
  let hWidth = 360;
  if (!(pa0 <= 0 && pa1 >= 0 && b0 <= 0 && b1 >= 0)) {
    // The rectangle's hue arc, relative to its centre's hue (its corners bound it; it spans < 180°).
    const centre = Math.atan2((b0 + b1) / 2, (pa0 + pa1) / 2) / DEG;
    const r00 = relHue(pa0, b0, centre);
    const r01 = relHue(pa0, b1, centre);
    const r10 = relHue(pa1, b0, centre);
    const r11 = relHue(pa1, b1, centre);
    const lo = Math.min(r00, r01, r10, r11);
    const hi = Math.max(r00, r01, r10, r11);
    if (q.C === 0) {
      hStart = centre + lo;
      hWidth = hi - lo;
    } else {
      const rLo = wrap180(centre - q.hRef) + lo;
      const rHi = rLo + (hi - lo);
      // The query's primed hue as s runs over [sLo, sHi], relative to its unprimed hue.
      const e0 = wrap180(Math.atan2(q.b, q.a * sLo) / DEG - q.hRef);
      const e1 = wrap180(Math.atan2(q.b, q.a * sHi) / DEG - q.hRef);
      const qLo = Math.min(e0, e1);
      const qHi = Math.max(e0, e1);
      if (rLo - qHi > -179 && rHi - qLo < 179) {
        // No pair is near-opposite: Δh' = h2' − h1' without wrapping, h̄' = (h1' + h2')/2.
        const dLo = rLo - qHi;
        const dHi = rHi - qLo;
        dh = dLo <= 0 && dHi >= 0 ? 0 : Math.min(Math.abs(dLo), Math.abs(dHi));
        dhMax = Math.max(Math.abs(dLo), Math.abs(dHi));
        hueSign = dLo > 0 ? 1 : dHi < 0 ? -1 : 0;
        hStart = q.hRef + (qLo + rLo) / 2;
        hWidth = (qHi + rHi) / 2 - (qLo + rLo) / 2;
      } else {
        // Some h2' may be opposite h1': the gap is the circular one, and h̄' is only known to lie within 90° of h1'.
        dh = Math.min(circ(rLo, qLo), circ(rLo, qHi), circ(rHi, qLo), circ(rHi, qHi));
        hStart = q.hRef + qLo - 90;
        hWidth = qHi - qLo + 180;
      }
    }
  }
  const dH = q.C === 0 ? 0 : 2 * Math.sqrt(c1Lo * c2Lo) * Math.sin((Math.min(dh, 180) * DEG) / 2);
  const dHMax = q.C === 0 ? 0 : 2 * Math.sqrt(c1Hi * c2Hi) * Math.sin((Math.min(dhMax, 180) * DEG) / 2);
  tOver(hStart, hWidth);
  const d = arcDistance(275, hStart, hWidth) / 25;
  const rt = rcOf(cBarPMax) * Math.sin(60 * DEG * Math.exp(-d * d));
  // The smallest |RT|: Δθ at the arc's point furthest from 275° in the formula's own linear sense (h̄' on [0°, 360°));
  // none when the arc is wide or crosses 0°, where h̄' may be 0 (|h̄' − 275°| = 275°, Δθ ≈ 0).
  const s0 = ((hStart % 360) + 360) % 360;
  const far =
    hWidth >= 360 || s0 + hWidth >= 360 ? Infinity : Math.max(Math.abs(s0 - 275), Math.abs(s0 + hWidth - 275)) / 25;
  const rtMin = far === Infinity ? 0 : rcOf(cBarPMin) * Math.sin(60 * DEG * Math.exp(-far * far));
  // |x| and |y| ranges; RT ≤ 0 always, so the cross term RT·x·y is ≥ 0 when ΔC' and ΔH' have opposite signs.
  const x = dC / (1 + 0.045 * cBarPMax);
  const y = dH / (1 + 0.015 * cBarPMax * tMax);
  const xMax = dCMax / (1 + 0.045 * cBarPMin);
  const yMax = dHMax / (1 + 0.015 * cBarPMin * tMin);
  const signs = (c2Lo > c1Hi ? 1 : c2Hi < c1Lo ? -1 : 0) * hueSign;
  out.lo = signs < 0 ? x * x + y * y + rtMin * x * y : minTiltedForm(x, xMax, y, yMax, rt);
  out.hi = signs > 0 ? maxTiltedForm(x, xMax, y, yMax, rtMin) : xMax * xMax + yMax * yMax + rt * xMax * yMax;
}

// Module-level helpers, not closures made per call: the walk calls these thousands of times a query.
const tilted = (u: number, v: number, R: number) => u * u + v * v - R * u * v;
const clamp = (t: number, lo: number, hi: number) => (t < lo ? lo : t > hi ? hi : t);

/** Largest u² + v² − R·u·v over the same box: a convex function, so at a corner. */
function maxTiltedForm(u0: number, u1: number, v0: number, v1: number, R: number): number {
  return Math.max(tilted(u0, v0, R), tilted(u0, v1, R), tilted(u1, v0, R), tilted(u1, v1, R));
}

/**
 * Smallest u² + v² − R·u·v over u ∈ [u0, u1], v ∈ [v0, v1] (u, v ≥ 0, 0 ≤ R < 2): the form is convex with its
 * minimum at the origin, so off the origin the box's minimum lies on one of its edges, each a 1-D quadratic.
 */
function minTiltedForm(u0: number, u1: number, v0: number, v1: number, R: number): number {
  if (u0 === 0 && v0 === 0) return 0;
  return Math.max(
    0,
    Math.min(
      tilted(u0, clamp((R * u0) / 2, v0, v1), R),
      tilted(u1, clamp((R * u1) / 2, v0, v1), R),
      tilted(clamp((R * v0) / 2, u0, u1), v0, R),
      tilted(clamp((R * v1) / 2, u0, u1), v1, R),
    ),
  );
}

const SHRINK = 1 - 1e-9;
const GROW = 1 + 1e-9;
/** ΔE00 bounds from the two parts' squared bounds, padded for rounding. */
export const lowerBound = (lightLo: number, chromaHueLo: number) => Math.sqrt(lightLo + chromaHueLo) * SHRINK;
export const upperBound = (lightHi: number, chromaHueHi: number) => Math.sqrt(lightHi + chromaHueHi) * GROW + 1e-12;

const scratchL: Terms = { lo: 0, hi: 0 };
const scratchAB: Terms = { lo: 0, hi: 0 };
/** Both bounds for a whole box (tests; the index combines the parts itself). */
export function boxBounds(
  q: BoundQuery,
  L0: number,
  L1: number,
  a0: number,
  a1: number,
  b0: number,
  b1: number,
): { lower: number; upper: number } {
  lightnessTerms(q, L0, L1, scratchL);
  chromaHueTerms(q, a0, a1, b0, b1, scratchAB);
  return { lower: lowerBound(scratchL.lo, scratchAB.lo), upper: upperBound(scratchL.hi, scratchAB.hi) };
}

/**
 * The conservative prefilter box for shade search: given a query colour and a
 * ΔE00 radius r, half-widths (in L*, a*, b*) of a box that holds EVERY colour
 * whose CIEDE2000 difference from the query is ≤ r. CIEDE2000 is not bounded by
 * the Euclidean L*a*b* distance (a naive ±r box misses most matches), so the
 * bound is derived from the formula's own terms:
 *
 *   ΔE00² = (ΔL'/SL)² + Q,  Q = (ΔC'/SC)² + (ΔH'/SH)² + RT·(ΔC'/SC)(ΔH'/SH).
 *
 * Lightness. Q ≥ 0, so |ΔL| ≤ r·SL(L̄) with L̄ = (L1+L2)/2. SL grows with |L̄−50|
 * (slope ≤ 0.0164 per unit), so the extent is the fixed point of
 * h ← r·SL(worst L̄ in [L1−h, L1+h]/midpoint), reached by iterating from h = r.
 *
 * Chroma plane. With x = ΔC'/SC, y = ΔH'/SH the form x² + y² + RT·x·y has its
 * smallest eigenvalue k = 1 − |RT|/2; |RT| = RC·sin(2Δθ) ≤ 2·sin 60° (Δθ ≤ 30°),
 * so k ≥ 1 − sin 60° ≈ 0.134. SH ≤ SC everywhere (T ≤ 1.93 < 3), and
 * ΔC'² + ΔH'² = d'², the Euclidean distance in the primed (a'=a(1+G), b) plane
 * (G is shared by the pair). Hence a match has d' ≤ r·SC/√k. SC = 1 + 0.045·C̄'
 * and C̄' ≤ C1' + d'/2 (triangle inequality in the primed plane), which gives
 *
 *   d' ≤ r(1 + 0.045·C1')/√k / (1 − 0.0225·r/√k)      (∞ when the divisor ≤ 0).
 *
 * a' = a(1+G) with G ≥ 0, so |Δa| ≤ d' and |Δb| ≤ d': the box half-width D in
 * a* and b* is that d'. It is then tightened by iterating: inside the box just
 * found, bound G from below-chroma (G ≤ G(C̄ab,min), which bounds C1'), bound
 * RC from C̄' ≤ C1' + D/2, and bound Δθ from how close the possible hue means
 * h̄' come to 275° (if the box, stretched by 1+G in a*, contains the a*b*
 * origin, h̄' is still within 90° of the query's hue). Each step uses only facts true for every match
 * inside the previous box, so every box is safe and we keep the smallest.
 *
 * Ellipsoid. The box's corners are not reachable together: a match has
 * (ΔL/hwL)² + (Δa² + Δb²)/hwAB² ≤ 1. Proof: write u = ΔL/SL, so Q ≤ r² − u²
 * =: ρ². The chroma argument above with ρ in place of r (its constants k, G, SC
 * bounds are facts about the same box) gives d' ≤ F(ρ) with
 * F(ρ) = ρ·A/(1 − Bρ); F(ρ)/ρ grows with ρ, so d' ≤ (ρ/r)·F(r) = (ρ/r)·hwAB.
 * √(Δa² + Δb²) ≤ d' (a' = a(1+G)), and SL ≤ hwL/r inside the box, so
 * (ΔL/hwL)² ≤ u²/r². Adding: ≤ u²/r² + ρ²/r² = 1. The index skips grid cells
 * and colours outside it. The same steps with any t ≤ r in place of r (ΔE00 = t)
 * give (ΔL/hwL)² + (Δa² + Δb²)/hwAB² ≤ t²/r²: inside the box, ΔE00 ≥ r·e with e
 * the ellipsoid norm, a lower bound the index uses to skip colours that cannot
 * beat their piece's best.
 */
const DEG = Math.PI / 180;
const P25_7 = 25 ** 7;
export const K_MIN = 1 - Math.sin(60 * DEG);

const gOf = (cBarAb: number) => {
  const c7 = cBarAb ** 7;
  return 0.5 * (1 - Math.sqrt(c7 / (c7 + P25_7)));
};
const rcOf = (cBarP: number) => {
  const c7 = cBarP ** 7;
  return 2 * Math.sqrt(c7 / (c7 + P25_7));
};
const slOf = (lBar: number) => {
  const m = (lBar - 50) * (lBar - 50);
  return 1 + (0.015 * m) / Math.sqrt(20 + m);
};
const wrap180 = (deg: number) => {
  let d = deg % 360;
  if (d > 180) d -= 360;
  else if (d <= -180) d += 360;
  return d;
};

export type ShadeBox = { hwL: number; hwAB: number };

/** Half-width in L*: the fixed point of h = r·SL(worst mean lightness within ±h). */
export function lightnessHalfWidth(L1: number, r: number): number {
  let h = r;
  for (let i = 0; i < 60; i++) {
    // The worst L̄ is the one furthest from 50 among L̄ = L1 + t/2, |t| ≤ h.
    const worst = Math.max(Math.abs(L1 - h / 2 - 50), Math.abs(L1 + h / 2 - 50));
    const next = r * slOf(50 + worst);
    if (next - h < 1e-12) return next;
    h = next;
  }
  return h;
}

/**
 * Largest Δθ (radians) possible for a match inside the primed box
 * [aLo,aHi]×[bLo,bHi], which holds the query. The hue mean h̄' lies along the
 * short arc between the two hues, so it is always within 90° of the query's
 * primed hue (whose range over 1+G ∈ [1, s] is [qLo, qHi] relative to hRef);
 * when the box is clear of the origin it spans < 180° and h̄' stays inside the
 * box's own hue span.
 */
function maxDeltaTheta(
  aLo: number,
  aHi: number,
  bLo: number,
  bHi: number,
  hRefDeg: number,
  qLo: number,
  qHi: number,
): number {
  let mn = qLo - 90;
  let mx = qHi + 90;
  if (!(aLo <= 0 && aHi >= 0 && bLo <= 0 && bHi >= 0)) {
    let cmn = 0;
    let cmx = 0;
    for (const [a, b] of [
      [aLo, bLo],
      [aLo, bHi],
      [aHi, bLo],
      [aHi, bHi],
    ]) {
      const rel = wrap180(Math.atan2(b, a) / DEG - hRefDeg);
      if (rel < cmn) cmn = rel;
      if (rel > cmx) cmx = rel;
    }
    mn = Math.max(mn, cmn);
    mx = Math.min(mx, cmx);
  }
  const to275Lo = wrap180(275 - (hRefDeg + mn));
  const span = mx - mn;
  const inside = to275Lo >= 0 && to275Lo <= span;
  const dist = inside ? 0 : Math.min(Math.abs(to275Lo), Math.abs(wrap180(275 - (hRefDeg + mx))));
  // Circular distance ≤ the formula's linear |h̄'−275|, so this over-estimates Δθ: safe.
  return 30 * DEG * Math.exp(-((dist / 25) ** 2));
}

/** Half-width D in a* and b* (see the module comment). Infinity means "no useful bound": scan everything. */
export function chromaHalfWidth(a1: number, b1: number, r: number): number {
  const c1ab = Math.hypot(a1, b1);
  const hRef = Math.atan2(b1, a1) / DEG;
  let best = Infinity;
  let k = K_MIN;
  let gMax = 0.5;
  for (let i = 0; i < 12; i++) {
    const sk = Math.sqrt(k);
    const c1p = Math.hypot(a1 * (1 + gMax), b1);
    const div = 1 - (0.0225 * r) / sk;
    const d = div <= 0 ? Infinity : (r * (1 + 0.045 * c1p)) / sk / div;
    if (d < best) best = d;
    if (!Number.isFinite(best)) return Infinity;
    // Facts valid for every match inside the box of half-width `best`:
    const c2abMin = Math.max(0, c1ab - best);
    gMax = gOf((c1ab + c2abMin) / 2);
    const s = 1 + gMax;
    const aLo = a1 - best;
    const aHi = a1 + best;
    const paLo = Math.min(aLo, aLo * s);
    const paHi = Math.max(aHi, aHi * s);
    const c1pMax = Math.hypot(a1 * s, b1);
    const qRel = wrap180(Math.atan2(b1, a1 * s) / DEG - hRef);
    const dTheta = maxDeltaTheta(paLo, paHi, b1 - best, b1 + best, hRef, Math.min(0, qRel), Math.max(0, qRel));
    const rt = rcOf(c1pMax + best / 2) * Math.sin(2 * dTheta);
    k = Math.max(K_MIN, 1 - rt / 2);
  }
  return best;
}

/** The full box, padded by a hair for floating-point rounding. */
export function shadeBox(q: { L: number; a: number; b: number }, r: number): ShadeBox {
  const pad = 1e-6;
  return { hwL: lightnessHalfWidth(q.L, r) * (1 + pad) + pad, hwAB: chromaHalfWidth(q.a, q.b, r) * (1 + pad) + pad };
}

/** Whether an offset from the query lies in the ellipsoid inscribed in the box (see the module comment); every match does. */
export function inShadeEllipsoid(box: ShadeBox, dL: number, da: number, db: number): boolean {
  return (dL * dL) / (box.hwL * box.hwL) + (da * da + db * db) / (box.hwAB * box.hwAB) <= 1 + 1e-9;
}

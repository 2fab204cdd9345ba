/**
 * CIEDE2000 (CIE 142-2001) written out by hand for the shade index: the re-rank
 * runs it on tens of thousands of candidates per query, so it avoids objects,
 * allocations and degree/radian round trips. Follows the implementation notes of
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

/** ΔE00 between two colours given as numbers; `c1`/`c2` are the unprimed chromas √(a²+b²), passed in so an index can store them. */
export function deltaE00Raw(L1: number, a1: number, b1: number, c1: number, L2: number, a2: number, b2: number, c2: number): number {
  const cBar = (c1 + c2) / 2;
  const cBar7 = pow7(cBar);
  const g = 0.5 * (1 - Math.sqrt(cBar7 / (cBar7 + P25_7)));
  const a1p = a1 * (1 + g);
  const a2p = a2 * (1 + g);
  const c1p = Math.sqrt(a1p * a1p + b1 * b1);
  const c2p = Math.sqrt(a2p * a2p + b2 * b2);
  // Hue angles in radians, in [0, 2π); 0 for an achromatic colour (Sharma note 1).
  let h1p = c1p === 0 ? 0 : Math.atan2(b1, a1p);
  if (h1p < 0) h1p += TWO_PI;
  let h2p = c2p === 0 ? 0 : Math.atan2(b2, a2p);
  if (h2p < 0) h2p += TWO_PI;

  const dL = L2 - L1;
  const dC = c2p - c1p;
  const cProd = c1p * c2p;
  let dh = 0;
  let hBar = h1p + h2p;
  if (cProd !== 0) {
    dh = h2p - h1p;
    if (dh > Math.PI) dh -= TWO_PI;
    else if (dh < -Math.PI) dh += TWO_PI;
    const diff = Math.abs(h1p - h2p);
    if (diff <= Math.PI) hBar /= 2;
    else hBar = hBar < TWO_PI ? (hBar + TWO_PI) / 2 : (hBar - TWO_PI) / 2;
  }
  const dH = 2 * Math.sqrt(cProd) * Math.sin(dh / 2);

  const lBar = (L1 + L2) / 2;
  const cBarP = (c1p + c2p) / 2;
  // T = 1 − 0.17 cos(h̄−30°) + 0.24 cos 2h̄ + 0.32 cos(3h̄+6°) − 0.20 cos(4h̄−63°)
  const ch = Math.cos(hBar);
  const shh = Math.sin(hBar);
  const cos2 = 2 * ch * ch - 1;
  const sin2 = 2 * shh * ch;
  const cos3 = ch * (4 * ch * ch - 3);
  const sin3 = shh * (3 - 4 * shh * shh);
  const cos4 = 2 * cos2 * cos2 - 1;
  const sin4 = 2 * sin2 * cos2;
  const t = 1 - 0.17 * (ch * COS30 + shh * SIN30) + 0.24 * cos2 + 0.32 * (cos3 * COS6 - sin3 * SIN6) - 0.2 * (cos4 * COS63 + sin4 * SIN63);
  const lm = (lBar - 50) * (lBar - 50);
  const sl = 1 + (0.015 * lm) / Math.sqrt(20 + lm);
  const sc = 1 + 0.045 * cBarP;
  const sh = 1 + 0.015 * cBarP * t;
  const hd = (hBar / DEG - 275) / 25;
  const dTheta = 30 * DEG * Math.exp(-hd * hd);
  const cBarP7 = pow7(cBarP);
  const rt = -2 * Math.sqrt(cBarP7 / (cBarP7 + P25_7)) * Math.sin(2 * dTheta);
  const x = dL / sl;
  const y = dC / sc;
  const z = dH / sh;
  return Math.sqrt(x * x + y * y + z * z + rt * y * z);
}

/** ΔE00 between a reference (standard) and a sample. */
export function deltaE00(ref: Lab, sample: Lab): number {
  return deltaE00Raw(ref.L, ref.a, ref.b, Math.hypot(ref.a, ref.b), sample.L, sample.a, sample.b, Math.hypot(sample.a, sample.b));
}

import { deltaE00, labToHex, shadeName, tradeShade, type Lab } from '../../shared/colour/index.ts';
import { backgroundColours } from './background.ts';
import { decode, linearToLab } from './fast-lab.ts';

/**
 * Interleaved sRGB pixels (3 channels) on 0–255: 8-bit as sharp's .raw() gives them, or
 * fractional and unclipped (below 0 or above 255 for colours outside sRGB) from a photo read
 * through its ICC profile.
 */
export type RawImage = { data: Uint8Array | Float32Array; width: number; height: number };
export type Rect = { x: number; y: number; w: number; h: number };

export type PaletteOptions = {
  maxColours?: number;
  /** Clusters below this share of the analysed area are folded into their nearest neighbour. */
  minShare?: number;
  /** Clusters closer than this ΔE00 are merged. */
  mergeDeltaE?: number;
  /** Rectangles (in this image's pixels) left out of the analysis. */
  exclude?: Rect[];
  /** Mark near-neutral colours that dominate the border and touch it as background. */
  detectBackground?: boolean;
  seed?: number;
};

export type ExtractedColour = {
  lab: Lab;
  hex: string;
  /** Share of the analysed area without background (non-background shares sum to 1); for background colours, share of the whole analysed area. */
  share: number;
  /** Share of the whole analysed area, background included. */
  areaShare: number;
  /** RMS ΔE*ab of the pixels assigned to this colour around it. */
  spread: number;
  name: string;
  tradeName: string | null;
  background: boolean;
};

const INITIAL_K = 16;
const ITERATIONS = 12;
// Histogram bins per channel: 64 steps of 4 code values over 0–255, and beyond them 8 coarser
// bins (16 code values each) on either side for colours outside sRGB.
const EXTRA = 8;
const PER_CHANNEL = 64 + 2 * EXTRA;
const BINS = PER_CHANNEL ** 3;
const U8_BIN = Int32Array.from({ length: 256 }, (_, v) => EXTRA + (v >> 2));
const binOfValue = (v: number) =>
  v < 0
    ? EXTRA - 1 - Math.min(EXTRA - 1, (-v / 16) | 0)
    : v < 256
      ? EXTRA + (v >> 2)
      : EXTRA + 64 + Math.min(EXTRA - 1, ((v - 256) / 16) | 0);

/** A small deterministic PRNG (mulberry32) so the same photo always gives the same palette. */
function rng(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

type Hist = { n: number; w: Float64Array; lab: Float64Array; rgb: Float64Array; pixelBin: Int32Array; total: number };

// Scratch tables reused between calls (extraction is synchronous, so never shared):
// only the bins a call touched are cleared again, much cheaper than allocating.
const count = new Uint32Array(BINS);
const sums = new Float64Array(BINS * 3);
const binOf = new Int32Array(BINS);
let pixelScratch = new Int32Array(0);

/**
 * Colour histogram of the non-excluded pixels: per occupied bin its pixel count, mean sRGB and
 * the L*a*b* of that mean. pixelBin gives each pixel's raw bin (-1 when excluded); binOf maps
 * a raw bin to its index among the occupied bins.
 */
function histogram(img: RawImage, mask: Uint8Array | null): Hist {
  const { data, width, height } = img;
  const pixels = width * height;
  if (pixelScratch.length < pixels) pixelScratch = new Int32Array(pixels);
  const pixelBin = pixelScratch;
  const occupied: number[] = [];
  let total = 0;
  const u8 = data instanceof Uint8Array;
  for (let p = 0, i = 0; p < pixels; p++, i += 3) {
    if (mask !== null && mask[p] === 1) {
      pixelBin[p] = -1;
      continue;
    }
    const r = data[i],
      g = data[i + 1],
      b = data[i + 2];
    const bin = u8
      ? (U8_BIN[r] * PER_CHANNEL + U8_BIN[g]) * PER_CHANNEL + U8_BIN[b]
      : (binOfValue(r) * PER_CHANNEL + binOfValue(g)) * PER_CHANNEL + binOfValue(b);
    if (count[bin]++ === 0) occupied.push(bin);
    const s = bin * 3;
    sums[s] += r;
    sums[s + 1] += g;
    sums[s + 2] += b;
    pixelBin[p] = bin;
    total++;
  }
  occupied.sort((x, y) => x - y); // bin order, so results do not depend on pixel order
  const n = occupied.length;
  const w = new Float64Array(n),
    lab = new Float64Array(n * 3),
    rgb = new Float64Array(n * 3);
  for (let j = 0; j < n; j++) {
    const bin = occupied[j];
    const c = count[bin];
    binOf[bin] = j;
    w[j] = c;
    for (let k = 0; k < 3; k++) rgb[j * 3 + k] = sums[bin * 3 + k] / c;
    linearToLab(decode(rgb[j * 3]), decode(rgb[j * 3 + 1]), decode(rgb[j * 3 + 2]), lab, j * 3);
    count[bin] = 0;
    sums[bin * 3] = sums[bin * 3 + 1] = sums[bin * 3 + 2] = 0;
  }
  return { n, w, lab, rgb, pixelBin, total };
}

/** Index among the occupied bins of pixel p, or -1 when it is excluded. */
const binAt = (h: Hist, p: number) => (h.pixelBin[p] < 0 ? -1 : binOf[h.pixelBin[p]]);

const d2 = (lab: Float64Array, i: number, c: number[]) => {
  const x = lab[i * 3] - c[0],
    y = lab[i * 3 + 1] - c[1],
    z = lab[i * 3 + 2] - c[2];
  return x * x + y * y + z * z;
};

function nearest(h: Hist, i: number, centres: number[][]) {
  let best = 0,
    bestD = Infinity;
  for (let c = 0; c < centres.length; c++) {
    const d = d2(h.lab, i, centres[c]);
    if (d < bestD) {
      bestD = d;
      best = c;
    }
  }
  return best;
}

/** Weighted k-means++ seeding over the histogram bins. */
function seedCentres(h: Hist, k: number, random: () => number): number[][] {
  const pick = (weights: Float64Array, sum: number) => {
    let r = random() * sum;
    for (let i = 0; i < h.n; i++) {
      r -= weights[i];
      if (r <= 0) return i;
    }
    return h.n - 1;
  };
  const at = (i: number) => [h.lab[i * 3], h.lab[i * 3 + 1], h.lab[i * 3 + 2]];
  const centres = [at(pick(h.w, h.total))];
  const dist = new Float64Array(h.n);
  for (let i = 0; i < h.n; i++) dist[i] = d2(h.lab, i, centres[0]);
  while (centres.length < Math.min(k, h.n)) {
    const wd = new Float64Array(h.n);
    let sum = 0;
    for (let i = 0; i < h.n; i++) {
      wd[i] = h.w[i] * dist[i];
      sum += wd[i];
    }
    if (sum === 0) break;
    const c = at(pick(wd, sum));
    centres.push(c);
    for (let i = 0; i < h.n; i++) dist[i] = Math.min(dist[i], d2(h.lab, i, c));
  }
  return centres;
}

/** Lloyd iterations; returns the assignment of each bin. */
function lloyd(h: Hist, centres: number[][], iterations: number): Int32Array {
  const assign = new Int32Array(h.n).fill(-1);
  for (let it = 0; it < iterations; it++) {
    let changed = 0;
    const acc = centres.map(() => [0, 0, 0, 0]);
    for (let i = 0; i < h.n; i++) {
      const c = nearest(h, i, centres);
      if (c !== assign[i]) {
        assign[i] = c;
        changed++;
      }
      const a = acc[c],
        w = h.w[i];
      a[0] += w * h.lab[i * 3];
      a[1] += w * h.lab[i * 3 + 1];
      a[2] += w * h.lab[i * 3 + 2];
      a[3] += w;
    }
    for (let c = 0; c < centres.length; c++)
      if (acc[c][3] > 0) centres[c] = [acc[c][0] / acc[c][3], acc[c][1] / acc[c][3], acc[c][2] / acc[c][3]];
    if (!changed) break;
  }
  return assign;
}

const asLab = (c: number[]): Lab => ({ L: c[0], a: c[1], b: c[2] });

/** Pixel weight within radius r (ΔE*ab) of a point: a crude density for the unimodality test. */
function density(h: Hist, p: number[], r: number) {
  let s = 0;
  for (let i = 0; i < h.n; i++) if (d2(h.lab, i, p) <= r * r) s += h.w[i];
  return s;
}

/**
 * Two clusters are one colour when they are closer than the merge threshold, or when the
 * histogram does not thin out between them (one noisy colour split in two by k-means).
 * Two real colours side by side only share their few mixed edge pixels, so it does.
 */
function shouldMerge(h: Hist, x: number[], y: number[], mergeDeltaE: number) {
  if (deltaE00(asLab(x), asLab(y)) < mergeDeltaE) return true;
  const gap = Math.sqrt((x[0] - y[0]) ** 2 + (x[1] - y[1]) ** 2 + (x[2] - y[2]) ** 2);
  if (gap > 20) return false;
  const r = Math.max(1.5, gap / 6);
  const mid = [(x[0] + y[0]) / 2, (x[1] + y[1]) / 2, (x[2] + y[2]) / 2];
  return density(h, mid, r) >= 0.5 * Math.min(density(h, x, r), density(h, y, r));
}

function mergeClose(h: Hist, centres: number[][], mergeDeltaE: number): number[][] {
  // After a merge the other centres barely move, so a few iterations suffice.
  for (let round = 0; ; round++) {
    const assign = lloyd(h, centres, round === 0 ? ITERATIONS : 4);
    const weight = centres.map(() => 0);
    for (let i = 0; i < h.n; i++) weight[assign[i]] += h.w[i];
    let pair: [number, number] | null = null,
      bestGap = Infinity;
    for (let a = 0; a < centres.length; a++) {
      for (let b = a + 1; b < centres.length; b++) {
        const gap = d2Lab(centres[a], centres[b]);
        if (gap < bestGap && shouldMerge(h, centres[a], centres[b], mergeDeltaE)) {
          bestGap = gap;
          pair = [a, b];
        }
      }
    }
    if (!pair) return centres;
    const [a, b] = pair,
      wa = weight[a],
      wb = weight[b],
      s = wa + wb || 1;
    centres[a] = [0, 1, 2].map((k) => (centres[a][k] * wa + centres[b][k] * wb) / s);
    centres.splice(b, 1);
  }
}

const d2Lab = (x: number[], y: number[]) => (x[0] - y[0]) ** 2 + (x[1] - y[1]) ** 2 + (x[2] - y[2]) ** 2;

/**
 * Each colour's value is the mean sRGB of the bins close around its centre (re-centred a few
 * times), so pixels mixed at edges with a neighbouring colour do not pull it off.
 */
function refine(h: Hist, centres: number[][], assign: Int32Array): number[][] {
  return centres.map((start, c) => {
    let centre = start;
    const members: number[] = [];
    for (let i = 0; i < h.n; i++) if (assign[i] === c) members.push(i);
    for (let pass = 0; pass < 4; pass++) {
      const dists = members.map((i) => Math.sqrt(d2(h.lab, i, centre)));
      const order = members.map((_, k) => k).sort((x, y) => dists[x] - dists[y]);
      let half = 0,
        cum = 0,
        wsum = 0;
      for (const i of members) wsum += h.w[i];
      for (const k of order) {
        cum += h.w[members[k]];
        if (cum >= wsum / 2) {
          half = dists[k];
          break;
        }
      }
      const radius = Math.max(3, 2.5 * half);
      const acc = [0, 0, 0, 0];
      members.forEach((i, k) => {
        if (dists[k] > radius) return;
        const w = h.w[i];
        acc[0] += w * h.rgb[i * 3];
        acc[1] += w * h.rgb[i * 3 + 1];
        acc[2] += w * h.rgb[i * 3 + 2];
        acc[3] += w;
      });
      if (!acc[3]) break;
      const out = [0, 0, 0];
      linearToLab(decode(acc[0] / acc[3]), decode(acc[1] / acc[3]), decode(acc[2] / acc[3]), out);
      centre = out;
    }
    return centre;
  });
}

function assignAll(h: Hist, centres: number[][]) {
  const assign = new Int32Array(h.n);
  const weight = centres.map(() => 0);
  for (let i = 0; i < h.n; i++) {
    assign[i] = nearest(h, i, centres);
    weight[assign[i]] += h.w[i];
  }
  return { assign, weight };
}

function maskOf(img: RawImage, exclude: Rect[]): Uint8Array | null {
  if (!exclude.length) return null;
  const mask = new Uint8Array(img.width * img.height);
  for (const r of exclude) {
    const x0 = Math.max(0, Math.floor(r.x)),
      y0 = Math.max(0, Math.floor(r.y));
    const x1 = Math.min(img.width, Math.ceil(r.x + r.w)),
      y1 = Math.min(img.height, Math.ceil(r.y + r.h));
    for (let y = y0; y < y1; y++) mask.fill(1, y * img.width + x0, y * img.width + x1);
  }
  return mask;
}

/** The palette of an image: up to maxColours colours sorted by share, plus any background colours. */
export function extractPalette(img: RawImage, options: PaletteOptions = {}): ExtractedColour[] {
  const {
    maxColours = 8,
    minShare = 0.01,
    mergeDeltaE = 2.5,
    exclude = [],
    detectBackground = true,
    seed = 0x7c1,
  } = options;
  const h = histogram(img, maskOf(img, exclude));
  if (!h.total) return [];
  let centres = mergeClose(h, seedCentres(h, INITIAL_K, rng(seed)), mergeDeltaE);
  let { assign } = assignAll(h, centres);
  centres = refine(h, centres, assign);
  let weight: number[];
  // Fold clusters that are too small (or beyond the colour limit) into their nearest neighbour.
  for (;;) {
    ({ assign, weight } = assignAll(h, centres));
    const smallest = weight.reduce((m, w, i) => (w < weight[m] ? i : m), 0);
    if (centres.length > 1 && (weight[smallest] < minShare * h.total || centres.length > maxColours + 2))
      centres.splice(smallest, 1);
    else break;
  }

  let isBg = centres.map(() => false);
  if (detectBackground) {
    // Each pixel's colour (-1 where excluded), for the spatial tests of background.ts.
    const labels = new Int32Array(img.width * img.height);
    for (let p = 0; p < labels.length; p++) {
      const j = binAt(h, p);
      labels[p] = j < 0 ? -1 : assign[j];
    }
    isBg = backgroundColours({ width: img.width, height: img.height, labels, centres, weight });
  }

  const spreadAcc = centres.map(() => 0);
  for (let i = 0; i < h.n; i++) spreadAcc[assign[i]] += h.w[i] * d2(h.lab, i, centres[assign[i]]);
  const fgTotal = weight.reduce((s, w, i) => s + (isBg[i] ? 0 : w), 0);
  const colours = centres.map((c, i): ExtractedColour => {
    const lab = { L: c[0], a: c[1], b: c[2] };
    const areaShare = weight[i] / h.total;
    return {
      lab,
      hex: labToHex(lab),
      areaShare,
      share: isBg[i] || !fgTotal ? areaShare : weight[i] / fgTotal,
      spread: weight[i] ? Math.sqrt(spreadAcc[i] / weight[i]) : 0,
      name: shadeName(lab),
      tradeName: tradeShade(lab)?.name ?? null,
      background: isBg[i],
    };
  });
  const fg = colours
    .filter((c) => !c.background)
    .sort((x, y) => y.share - x.share)
    .slice(0, maxColours);
  const fgSum = fg.reduce((s, c) => s + c.share, 0) || 1;
  for (const c of fg) c.share /= fgSum;
  return [...fg, ...colours.filter((c) => c.background).sort((x, y) => y.share - x.share)];
}

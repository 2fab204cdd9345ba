// Which colours of a photo are a mount or backdrop rather than cloth. Only the whole-photo
// palette asks; exclusions and the reference patch are cut out before (they are never cloth).

const BORDER_FRACTION = 0.03; // width of the border band, of the shorter side
const BG_BORDER_SHARE = 0.3; // a background colour covers at least this much of the band
const BG_MAX_CHROMA = 10; // …and is near-neutral (C*ab)
const BG_MAX_ENCLOSED = 0.5; // …and at most this share of it lies between cloth pixels (else it is the cloth's own ground)
const CLOTH_MIN_AREA = 0.0002; // cloth components smaller than this share of the frame (noise, stray pixels) are ignored

type Frame = { width: number; height: number; labels: Int32Array };

/** Pixels of `isBg` colours reachable from the image border through such pixels, per colour. */
function borderConnected({ width, height, labels }: Frame, isBg: boolean[]) {
  const pixelLabel = (p: number) => labels[p];
  const seen = new Uint8Array(width * height);
  const stack: number[] = [];
  const push = (p: number) => {
    if (seen[p]) return;
    const l = pixelLabel(p);
    if (l < 0 || !isBg[l]) return;
    seen[p] = 1;
    stack.push(p);
  };
  for (let x = 0; x < width; x++) {
    push(x);
    push((height - 1) * width + x);
  }
  for (let y = 0; y < height; y++) {
    push(y * width);
    push(y * width + width - 1);
  }
  const counts = isBg.map(() => 0);
  while (stack.length) {
    const p = stack.pop()!;
    counts[pixelLabel(p)]++;
    const x = p % width,
      y = (p - x) / width;
    if (x > 0) push(p - 1);
    if (x < width - 1) push(p + 1);
    if (y > 0) push(p - width);
    if (y < height - 1) push(p + width);
  }
  return counts;
}

/**
 * Share of colour c's pixels that lie between pixels of the cloth (every other colour, in
 * components big enough not to be noise) on their row or on their column. A mount or backdrop
 * lies outside the cloth's outline, so almost none of it does; the ground of a close-up that
 * fills the frame lies between its motifs, so most of it does.
 */
function enclosedShare(labels: Int32Array, width: number, height: number, c: number) {
  const n = width * height;
  const seen = new Uint8Array(n),
    keep = new Uint8Array(n);
  const order = new Int32Array(n);
  const minArea = Math.max(16, Math.round(CLOTH_MIN_AREA * n));
  const isCloth = (p: number) => labels[p] >= 0 && labels[p] !== c;
  for (let start = 0; start < n; start++) {
    if (seen[start] || !isCloth(start)) continue;
    // Flood one 4-connected component; `order` doubles as its pixel list and the stack.
    let head = 0,
      tail = 0;
    order[tail++] = start;
    seen[start] = 1;
    while (head < tail) {
      const p = order[head++];
      const x = p % width;
      if (x > 0 && !seen[p - 1] && isCloth(p - 1)) {
        seen[p - 1] = 1;
        order[tail++] = p - 1;
      }
      if (x < width - 1 && !seen[p + 1] && isCloth(p + 1)) {
        seen[p + 1] = 1;
        order[tail++] = p + 1;
      }
      if (p >= width && !seen[p - width] && isCloth(p - width)) {
        seen[p - width] = 1;
        order[tail++] = p - width;
      }
      if (p < n - width && !seen[p + width] && isCloth(p + width)) {
        seen[p + width] = 1;
        order[tail++] = p + width;
      }
    }
    if (tail >= minArea) for (let k = 0; k < tail; k++) keep[order[k]] = 1;
  }
  const rowMin = new Int32Array(height).fill(width),
    rowMax = new Int32Array(height).fill(-1);
  const colMin = new Int32Array(width).fill(height),
    colMax = new Int32Array(width).fill(-1);
  for (let p = 0; p < n; p++) {
    if (!keep[p]) continue;
    const x = p % width,
      y = (p - x) / width;
    if (x < rowMin[y]) rowMin[y] = x;
    if (x > rowMax[y]) rowMax[y] = x;
    if (y < colMin[x]) colMin[x] = y;
    if (y > colMax[x]) colMax[x] = y;
  }
  let inside = 0,
    all = 0;
  for (let p = 0; p < n; p++) {
    if (labels[p] !== c) continue;
    all++;
    const x = p % width,
      y = (p - x) / width;
    if ((x > rowMin[y] && x < rowMax[y]) || (y > colMin[x] && y < colMax[x])) inside++;
  }
  return all ? inside / all : 0;
}

/**
 * A colour is background when it is near-neutral, covers much of the border band, is mostly
 * reachable from the border, and lies outside the cloth's outline: a ground that fills the
 * frame, with the motifs inside it, is cloth, whatever its colour.
 */
export function backgroundColours(frame: Frame & { centres: number[][]; weight: number[] }): boolean[] {
  const { width, height, labels, centres, weight } = frame;
  const band = Math.max(1, Math.round(BORDER_FRACTION * Math.min(width, height)));
  const inBand = centres.map(() => 0);
  let bandTotal = 0;
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      if (x >= band && x < width - band && y >= band && y < height - band) continue;
      const l = labels[y * width + x];
      if (l < 0) continue;
      inBand[l]++;
      bandTotal++;
    }
  }
  const isBg = centres.map(
    (c, i) => bandTotal > 0 && inBand[i] / bandTotal >= BG_BORDER_SHARE && Math.hypot(c[1], c[2]) <= BG_MAX_CHROMA,
  );
  if (!isBg.some(Boolean)) return isBg;
  const reached = borderConnected(frame, isBg);
  centres.forEach((_, i) => {
    if (isBg[i] && reached[i] < 0.5 * weight[i]) isBg[i] = false;
  });
  centres.forEach((_, i) => {
    if (isBg[i] && enclosedShare(labels, width, height, i) > BG_MAX_ENCLOSED) isBg[i] = false;
  });
  return isBg;
}

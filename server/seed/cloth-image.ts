import { decode8, encode8 } from '../media/fast-lab.ts';

// Paints a printed-cloth picture from colour areas, with a weave texture, a lighting
// gradient and sensor noise. Demo photos are made from it at seed time, and the palette
// tests and benchmark use it because the true colours and their areas are known exactly.

export type Shape =
  | { kind: 'rect'; x: number; y: number; w: number; h: number; colour: string }
  | {
      kind: 'ellipse';
      cx: number;
      cy: number;
      rx: number;
      ry: number;
      colour: string;
      outline?: { colour: string; width: number };
    };

export type ClothSpec = {
  width: number;
  height: number;
  ground: string;
  shapes: Shape[];
  /** Multiplies linear light per channel, as a wrong white balance would. */
  tint?: [number, number, number];
  noise?: number; // standard deviation in 8-bit code values
  weave?: number; // relative amplitude of the thread texture
  weavePeriod?: number; // pixels per thread pair
  gradient?: number; // relative brightness change from the centre to the left/right edge
  seed?: number;
};

const rgbOf = (hex: string): [number, number, number] =>
  [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16)) as [number, number, number];

/** Box–Muller normal deviates from a seeded PRNG. */
function gaussian(seed: number) {
  let a = seed >>> 0;
  const u = () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return (((t ^ (t >>> 14)) >>> 0) + 0.5) / 4294967296;
  };
  return () => Math.sqrt(-2 * Math.log(u())) * Math.cos(2 * Math.PI * u());
}

/** Which colour (index into the returned list) covers each pixel. */
export function labelMap(spec: ClothSpec) {
  const colours = [spec.ground];
  const index = (hex: string) => {
    const i = colours.indexOf(hex);
    return i >= 0 ? i : colours.push(hex) - 1;
  };
  const labels = new Uint8Array(spec.width * spec.height);
  for (const s of spec.shapes) {
    if (s.kind === 'rect') {
      const c = index(s.colour);
      for (let y = Math.max(0, s.y); y < Math.min(spec.height, s.y + s.h); y++)
        labels.fill(c, y * spec.width + Math.max(0, s.x), y * spec.width + Math.min(spec.width, s.x + s.w));
      continue;
    }
    const c = index(s.colour);
    const o = s.outline ? index(s.outline.colour) : -1;
    const ow = s.outline?.width ?? 0;
    const rx = s.rx + ow,
      ry = s.ry + ow;
    for (let y = Math.max(0, Math.floor(s.cy - ry)); y < Math.min(spec.height, Math.ceil(s.cy + ry)); y++) {
      for (let x = Math.max(0, Math.floor(s.cx - rx)); x < Math.min(spec.width, Math.ceil(s.cx + rx)); x++) {
        const dx = x + 0.5 - s.cx,
          dy = y + 0.5 - s.cy;
        if ((dx / s.rx) ** 2 + (dy / s.ry) ** 2 <= 1) labels[y * spec.width + x] = c;
        else if (o >= 0 && (dx / rx) ** 2 + (dy / ry) ** 2 <= 1) labels[y * spec.width + x] = o;
      }
    }
  }
  return { colours, labels };
}

/** The picture as interleaved 8-bit sRGB, with the true share of each colour. */
export function paintCloth(spec: ClothSpec) {
  const { width, height } = spec;
  const { colours, labels } = labelMap(spec);
  const tint = spec.tint ?? [1, 1, 1];
  const base = colours.map((hex) => rgbOf(hex).map((v, k) => encode8(decode8(v) * tint[k]))) as number[][];
  const noise = spec.noise ?? 0,
    weave = spec.weave ?? 0,
    period = spec.weavePeriod ?? 6,
    gradient = spec.gradient ?? 0;
  const normal = gaussian(spec.seed ?? 1);
  const data = new Uint8Array(width * height * 3);
  const counts = Array.from({ length: colours.length }, () => 0);
  const wx = new Float64Array(width).map((_, x) => Math.sin((2 * Math.PI * x) / period));
  for (let y = 0; y < height; y++) {
    const wy = Math.sin((2 * Math.PI * y) / period);
    for (let x = 0; x < width; x++) {
      const p = y * width + x;
      const label = labels[p];
      counts[label]++;
      const light = (1 + weave * wx[x] * wy) * (1 + gradient * ((2 * x) / (width - 1) - 1));
      const c = base[label];
      for (let k = 0; k < 3; k++)
        data[p * 3 + k] = Math.max(0, Math.min(255, Math.round(c[k] * light + noise * normal())));
    }
  }
  const total = width * height;
  return { data, width, height, truth: colours.map((hex, i) => ({ hex, share: counts[i] / total })) };
}

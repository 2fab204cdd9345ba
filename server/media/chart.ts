import { chartOutline, patchGeometry, type Lin, type M3, type Point } from '../../shared/compute/chart.ts';
import { decode, decode8, encodeValue } from './fast-lab.ts';
import type { RawImage, Rect } from './palette.ts';

/**
 * Reading a colour chart from a photo (the geometry and the fit are pure, in shared/compute/chart.ts).
 * Pixels come from the same colour-managed working image the palettes use (decode.ts workingImage), so the
 * chart sees the photo exactly as the palette does.
 */

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
};

/**
 * Linear-light sRGB of each patch: the per-channel median of the square sampled in its middle (a median so a
 * speck of dust or a glint does not pull the value). `corners` are in full-size pixels; `scale` takes them
 * into the working image.
 */
export function sampleChart(img: RawImage, corners: Point[], scale: number): { samples: Lin[]; empty: number[] } {
  const geometry = patchGeometry(corners.map((p) => ({ x: p.x * scale, y: p.y * scale })));
  const lin = img.data instanceof Uint8Array ? decode8 : decode;
  const samples: Lin[] = [];
  const empty: number[] = [];
  for (const g of geometry) {
    const half = Math.max(0.5, g.half);
    const x0 = Math.max(0, Math.round(g.centre.x - half)),
      x1 = Math.min(img.width - 1, Math.round(g.centre.x + half));
    const y0 = Math.max(0, Math.round(g.centre.y - half)),
      y1 = Math.min(img.height - 1, Math.round(g.centre.y + half));
    const ch: number[][] = [[], [], []];
    for (let y = y0; y <= y1; y++)
      for (let x = x0; x <= x1; x++) {
        const i = (y * img.width + x) * 3;
        for (let k = 0; k < 3; k++) ch[k].push(lin(img.data[i + k]));
      }
    if (!ch[0].length) {
      empty.push(g.patch);
      samples.push([0, 0, 0]);
    } else samples.push(ch.map(median) as Lin);
  }
  return { samples, empty };
}

/** The image through a 3×3 matrix in linear light; unclipped fractional sRGB on 0–255, as correctImage(). */
export function calibrateImage(img: RawImage, m: M3): RawImage {
  const out = new Float32Array(img.data.length);
  const lin = img.data instanceof Uint8Array ? (v: number) => decode8(v) : decode;
  for (let i = 0; i < img.data.length; i += 3) {
    const r = lin(img.data[i]),
      g = lin(img.data[i + 1]),
      b = lin(img.data[i + 2]);
    out[i] = encodeValue(m[0][0] * r + m[0][1] * g + m[0][2] * b);
    out[i + 1] = encodeValue(m[1][0] * r + m[1][1] * g + m[1][2] * b);
    out[i + 2] = encodeValue(m[2][0] * r + m[2][1] * g + m[2][2] * b);
  }
  return { data: out, width: img.width, height: img.height };
}

/**
 * The rectangle (full-size pixels, clipped to the photo) that holds the whole chart: left out of every palette.
 * A tilted chart's bounding box also covers a little of what is around it; that is left out too.
 */
export function chartRect(corners: Point[], size: { width: number; height: number }): Rect {
  const o = chartOutline(corners);
  const x0 = Math.max(0, Math.floor(Math.min(...o.map((p) => p.x))));
  const y0 = Math.max(0, Math.floor(Math.min(...o.map((p) => p.y))));
  const x1 = Math.min(size.width, Math.ceil(Math.max(...o.map((p) => p.x))));
  const y1 = Math.min(size.height, Math.ceil(Math.max(...o.map((p) => p.y))));
  return { x: x0, y: y0, w: Math.max(1, x1 - x0), h: Math.max(1, y1 - y0) };
}

import { bradfordMatrix, type M3, type Xyz } from '../../shared/colour/index.ts';
import { decode, decode8, encodeValue, rgbToXyzMatrix, xyzToRgbMatrix } from './fast-lab.ts';
import type { RawImage, Rect } from './palette.ts';

const mul = (x: number[][], y: number[][]) =>
  [0, 1, 2].map((i) => [0, 1, 2].map((j) => x[i][0] * y[0][j] + x[i][1] * y[1][j] + x[i][2] * y[2][j]));

/** Mean XYZ (D65 encoding) of a rectangle of the image: the white seen through the patch. */
export function patchWhite(img: RawImage, rect: Rect): Xyz {
  const x0 = Math.max(0, Math.round(rect.x)),
    y0 = Math.max(0, Math.round(rect.y));
  const x1 = Math.min(img.width, Math.round(rect.x + rect.w)),
    y1 = Math.min(img.height, Math.round(rect.y + rect.h));
  // Leave a margin so pixels blurred with the surroundings at the patch edge do not count.
  const mx = Math.floor((x1 - x0) / 6),
    my = Math.floor((y1 - y0) / 6);
  const sum = [0, 0, 0];
  let n = 0;
  for (let y = y0 + my; y < y1 - my; y++) {
    for (let x = x0 + mx; x < x1 - mx; x++) {
      const i = (y * img.width + x) * 3;
      for (let k = 0; k < 3; k++) sum[k] += decode(img.data[i + k]);
      n++;
    }
  }
  if (!n) throw new Error('The reference patch is empty.');
  const m = rgbToXyzMatrix();
  const rgb = sum.map((s) => s / n);
  return [0, 1, 2].map((i) => m[i][0] * rgb[0] + m[i][1] * rgb[1] + m[i][2] * rgb[2]) as Xyz;
}

/**
 * The image after a Bradford adaptation of `white` to D65, applied in linear light. The result is
 * unclipped (fractional sRGB values on 0–255), so a correction never pushes a colour into the
 * gamut boundary.
 */
export function correctImage(img: RawImage, white: Xyz): { image: RawImage; matrix: M3 } {
  const matrix = bradfordMatrix(white);
  const m = mul(xyzToRgbMatrix(), mul(matrix, rgbToXyzMatrix()));
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
  return { image: { data: out, width: img.width, height: img.height }, matrix };
}

import { createHash } from 'node:crypto';
import sharp, { type Metadata, type Sharp } from 'sharp';
import type { M3 } from '../../shared/colour/index.ts';
import type { PhotoColourFacts } from '../../shared/schemas/photo.ts';
import { HttpError } from '../http/errors.ts';
import { encodeValue } from './fast-lab.ts';
import { mediaLimits } from './limits.ts';
import { parseIcc, toLinearSrgbMatrix, type Curve } from './icc.ts';
import type { RawImage, Rect } from './palette.ts';

/** Long side of the image the palette is computed on: thin lines 1/300 of the width still show at this size. */
export const WORKING_SIZE = 1024;

export const DISPLAY_MAX = 1600;

/**
 * Long side of the display derivative: about 1600 px, chosen between 1400 and 1600 so that
 * JPEG shrink-on-load can decode at 1/2, 1/4 or 1/8 scale (a 6000 px photo decodes at 1500 px,
 * several times faster than at the 3000 px that an exact 1600 would need).
 */
export function displaySize(longSide: number) {
  const factor = [8, 4, 2, 1].find((f) => longSide / f >= 1400) ?? 1;
  return Math.min(DISPLAY_MAX, Math.floor(longSide / factor));
}

// How a photo's pixels become colours. Matrix/TRC profiles (and photos without a profile, taken as
// sRGB) are read here: the device values at their own bit depth go through the profile's curves
// and matrix to linear sRGB, unbounded, so 16-bit precision and colours outside sRGB survive.
// sharp's own conversion is not used for these: it turns 16-bit input into 16-bit Display P3 and
// its toColourspace('srgb') then only shifts those to 8 bits, which read a 16-bit photo in any
// profile about 2.9 ΔE00 off. Other profiles (LUT-based) go through lcms to 8-bit sRGB.

type Device = {
  kind: 'device';
  bits: 8 | 16;
  grey: boolean;
  /** Per channel, linear light of each code value. */
  luts: Float32Array[];
  matrix: M3;
  /** 8-bit sRGB taken as is: the pixels already are what the palette reads. */
  plainSrgb: boolean;
};
type Managed = { kind: 'lcms'; sixteen: boolean };
/** An image as sharp reads it: the bytes, or the path of a file (an upload streamed to disk). */
export type ImageInput = Buffer | string;

export type ColourSource = { mode: Device | Managed; facts: PhotoColourFacts };

const IDENTITY: M3 = [
  [1, 0, 0],
  [0, 1, 0],
  [0, 0, 1],
];
const srgbCurve: Curve = (x) => (x <= 0.04045 ? x / 12.92 : ((x + 0.055) / 1.055) ** 2.4);

const lutCache = new Map<string, Float32Array[]>();
function luts(key: string, curves: Curve[], bits: 8 | 16): Float32Array[] {
  const k = `${key}:${bits}`;
  let hit = lutCache.get(k);
  if (!hit) {
    const max = bits === 8 ? 255 : 65535;
    hit = curves.map((c) => {
      const t = new Float32Array(max + 1);
      for (let v = 0; v <= max; v++) t[v] = c(v / max);
      return t;
    });
    if (lutCache.size > 16) lutCache.clear();
    lutCache.set(k, hit);
  }
  return hit;
}

const SPACES: Record<string, string> = {
  srgb: 'RGB',
  rgb: 'RGB',
  rgb16: 'RGB',
  'b-w': 'grey',
  grey16: 'grey',
  cmyk: 'CMYK',
  labs: 'CIELAB',
  lab: 'CIELAB',
  scrgb: 'RGB (linear, floating point)',
};
const BITS: Record<string, number> = {
  uchar: 8,
  char: 8,
  ushort: 16,
  short: 16,
  uint: 32,
  int: 32,
  float: 32,
  double: 64,
};

/**
 * Decides how the photo's pixels are read, and the facts to record: the embedded profile (or none:
 * taken as sRGB), bit depth and colour space as stored. CMYK is refused: sharp can convert it only
 * with the perceptual intent, which put test colours 1–8 ΔE00 away from what the file holds.
 */
export function colourSource(meta: Metadata): ColourSource {
  const bitDepth = BITS[meta.depth ?? 'uchar'] ?? 8;
  const colourSpace = SPACES[meta.space ?? ''] ?? meta.space ?? 'unknown';
  if (meta.space === 'cmyk') {
    throw new HttpError(
      415,
      'cmyk_not_supported',
      'This photo is in CMYK, a printing colour model, and its colours cannot be measured reliably from it. Export it as RGB (sRGB, Display P3 or Adobe RGB) with the profile embedded and upload that.',
    );
  }
  const base = { bitDepth, colourSpace, cmykConverted: false };
  const deviceBits = meta.depth === 'uchar' ? 8 : meta.depth === 'ushort' ? 16 : null;
  const grey = meta.space === 'b-w' || meta.space === 'grey16';
  const rgb = meta.space === 'srgb' || meta.space === 'rgb16' || meta.space === 'rgb';
  if (meta.icc) {
    let profile: ReturnType<typeof parseIcc> | null = null;
    try {
      profile = parseIcc(meta.icc);
    } catch {
      profile = null;
    }
    const description = profile?.description ?? 'embedded profile without a description';
    const fits = profile && ((rgb && profile.colourSpace === 'RGB ') || (grey && profile.colourSpace === 'GRAY'));
    if (profile?.matrix && profile.curves && fits && deviceBits) {
      const key = createHash('sha1').update(meta.icc).digest('hex');
      return {
        mode: {
          kind: 'device',
          bits: deviceBits,
          grey,
          luts: luts(key, profile.curves, deviceBits),
          matrix: toLinearSrgbMatrix(profile),
          plainSrgb: false,
        },
        facts: { ...base, profile: description, assumedSrgb: false, conversion: 'icc-matrix' },
      };
    }
    if (profile) {
      return {
        mode: { kind: 'lcms', sixteen: deviceBits === 16 },
        facts: { ...base, profile: description, assumedSrgb: false, conversion: 'lcms-perceptual' },
      };
    }
    // An unreadable profile is ignored, as sharp would, and the photo taken as sRGB.
  }
  if (deviceBits && (rgb || grey)) {
    return {
      mode: {
        kind: 'device',
        bits: deviceBits,
        grey,
        luts: luts('srgb', [srgbCurve, srgbCurve, srgbCurve], deviceBits),
        matrix: IDENTITY,
        plainSrgb: deviceBits === 8 && !grey,
      },
      facts: { ...base, profile: null, assumedSrgb: true, conversion: 'none' },
    };
  }
  // Floating-point or Lab files: libvips' own conversion to sRGB.
  return {
    mode: { kind: 'lcms', sixteen: false },
    facts: {
      ...base,
      profile: null,
      assumedSrgb: meta.space !== 'labs' && meta.space !== 'lab',
      conversion: 'libvips',
    },
  };
}

/**
 * Every decode of a photo: libvips' sequential access (the file is read top to bottom in strips, never held whole;
 * a reduction shrinks JPEG and WebP while they load and averages other formats strip by strip), refusing images
 * above the pixel limit (pixel bombs) and damaged files.
 */
export const open = (input: ImageInput, device: boolean) =>
  sharp(input, { sequentialRead: true, limitInputPixels: mediaLimits.maxPixels, failOn: 'error', ignoreIcc: device });

/** The upright device pixels as decoded, at their own depth (or 8-bit sRGB through lcms). */
type Decoded = { data: Uint8Array | Uint16Array; width: number; height: number; channels: number };

function finish(img: Sharp, mode: Device | Managed) {
  img = img.removeAlpha();
  if (mode.kind === 'lcms') {
    // Converting to the output profile after sharp's own step undoes its 16-bit P3 detour.
    return mode.sixteen ? img.withIccProfile('srgb').raw() : img.toColourspace('srgb').raw();
  }
  const space = mode.bits === 16 ? (mode.grey ? 'grey16' : 'rgb16') : mode.grey ? 'b-w' : 'srgb';
  return img.toColourspace(space).raw({ depth: mode.bits === 16 ? 'ushort' : 'uchar' });
}

async function toDecoded(img: Sharp): Promise<Decoded> {
  const { data, info } = await img.toBuffer({ resolveWithObject: true });
  const sixteen = data.length === info.width * info.height * info.channels * 2;
  const aligned = sixteen && data.byteOffset % 2 ? Buffer.from(data) : data;
  const typed = sixteen
    ? new Uint16Array(aligned.buffer, aligned.byteOffset, aligned.length / 2)
    : new Uint8Array(data.buffer, data.byteOffset, data.length);
  return { data: typed, width: info.width, height: info.height, channels: info.channels };
}

/**
 * Device pixels to what the palette reads: sRGB values on 0–255, unclipped and fractional
 * (Float32Array), or the 8-bit pixels themselves for an sRGB photo without a profile.
 */
export function toWorking(d: Decoded, mode: Device | Managed): RawImage {
  const n = d.width * d.height;
  if (mode.kind === 'lcms' || (mode.plainSrgb && d.channels === 3 && d.data instanceof Uint8Array)) {
    if (d.channels === 3) return { data: d.data as Uint8Array, width: d.width, height: d.height };
    const out = new Uint8Array(n * 3);
    for (let p = 0; p < n; p++) out[p * 3] = out[p * 3 + 1] = out[p * 3 + 2] = d.data[p];
    return { data: out, width: d.width, height: d.height };
  }
  const [lr, lg, lb] = mode.luts;
  const m = mode.matrix;
  const out = new Float32Array(n * 3);
  const src = d.data,
    c = d.channels;
  for (let p = 0, i = 0; p < n; p++, i += c) {
    const r = lr[src[i]],
      g = lg[src[c === 1 ? i : i + 1]],
      b = lb[src[c === 1 ? i : i + 2]];
    out[p * 3] = encodeValue(m[0][0] * r + m[0][1] * g + m[0][2] * b);
    out[p * 3 + 1] = encodeValue(m[1][0] * r + m[1][1] * g + m[1][2] * b);
    out[p * 3 + 2] = encodeValue(m[2][0] * r + m[2][1] * g + m[2][2] * b);
  }
  return { data: out, width: d.width, height: d.height };
}

/** 8-bit sRGB for display (clipped into the sRGB gamut). */
export function toDisplay(img: RawImage): Uint8Array {
  if (img.data instanceof Uint8Array) return img.data;
  const out = new Uint8Array(img.data.length);
  for (let i = 0; i < img.data.length; i++) out[i] = Math.max(0, Math.min(255, Math.round(img.data[i])));
  return out;
}

export async function readSource(input: ImageInput): Promise<ColourSource> {
  return colourSource(await sharp(input, { limitInputPixels: false }).metadata());
}

/** The stored size and EXIF orientation (1–8) of an image, from its header. */
async function storedFacts(input: ImageInput) {
  const m = await sharp(input, { limitInputPixels: false }).metadata();
  const orientation = m.orientation && m.orientation >= 1 && m.orientation <= 8 ? m.orientation : 1;
  return { width: m.width!, height: m.height!, orientation };
}

/** A rectangle in stored full-size pixels. */
type Box = { left: number; top: number; width: number; height: number };

/**
 * The one reduction of a photo (or of a rectangle of it, in stored pixels) to fit a square of `size`, made upright
 * afterwards. Read in sequence from the file (libvips' sequential access; JPEG and WebP shrink while they load),
 * reduced with the linear kernel, which avoids the overshoot (ringing) at edges that would invent colours; only
 * the reduced image is turned upright, so a master is never held whole in memory (sharp's own auto-orientation
 * copies the whole image into memory when a rectangle is cut from a turned photo).
 */
async function reduce(input: ImageInput, src: ColourSource, size: number, box?: Box): Promise<Decoded> {
  const stored = await storedFacts(input);
  let img = open(input, src.mode.kind === 'device');
  if (box) img = img.extract(box);
  img = img.resize({ width: size, height: size, fit: 'inside', withoutEnlargement: true, kernel: 'linear' });
  let d = await toDecoded(finish(img, src.mode));
  const from = box ?? stored;
  if (d.data instanceof Uint16Array && (d.width !== from.width || d.height !== from.height))
    d = await unbias(d, from.width, from.height);
  return orient(d, stored.orientation);
}

/**
 * libvips reduces 16-bit images with 12-bit fixed-point weights that do not quite add up to one: measured with
 * libvips 8.18 (sharp 0.35) reducing 4000 px to 1024 px with the linear kernel, a flat 40127 came out 40069, 0.15 %
 * dark, about 0.06–0.1 ΔE00 on the test colours (tests/db/large-masters.test.ts), as much as reading at 8 bits. The
 * reduction is separable, so each output column and row carries its own factor: measured here by reducing flat
 * one-pixel-high and one-pixel-wide images the same way, and divided out. 8-bit output is rounded to whole values,
 * which absorbs the bias, so it is left as it is.
 */
const FLAT = 50_000;
const biasCache = new Map<string, Float64Array>();
async function reductionFactors(from: number, to: number) {
  const key = `${from}>${to}`;
  let hit = biasCache.get(key);
  if (!hit) {
    const flat = new Uint16Array(from).fill(FLAT);
    const { data } = await sharp(flat, { raw: { width: from, height: 1, channels: 1 } })
      .resize({ width: to, height: 1, fit: 'fill', kernel: 'linear' })
      .toColourspace('grey16')
      .raw({ depth: 'ushort' })
      .toBuffer({ resolveWithObject: true });
    const out = new Uint16Array(data.buffer.slice(data.byteOffset, data.byteOffset + data.length));
    hit = new Float64Array(to);
    for (let i = 0; i < to; i++) hit[i] = out[i] / FLAT;
    if (biasCache.size > 64) biasCache.clear();
    biasCache.set(key, hit);
  }
  return hit;
}

async function unbias(d: Decoded, fromWidth: number, fromHeight: number): Promise<Decoded> {
  const fx = d.width !== fromWidth ? await reductionFactors(fromWidth, d.width) : null;
  const fy = d.height !== fromHeight ? await reductionFactors(fromHeight, d.height) : null;
  const src = d.data as Uint16Array;
  const out = new Uint16Array(src.length);
  const c = d.channels;
  for (let y = 0, i = 0; y < d.height; y++) {
    const ry = fy ? fy[y] : 1;
    for (let x = 0; x < d.width; x++) {
      const f = ry * (fx ? fx[x] : 1);
      for (let k = 0; k < c; k++, i++) out[i] = Math.min(65535, Math.round(src[i] / f));
    }
  }
  return { ...d, data: out };
}

/**
 * Turns decoded pixels upright by their EXIF orientation, as sharp's autoOrient() does: a clockwise turn of 90°
 * (6, and 5 then mirrored), 180° (3, and 4 then mirrored) or 270° (8, and 7 then mirrored), then a left-right mirror
 * (2, 4, 5, 7). Checked against sharp for all eight in tests/unit/orientation.test.ts.
 */
export function orient(d: Decoded, orientation: number): Decoded {
  if (orientation <= 1 || orientation > 8) return d;
  const turn = ({ 3: 180, 4: 180, 5: 90, 6: 90, 7: 270, 8: 270 } as Record<number, number>)[orientation] ?? 0;
  const mirror = orientation === 2 || orientation === 4 || orientation === 5 || orientation === 7;
  const { width: w, height: h, channels: c } = d;
  const W = turn === 90 || turn === 270 ? h : w;
  const H = turn === 90 || turn === 270 ? w : h;
  const out = d.data instanceof Uint16Array ? new Uint16Array(d.data.length) : new Uint8Array(d.data.length);
  for (let y = 0; y < H; y++)
    for (let X = 0; X < W; X++) {
      const x = mirror ? W - 1 - X : X; // the turned image's column, before the mirror
      const [sx, sy] =
        turn === 90 ? [y, h - 1 - x] : turn === 180 ? [w - 1 - x, h - 1 - y] : turn === 270 ? [w - 1 - y, x] : [x, y];
      const o = (y * W + X) * c,
        i = (sy * w + sx) * c;
      for (let k = 0; k < c; k++) out[o + k] = d.data[i + k];
    }
  return { data: out, width: W, height: H, channels: c };
}

/** An upright rectangle (full-size pixels) as the rectangle of the stored image it shows. */
export function storedBox(box: Box, orientation: number, storedWidth: number, storedHeight: number): Box {
  if (orientation <= 1 || orientation > 8) return box;
  const turn = ({ 3: 180, 4: 180, 5: 90, 6: 90, 7: 270, 8: 270 } as Record<number, number>)[orientation] ?? 0;
  const mirror = orientation === 2 || orientation === 4 || orientation === 5 || orientation === 7;
  const W = turn === 90 || turn === 270 ? storedHeight : storedWidth;
  // Pixel edges: undo the mirror, then the turn (the inverse of orient() on continuous coordinates).
  const point = (X: number, Y: number): [number, number] => {
    const x = mirror ? W - X : X;
    if (turn === 90) return [Y, storedHeight - x];
    if (turn === 180) return [storedWidth - x, storedHeight - Y];
    if (turn === 270) return [storedWidth - Y, x];
    return [x, Y];
  };
  const [x1, y1] = point(box.left, box.top);
  const [x2, y2] = point(box.left + box.width, box.top + box.height);
  return {
    left: Math.min(x1, x2),
    top: Math.min(y1, y2),
    width: Math.abs(x2 - x1),
    height: Math.abs(y2 - y1),
  };
}

/** The upright photo at display size: the one decode that derivatives and the whole-photo palette share. */
async function decodeAtDisplaySize(input: ImageInput, source: ColourSource) {
  const { width, height } = await uprightSize(input);
  return reduce(input, source, displaySize(Math.max(width, height)));
}

/**
 * Everything ingest needs: the display image (8-bit sRGB) and the whole-photo working image,
 * made by workingImage() itself, so a later recompute of the whole-photo palette gives the same
 * colours. The two decodes run side by side on libvips' threads (one after the other for an image decoded whole);
 * each uses JPEG shrink-on-load, which is cheaper than decoding once at display size and reducing that again.
 */
export async function decodeForIngest(input: ImageInput, source?: ColourSource, oneAtATime = false) {
  const src = source ?? (await readSource(input));
  // An image its decoder holds whole (progressive JPEG, interlaced PNG, HEIF) is reduced one way after the other,
  // so it is held once at a time rather than twice.
  const [shown, work] = oneAtATime
    ? [await decodeAtDisplaySize(input, src), await wholeWorkingImage(input, src, WORKING_SIZE)]
    : await Promise.all([decodeAtDisplaySize(input, src), wholeWorkingImage(input, src, WORKING_SIZE)]);
  const display = toWorking(shown, src.mode);
  return {
    display: { data: toDisplay(display), width: display.width, height: display.height },
    work,
    facts: src.facts,
  };
}

/** The whole upright photo reduced to the working size in one pipeline. */
async function wholeWorkingImage(input: ImageInput, src: ColourSource, size: number) {
  return toWorking(await reduce(input, src, size), src.mode);
}

/**
 * The upright image (or a rectangle of it, in upright full-size pixels) reduced to the working
 * size, in sRGB values as the palette reads them (ingest makes the whole-photo one the same way);
 * a rectangle is cut from the full-size image (from the stored pixels it shows, then turned upright).
 */
export async function workingImage(
  input: ImageInput,
  region?: Rect,
  size = WORKING_SIZE,
): Promise<RawImage & { scale: number }> {
  const src = await readSource(input);
  const full = await uprightSize(input);
  if (!region) {
    const work = await wholeWorkingImage(input, src, size);
    return { ...work, scale: work.width / full.width };
  }
  const left = Math.min(full.width - 1, Math.max(0, Math.round(region.x))),
    top = Math.min(full.height - 1, Math.max(0, Math.round(region.y)));
  const box = {
    left,
    top,
    width: Math.max(1, Math.min(full.width - left, Math.round(region.w))),
    height: Math.max(1, Math.min(full.height - top, Math.round(region.h))),
  };
  const stored = await storedFacts(input);
  const d = await reduce(input, src, size, storedBox(box, stored.orientation, stored.width, stored.height));
  return { ...toWorking(d, src.mode), scale: d.width / box.width };
}

export async function uprightSize(input: ImageInput) {
  const m = await sharp(input, { limitInputPixels: false }).metadata();
  const swap = (m.orientation ?? 1) >= 5;
  return { width: swap ? m.height! : m.width!, height: swap ? m.width! : m.height! };
}

import sharp from 'sharp';
import type { RawImage, Rect } from './palette.ts';

/** sharp refuses inputs above 100 megapixels (pixel bombs). */
export const MAX_PIXELS = 100_000_000;

/** Long side of the image the palette is computed on: thin lines 1/300 of the width still show at this size. */
export const WORKING_SIZE = 1024;

export type Input = Buffer | { raw: RawImage };

export const open = (input: Input) =>
  Buffer.isBuffer(input)
    ? sharp(input, { limitInputPixels: MAX_PIXELS, failOn: 'error' })
    : sharp(input.raw.data, { raw: { width: input.raw.width, height: input.raw.height, channels: 3 } });

/**
 * The upright image (or a rectangle of it, in upright full-size pixels) reduced to the
 * working size, as 8-bit sRGB. JPEG shrink-on-load keeps the decode cheap; the linear
 * kernel avoids the overshoot (ringing) at edges that would invent colours.
 */
export async function workingImage(input: Input, region?: Rect, size = WORKING_SIZE): Promise<RawImage & { scale: number }> {
  let img = open(input).rotate();
  if (region) {
    // Extract after auto-orientation needs a materialised upright image.
    const upright = await img.raw().toBuffer({ resolveWithObject: true });
    const { width, height, channels } = upright.info;
    const left = Math.min(width - 1, Math.max(0, Math.round(region.x))), top = Math.min(height - 1, Math.max(0, Math.round(region.y)));
    img = sharp(upright.data, { raw: { width, height, channels: channels as 3 | 4 } }).extract({
      left, top, width: Math.max(1, Math.min(width - left, Math.round(region.w))), height: Math.max(1, Math.min(height - top, Math.round(region.h))),
    });
  }
  const { data, info } = await img
    .resize({ width: size, height: size, fit: 'inside', withoutEnlargement: true, kernel: 'linear' })
    .removeAlpha()
    .toColourspace('srgb')
    .raw()
    .toBuffer({ resolveWithObject: true });
  const fullWidth = region ? region.w : (await uprightSize(input)).width;
  return { data: new Uint8Array(data.buffer, data.byteOffset, data.length), width: info.width, height: info.height, scale: info.width / fullWidth };
}

export async function uprightSize(input: Input) {
  const m = await open(input).metadata();
  const swap = (m.orientation ?? 1) >= 5;
  return { width: swap ? m.height! : m.width!, height: swap ? m.width! : m.height! };
}

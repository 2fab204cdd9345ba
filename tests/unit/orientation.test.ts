import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { orient, storedBox, workingImage } from '../../server/media/decode.ts';

// The pipeline reduces a photo as stored and turns only the reduced image upright (server/media/decode.ts), and cuts
// a region from the stored pixels it shows. Checked here against sharp's own autoOrient() for all eight EXIF
// orientations (TIFF 6.0 Orientation tag, values 1–8), on an image with no symmetry.

const W = 7,
  H = 5;
const pixels = (bits: 8 | 16) => {
  const px = bits === 8 ? new Uint8Array(W * H * 3) : new Uint16Array(W * H * 3);
  for (let y = 0; y < H; y++)
    for (let x = 0; x < W; x++) {
      const i = (y * W + x) * 3;
      px[i] = x * 30 + (bits === 16 ? 7 : 0);
      px[i + 1] = y * 40;
      px[i + 2] = (x * 13 + y * 17) % 200;
    }
  return px;
};

const tiffWith = (orientation: number) =>
  sharp(pixels(8), { raw: { width: W, height: H, channels: 3 } })
    .withMetadata({ orientation })
    .tiff({ compression: 'lzw' })
    .toBuffer();

describe('orientation', () => {
  it.each([1, 2, 3, 4, 5, 6, 7, 8])('orient() turns stored pixels as sharp does for orientation %i', async (o) => {
    for (const bits of [8, 16] as const) {
      const img = sharp(pixels(bits), { raw: { width: W, height: H, channels: 3 } }).withMetadata({ orientation: o });
      const file = await (bits === 16 ? img.toColourspace('rgb16') : img).tiff({ compression: 'lzw' }).toBuffer();
      expect((await sharp(file).metadata()).orientation ?? 1).toBe(o);
      // The pixels as stored (sharp's withMetadata() may convert them on writing) and sharp's upright version.
      const read = async (turn: boolean) => {
        const img = sharp(file, { ignoreIcc: true });
        const { data, info } = await (turn ? img.rotate() : img)
          .toColourspace(bits === 16 ? 'rgb16' : 'srgb')
          .raw({ depth: bits === 16 ? 'ushort' : 'uchar' })
          .toBuffer({ resolveWithObject: true });
        const copy = data.buffer.slice(data.byteOffset, data.byteOffset + data.length);
        return { data: bits === 16 ? new Uint16Array(copy) : new Uint8Array(copy), info };
      };
      const stored = await read(false);
      const theirs = await read(true);
      const ours = orient({ data: stored.data, width: W, height: H, channels: 3 }, o);
      expect([ours.width, ours.height]).toEqual([theirs.info.width, theirs.info.height]);
      expect(Array.from(ours.data)).toEqual(Array.from(theirs.data));
    }
  });

  it.each([1, 2, 3, 4, 5, 6, 7, 8])(
    'a region of a photo with orientation %i is the same rectangle of the upright image',
    async (o) => {
      const file = await tiffWith(o);
      const upright = await sharp(file, { ignoreIcc: true }).rotate().raw().toBuffer({ resolveWithObject: true });
      const region = { x: 1, y: 2, w: 3, h: 2 };
      const ours = await workingImage(file, region);
      expect([ours.width, ours.height, ours.scale]).toEqual([3, 2, 1]);
      const want: number[] = [];
      for (let y = region.y; y < region.y + region.h; y++)
        for (let x = region.x; x < region.x + region.w; x++)
          for (let k = 0; k < 3; k++) want.push(upright.data[(y * upright.info.width + x) * 3 + k]);
      // sharp's withMetadata() tags the file sRGB, so it is read through the profile: floats within rounding.
      expect(Array.from(ours.data).map((v, i) => Math.abs(v - want[i]) < 0.05)).toEqual(want.map(() => true));
      const stored = storedBox({ left: 1, top: 2, width: 3, height: 2 }, o, W, H);
      expect(stored.left + stored.width).toBeLessThanOrEqual(W);
      expect(stored.top + stored.height).toBeLessThanOrEqual(H);
    },
  );
});

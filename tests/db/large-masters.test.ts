import { mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import Color from 'colorjs.io';
import sharp, { type Sharp } from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { HttpError } from '../../server/http/errors.ts';
import { mediaLimits } from '../../server/media/limits.ts';
import { resolveInsideUploads, tmpDir } from '../../server/media/paths.ts';
import { ingestPhoto, photoFile, removePhotoFiles } from '../../server/media/pipeline.ts';
import { PaletteColour, Photo, Region, sequelize, type Piece } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { deltaE00 } from '../../shared/colour/index.ts';
import { writeTiff } from '../support/tiff-writer.ts';

// Issue 18, point 1: large masters. Files are made here (never stored in the repository); the truth for colours is
// colorjs.io's CIELAB D65 of the known 16-bit sRGB values (the palette's own Lab is CIELAB D65/2°, README).

let piece: Piece;
beforeAll(async () => {
  piece = await makePiece({ title: 'Large masters test piece' });
});
afterAll(async () => {
  for (const photo of await Photo.findAll({ where: { pieceId: piece.id } })) {
    await PaletteColour.destroy({ where: { photoId: photo.id } });
    await Region.destroy({ where: { photoId: photo.id } });
    await photo.destroy();
    await removePhotoFiles(photo);
  }
  await piece.destroy({ force: true });
});

/** A file in the uploads' temp folder, as an upload arrives (server/http/upload.ts); the pipeline renames it. */
function uploadFile(name: string) {
  const dir = resolveInsideUploads(tmpDir());
  mkdirSync(dir, { recursive: true });
  return path.join(dir, `upload-${randomBytes(6).toString('hex')}-${name}.part`);
}

const ingestPath = (file: string, originalName: string) =>
  sequelize.transaction((transaction) =>
    ingestPhoto({ actor: null, transaction, input: { path: file, pieceId: piece.id, originalName } }),
  );

/** colorjs.io's CIELAB (D65) of 16-bit sRGB code values. */
const labOf16 = (c: readonly number[]) => {
  const [L, a, b] = new Color('srgb', c.map((v) => v / 65535) as [number, number, number]).to('lab-d65').coords;
  return { L: L ?? 0, a: a ?? 0, b: b ?? 0 };
};

// Known 16-bit colours, deliberately between 8-bit steps (none is a multiple of 257), one dark (8-bit steps are
// coarsest in CIELAB there).
const COLOURS = [
  [40127, 9013, 7471], // a madder red
  [7811, 13229, 27017], // an indigo blue
  [2203, 2851, 1999], // a near-black brown
  [55001, 50123, 40017], // an unbleached ground
] as const;

describe('large masters', () => {
  it('ingests a 4000 × 3000, 16-bit LZW TIFF made from known colours with the palette at 16 bits', async () => {
    const width = 4000,
      height = 3000;
    const px = new Uint16Array(width * height * 3);
    for (let y = 0; y < height; y++)
      for (let x = 0; x < width; x++) {
        const c = COLOURS[(x < width / 2 ? 0 : 1) + (y < height / 2 ? 0 : 2)];
        const i = (y * width + x) * 3;
        px[i] = c[0];
        px[i + 1] = c[1];
        px[i + 2] = c[2];
      }
    const file = uploadFile('sixteen.tif');
    await sharp(px, { raw: { width, height, channels: 3 } })
      .toColourspace('rgb16')
      .tiff({ compression: 'lzw' })
      .toFile(file);
    const meta = await sharp(file).metadata();
    expect([meta.format, meta.depth, meta.width, meta.height]).toEqual(['tiff', 'ushort', width, height]);

    const { photo, palette } = await ingestPath(file, 'sixteen.tif');
    expect([photo.format, photo.width, photo.height]).toEqual(['tiff', width, height]);
    expect(photo.colour).toMatchObject({ bitDepth: 16, assumedSrgb: true, conversion: 'none' });
    for (const c of COLOURS) {
      const truth = labOf16(c);
      const found = palette.filter((p) => !p.background).map((p) => ({ p, d: deltaE00(p, truth) }));
      const best = found.sort((x, y) => x.d - y.d)[0];
      // Read at 16 bits the colour comes out exact but for rounding; read at 8 bits these would be 0.03–0.26 ΔE00
      // off (colorjs.io on the 8-bit rounding), and before the reduction's 16-bit bias was divided out
      // (server/media/decode.ts, unbias) they were 0.01–0.1 off. Tolerance 0.02 ΔE00: ours.
      expect(best.d, `colour ${c.join(',')}`).toBeLessThan(0.02);
      expect(best.p.share).toBeCloseTo(0.25, 2);
    }
    expect(readFileSync(photoFile(photo, 'master')).length).toBe(photo.bytes);
  });

  const tiffs: Array<[string, 8 | 16, 'none' | 'deflate', boolean]> = [
    ['8-bit uncompressed', 8, 'none', false],
    ['16-bit Deflate', 16, 'deflate', false],
    ['16-bit BigTIFF, uncompressed', 16, 'none', true],
    ['8-bit BigTIFF, Deflate', 8, 'deflate', true],
  ];
  it.each(tiffs)('accepts a %s TIFF by its content', async (label, bits, compression, bigTiff) => {
    const c = COLOURS[0];
    const file = uploadFile('strips.tif');
    writeTiff(file, {
      width: 640,
      height: 480,
      bits,
      compression,
      bigTiff,
      row: (_y, out) => {
        for (let i = 0; i < out.length; i += 3)
          for (let k = 0; k < 3; k++) out[i + k] = bits === 16 ? c[k] : Math.round(c[k] / 257);
      },
    });
    const { photo, palette } = await ingestPath(file, `${label}.tif`);
    expect([photo.format, photo.width, photo.height, photo.colour?.bitDepth]).toEqual(['tiff', 640, 480, bits]);
    const truth = bits === 16 ? labOf16(c) : labOf16(c.map((v) => Math.round(v / 257) * 257));
    expect(deltaE00(palette[0], truth)).toBeLessThan(0.05);
  });

  it.each([
    ['a 16-bit PNG', (img: Sharp) => img.toColourspace('rgb16').png({ compressionLevel: 1 }), 'png'],
    ['a JPEG', (img: Sharp) => img.jpeg({ quality: 95 }), 'jpeg'],
    ['a WebP', (img: Sharp) => img.webp({ lossless: true }), 'webp'],
    ['an AVIF (HEIF)', (img: Sharp) => img.avif({ lossless: true, effort: 0 }), 'avif'],
  ] as const)('accepts %s by its content, whatever its name', async (_label, encode, format) => {
    const file = uploadFile('photo.bin');
    await encode(sharp({ create: { width: 320, height: 240, channels: 3, background: '#9e2a2b' } })).toFile(file);
    const { photo } = await ingestPath(file, 'no-extension');
    expect(photo.format).toBe(format);
  });

  describe('limits (MEDIA_MAX_BYTES, MEDIA_MAX_PIXELS), lowered here for a moment', () => {
    const saved = { ...mediaLimits };
    afterAll(() => Object.assign(mediaLimits, saved));

    it('refuses a file above the size limit with 413 naming the limit, and writes nothing', async () => {
      mediaLimits.maxBytes = 1024 * 1024;
      const file = uploadFile('big.png');
      writeFileSync(file, Buffer.alloc(1024 * 1024 + 1));
      const err = await ingestPath(file, 'big.png').catch((e: unknown) => e);
      expect(err).toBeInstanceOf(HttpError);
      expect([(err as HttpError).status, (err as HttpError).code, (err as HttpError).message]).toEqual([
        413,
        'too_large',
        'The file is larger than 1 MB.',
      ]);
      rmSync(file, { force: true });
      mediaLimits.maxBytes = saved.maxBytes;
    });

    it('refuses an image above the pixel limit with 422 before decoding it', async () => {
      mediaLimits.maxPixels = 2_000_000;
      const file = uploadFile('wide.tif');
      writeTiff(file, { width: 2000, height: 1001, bits: 8, compression: 'deflate', row: (_y, out) => out.fill(90) });
      const err = await ingestPath(file, 'wide.tif').catch((e: unknown) => e);
      expect([(err as HttpError).status, (err as HttpError).code, (err as HttpError).message]).toEqual([
        422,
        'pixel_limit',
        'The image is 2000 × 1001 pixels, above the limit of 2 megapixels.',
      ]);
      rmSync(file, { force: true });
      mediaLimits.maxPixels = saved.maxPixels;
    });

    it('refuses a progressive JPEG above the limit for images decoded whole, saying what to upload instead', async () => {
      mediaLimits.maxPixelsDecodedWhole = 1_000_000;
      const file = uploadFile('scan.jpg');
      await sharp({ create: { width: 1200, height: 900, channels: 3, background: '#2e3f66' } })
        .jpeg({ progressive: true })
        .toFile(file);
      const err = await ingestPath(file, 'scan.jpg').catch((e: unknown) => e);
      expect([(err as HttpError).status, (err as HttpError).code, (err as HttpError).message]).toEqual([
        422,
        'pixel_limit',
        'The image is 1200 × 900 pixels. A progressive JPEG is decoded whole, so it is accepted up to 1 megapixel; save it as a TIFF or a baseline JPEG and upload that.',
      ]);
      // The same pixels as a baseline JPEG are read in strips and accepted.
      const baseline = uploadFile('scan-baseline.jpg');
      await sharp({ create: { width: 1200, height: 900, channels: 3, background: '#2e3f66' } })
        .jpeg()
        .toFile(baseline);
      const { photo } = await ingestPath(baseline, 'scan-baseline.jpg');
      expect([photo.format, photo.width]).toEqual(['jpeg', 1200]);
      rmSync(file, { force: true });
      mediaLimits.maxPixelsDecodedWhole = saved.maxPixelsDecodedWhole;
    });

    it('the defaults are 2 GB and 1 gigapixel, 50 megapixels for images decoded whole', () => {
      expect([saved.maxBytes, saved.maxPixels, saved.maxPixelsDecodedWhole]).toEqual([2 * 1024 ** 3, 1e9, 5e7]);
    });
  });
});

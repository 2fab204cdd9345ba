import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { createHash, randomBytes } from 'node:crypto';
import path from 'node:path';
import { crc32 } from 'node:zlib';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { env } from '../../server/env.ts';
import { HttpError } from '../../server/http/errors.ts';
import { mediaLimits } from '../../server/media/limits.ts';
import { ingestPhoto, photoFile, removePhotoFiles, repalette } from '../../server/media/pipeline.ts';
import { masterPath, resolveInsideUploads } from '../../server/media/paths.ts';
import { ORPHAN_AGE_MS, reconcileOrphans } from '../../server/media/reconcile.ts';
import { PaletteColour, Photo, Region, sequelize, type Piece } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { paintCloth } from '../../server/seed/cloth-image.ts';
import { deltaE00, hexToLab, srgbToLab } from '../../shared/colour/index.ts';
import { inProfile } from '../support/icc-images.ts';

let piece: Piece;
beforeAll(async () => {
  piece = await makePiece({ title: 'Media pipeline test piece' });
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

function filesUnder(dir: string): string[] {
  let out: string[] = [];
  let entries: string[] = [];
  try {
    entries = readdirSync(dir);
  } catch {
    return out;
  }
  for (const name of entries) {
    const p = path.join(dir, name);
    out = statSync(p).isDirectory() ? out.concat(filesUnder(p)) : out.concat(p);
  }
  return out;
}

const ingest = (buffer: Buffer, extra: Record<string, unknown> = {}) =>
  sequelize.transaction((transaction) =>
    ingestPhoto({ actor: null, transaction, input: { buffer, pieceId: piece.id, originalName: 'x.jpg', ...extra } }),
  );

const solid = (colour: string, width = 64, height = 48) =>
  sharp({ create: { width, height, channels: 3, background: colour } });

describe('ingestPhoto', () => {
  it('keeps the master byte for byte by SHA-256, makes WebP derivatives and a palette, all in one transaction', async () => {
    const cloth = paintCloth({
      width: 900,
      height: 600,
      ground: '#e6d9bf',
      shapes: [{ kind: 'rect', x: 300, y: 150, w: 300, h: 300, colour: '#2e3f66' }],
      noise: 3,
      seed: 2,
    });
    const buffer = await sharp(cloth.data, { raw: { width: 900, height: 600, channels: 3 } })
      .png()
      .toBuffer();
    const { photo, palette } = await ingest(buffer);
    const master = photoFile(photo, 'master');
    expect(readFileSync(master).equals(buffer)).toBe(true);
    expect(photo.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(master.endsWith(masterPath(photo.sha256, 'png'))).toBe(true);
    expect([photo.format, photo.width, photo.height, photo.bytes]).toEqual(['png', 900, 600, buffer.length]);
    for (const [kind, long] of [
      ['thumb', 320],
      ['display', 900],
    ] as const) {
      const meta = await sharp(photoFile(photo, kind)).metadata();
      expect([meta.format, Math.max(meta.width!, meta.height!)]).toEqual(['webp', long]);
      expect(meta.exif).toBeUndefined();
    }
    expect(palette.map((p) => [p.rank, p.variant, p.regionId, p.source])).toEqual(
      palette.map((_, i) => [i, 'raw', null, 'image-estimate']),
    );
    const indigo = palette.find((p) => deltaE00(p, hexToLab('#2e3f66')) < 1.5);
    expect(indigo?.share).toBeCloseTo(cloth.truth[1].share, 1);
    expect(await PaletteColour.count({ where: { photoId: photo.id } })).toBe(palette.length);
  });

  it('reads a 16-bit TIFF in an Adobe RGB (1998)-compatible profile: palette, display image and colour facts', async () => {
    // Truth: the painted sRGB colours (CIELAB through colorjs.io); the file is the same cloth re-encoded
    // in Adobe RGB at 16 bits by colorjs.io with Debian's 'Compatible with Adobe RGB (1998)' profile.
    const truth = ['#e6d9bf', '#9e2a2b', '#2e3f66'];
    const cloth = paintCloth({
      width: 900,
      height: 600,
      ground: truth[0],
      shapes: [
        { kind: 'rect', x: 100, y: 100, w: 300, h: 400, colour: truth[1] },
        { kind: 'rect', x: 500, y: 100, w: 300, h: 400, colour: truth[2] },
      ],
      noise: 3,
      seed: 8,
    });
    const { photo, palette } = await ingest(await inProfile(cloth, 'a98rgb', 16, 'tiff'), {
      originalName: 'adobe16.tif',
    });
    for (const hex of truth)
      expect(Math.min(...palette.map((p) => deltaE00(p, hexToLab(hex)))), hex).toBeLessThanOrEqual(1.5);
    expect(photo.colour).toEqual({
      profile: 'Compatible with Adobe RGB (1998)',
      assumedSrgb: false,
      bitDepth: 16,
      colourSpace: 'RGB',
      cmykConverted: false,
      conversion: 'icc-matrix',
    });
    // The display derivative is 8-bit sRGB: the red area's centre pixel is the painted red (noise σ 3 → own tolerance 2).
    const { data, info } = await sharp(photoFile(photo, 'display')).raw().toBuffer({ resolveWithObject: true });
    const i = (300 * info.width + 250) * info.channels;
    expect(deltaE00(srgbToLab({ r: data[i], g: data[i + 1], b: data[i + 2] }), hexToLab(truth[1]))).toBeLessThan(2);
  });

  it('records a photo without a profile as taken as sRGB', async () => {
    const { photo } = await ingest(await paintJpeg());
    expect(photo.colour).toMatchObject({
      profile: null,
      assumedSrgb: true,
      bitDepth: 8,
      colourSpace: 'RGB',
      conversion: 'none',
    });
  });

  it('reads EXIF (dates as written, no time zone) and keeps GPS only in photo.gps', async () => {
    // sharp's withExif takes strings only; GPS rationals as "d/1 m/1 s/1".
    const buffer = await solid('#9e2a2b')
      .jpeg()
      .withExif({
        IFD0: { Make: 'Weldfold Optics', Model: 'Copy stand 2' },
        IFD2: {
          DateTimeOriginal: '2024:05:06 07:08:09',
          ExposureTime: '1/125',
          FNumber: '8/1',
          LensModel: 'Flat-field 60mm',
        },
        IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 30/1' },
      })
      .toBuffer();
    const { photo } = await ingest(buffer);
    expect(photo.exif).toMatchObject({
      make: 'Weldfold Optics',
      model: 'Copy stand 2',
      lens: 'Flat-field 60mm',
      exposureTime: 0.008,
      fNumber: 8,
      dateTimeOriginal: '2024:05:06 07:08:09',
    });
    expect(photo.capturedAt).toBe('2024-05-06T07:08:09');
    expect(photo.gps).toEqual({ latitude: 51.5, longitude: -0.125 });
    expect(JSON.stringify(photo.exif)).not.toMatch(/51\.5|GPS|latitude/i);
    for (const kind of ['thumb', 'display'] as const)
      expect((await sharp(photoFile(photo, kind)).metadata()).exif).toBeUndefined();
  });

  it('turns an orientation-6 photo upright in its derivatives', async () => {
    // Stored left half red, right half blue; orientation 6 means "rotate 90° clockwise to view",
    // so upright the top is red and the image is portrait.
    const raw = Buffer.alloc(64 * 48 * 3);
    for (let y = 0; y < 48; y++)
      for (let x = 0; x < 64; x++) raw.set(x < 32 ? [200, 20, 20] : [20, 20, 200], (y * 64 + x) * 3);
    const buffer = await sharp(raw, { raw: { width: 64, height: 48, channels: 3 } })
      .jpeg({ quality: 95 })
      .withMetadata({ orientation: 6 })
      .toBuffer();
    const { photo } = await ingest(buffer);
    expect([photo.width, photo.height]).toEqual([48, 64]);
    const { data, info } = await sharp(photoFile(photo, 'display')).raw().toBuffer({ resolveWithObject: true });
    expect([info.width, info.height]).toEqual([48, 64]);
    const px = (x: number, y: number) => [
      ...data.subarray((y * info.width + x) * info.channels, (y * info.width + x) * info.channels + 3),
    ];
    expect(px(24, 8)[0]).toBeGreaterThan(150);
    expect(px(24, 56)[2]).toBeGreaterThan(150);
  });

  it('shares one master between identical uploads and deletes it with the last photo', async () => {
    const buffer = await solid('#6b8a3a').png().toBuffer();
    const a = (await ingest(buffer)).photo;
    const b = (await ingest(buffer)).photo;
    expect(photoFile(a, 'master')).toBe(photoFile(b, 'master'));
    await sequelize.transaction(async (transaction) => {
      await PaletteColour.destroy({ where: { photoId: a.id }, transaction });
      await a.destroy({ transaction });
      await removePhotoFiles(a, transaction);
    });
    expect(filesUnder(path.dirname(photoFile(b, 'master')))).toContain(photoFile(b, 'master'));
    expect(() => statSync(photoFile(a, 'display'))).toThrow();
    await PaletteColour.destroy({ where: { photoId: b.id } });
    await b.destroy();
    await removePhotoFiles(b);
    expect(() => statSync(photoFile(b, 'master'))).toThrow();
  });

  describe('refuses bad files and leaves nothing behind', () => {
    // A small PNG whose header claims 40 000 × 30 000 pixels (1.2 gigapixels, above the default limit of 1), with a
    // valid header CRC.
    const bomb = async () => {
      const png = Buffer.from(await solid('#ffffff', 16, 16).png().toBuffer());
      png.writeUInt32BE(40000, 16);
      png.writeUInt32BE(30000, 20);
      png.writeUInt32BE(crc32(png.subarray(12, 29)), 29);
      return png;
    };
    const cases: Array<[string, () => Promise<Buffer>, number, string]> = [
      [
        'a text file renamed .jpg',
        async () => Buffer.from('These are not the pixels you are looking for.\n'),
        415,
        'unsupported_type',
      ],
      [
        'a truncated JPEG',
        async () => {
          const j = await paintJpeg();
          return j.subarray(0, Math.floor(j.length / 2));
        },
        422,
        'corrupt_image',
      ],
      ['a pixel bomb', bomb, 422, 'pixel_limit'],
      ['zero bytes', async () => Buffer.alloc(0), 422, 'empty_file'],
      [
        'an SVG (not accepted)',
        async () => Buffer.from('<svg xmlns="http://www.w3.org/2000/svg" width="10" height="10"/>'),
        415,
        'unsupported_type',
      ],
      [
        'a CMYK JPEG with its profile',
        async () =>
          sharp(await paintJpeg())
            .toColourspace('cmyk')
            .withIccProfile('cmyk')
            .jpeg()
            .toBuffer(),
        415,
        'cmyk_not_supported',
      ],
      [
        'a CMYK TIFF without a profile',
        async () =>
          sharp(await paintJpeg())
            .toColourspace('cmyk')
            .tiff()
            .toBuffer(),
        415,
        'cmyk_not_supported',
      ],
    ];
    it.each(cases)('%s', async (_, make, status, code) => {
      const before = filesUnder(env.UPLOADS_DIR).sort();
      const rowsBefore = await Photo.count({ where: { pieceId: piece.id } });
      const err = await ingest(await make()).catch((e: unknown) => e);
      expect(err).toBeInstanceOf(HttpError);
      expect([(err as HttpError).status, (err as HttpError).code]).toEqual([status, code]);
      expect((err as HttpError).message.length).toBeGreaterThan(10);
      expect(filesUnder(env.UPLOADS_DIR).sort()).toEqual(before);
      expect(await Photo.count({ where: { pieceId: piece.id } })).toBe(rowsBefore);
    });

    it('a file above the size limit answers 413 (the limit lowered to 1 MB for this test)', async () => {
      const saved = mediaLimits.maxBytes;
      mediaLimits.maxBytes = 1024 * 1024;
      try {
        const err = await ingest(Buffer.alloc(1024 * 1024 + 1)).catch((e: unknown) => e);
        expect([(err as HttpError).status, (err as HttpError).code]).toEqual([413, 'too_large']);
      } finally {
        mediaLimits.maxBytes = saved;
      }
    });
  });
});

async function paintJpeg() {
  const cloth = paintCloth({
    width: 600,
    height: 400,
    ground: '#e6d9bf',
    shapes: [{ kind: 'rect', x: 100, y: 100, w: 200, h: 200, colour: '#9e2a2b' }],
    noise: 3,
    seed: 4,
  });
  return sharp(cloth.data, { raw: { width: 600, height: 400, channels: 3 } })
    .jpeg()
    .toBuffer();
}

describe('repalette', () => {
  it('adds a palette per colour area, leaves out exclusions, and a corrected palette from a reference patch', async () => {
    const spec = {
      width: 1200,
      height: 800,
      ground: '#e6d9bf',
      tint: [1.1, 1, 0.8] as [number, number, number],
      noise: 3,
      seed: 9,
      shapes: [
        { kind: 'rect' as const, x: 100, y: 100, w: 400, h: 400, colour: '#9e2a2b' },
        { kind: 'rect' as const, x: 700, y: 100, w: 300, h: 300, colour: '#2e3f66' },
        { kind: 'rect' as const, x: 950, y: 600, w: 200, h: 150, colour: '#9a9a9a' },
      ],
    };
    const buffer = await sharp(paintCloth(spec).data, { raw: { width: 1200, height: 800, channels: 3 } })
      .png()
      .toBuffer();
    const { photo } = await ingest(buffer);
    const rows = await sequelize.transaction(async (transaction) => {
      await Region.bulkCreate(
        [
          {
            photoId: photo.id,
            x: 120,
            y: 120,
            w: 360,
            h: 360,
            purpose: 'colour-area',
            label: 'red ground',
            createdById: null,
          },
          {
            photoId: photo.id,
            x: 680,
            y: 80,
            w: 340,
            h: 340,
            purpose: 'exclusion',
            label: 'blue patch out',
            createdById: null,
          },
          {
            photoId: photo.id,
            x: 950,
            y: 600,
            w: 200,
            h: 150,
            purpose: 'reference-patch',
            label: 'grey card',
            createdById: null,
          },
        ],
        { transaction },
      );
      return repalette({ transaction, photo });
    });
    const region = await Region.findOne({ where: { photoId: photo.id, purpose: 'colour-area' } });
    const whole = rows.filter((r) => r.regionId === null && r.variant === 'raw');
    const wholeCorrected = rows.filter((r) => r.regionId === null && r.variant === 'corrected');
    const area = rows.filter((r) => r.regionId === region!.id && r.variant === 'corrected');
    expect(whole.length).toBeGreaterThan(0);
    expect(wholeCorrected.length).toBeGreaterThan(0);
    // The excluded blue rectangle and the grey patch do not appear.
    expect(whole.every((r) => deltaE00(r, { L: 28, a: 3, b: -25 }) > 10 && Math.hypot(r.a, r.b) > 5)).toBe(true);
    // The region palette is the red area alone; corrected, it is within ΔE00 2 of the true red.
    expect(area).toHaveLength(1);
    expect(deltaE00(area[0], hexToLab('#9e2a2b'))).toBeLessThanOrEqual(2);
    expect(area[0].share).toBeCloseTo(1, 9);
    expect(await PaletteColour.count({ where: { photoId: photo.id } })).toBe(rows.length);
    await photo.reload();
    expect(photo.correction).toMatchObject({ method: 'bradford', to: 'D65' });
  });
});

describe('the whole-photo palette at ingest and after a full recompute', () => {
  it('is the same: same rows, same ids, same values (both reduce the photo the same way)', async () => {
    const cloth = paintCloth({
      width: 2400,
      height: 1600,
      ground: '#e6d9bf',
      shapes: [
        { kind: 'ellipse', cx: 800, cy: 800, rx: 400, ry: 300, colour: '#9e2a2b' },
        { kind: 'rect', x: 1500, y: 300, w: 600, h: 900, colour: '#2e3f66' },
      ],
      noise: 4,
      weave: 0.05,
      seed: 17,
    });
    const jpeg = await sharp(cloth.data, { raw: { width: 2400, height: 1600, channels: 3 } })
      .jpeg({ quality: 90 })
      .toBuffer();
    const { photo, palette } = await ingest(jpeg);
    const values = (rows: PaletteColour[]) =>
      rows.map((c) => [c.id, c.rank, c.L, c.a, c.b, c.share, c.background]).sort((x, y) => Number(x[0]) - Number(y[0]));
    const after = await sequelize.transaction((transaction) => repalette({ transaction, photo, scope: 'all' }));
    expect(values(after)).toEqual(values(palette));
  });
});

describe('paths', () => {
  it('refuses paths that leave the uploads folder', () => {
    for (const bad of ['../x', 'masters/../../x', '/etc/passwd', '', '.'])
      expect(() => resolveInsideUploads(bad)).toThrow(HttpError);
    expect(resolveInsideUploads('masters/ab/x.jpg')).toBe(path.join(path.resolve(env.UPLOADS_DIR), 'masters/ab/x.jpg'));
    expect(() => masterPath('../etc', 'jpg')).toThrow();
  });
});

describe('no orphan masters (a master goes into place only after its transaction commits)', () => {
  const pngOf = (colour: string) => solid(colour, 40, 30).png().toBuffer();
  const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
  const tmpNames = (hash: string) =>
    readdirSync(resolveInsideUploads('tmp')).filter((n) => n.startsWith(`master-${hash}.`));
  // Files written "long ago": mtime pushed back past the reconciler's hour (ORPHAN_AGE_MS).
  const age = (abs: string, ms = ORPHAN_AGE_MS + 60_000) => {
    const t = new Date(Date.now() - ms);
    utimesSync(abs, t, t);
  };
  const put = (relative: string, data: Buffer) => {
    const abs = resolveInsideUploads(relative);
    mkdirSync(path.dirname(abs), { recursive: true });
    writeFileSync(abs, data);
    return abs;
  };

  it('leaves no master when the transaction fails after the pipeline ran, only a fresh temp file the reconciler keeps', async () => {
    const buffer = await pngOf('#7a3b1f');
    const hash = sha(buffer);
    await expect(
      sequelize.transaction(async (transaction) => {
        await ingestPhoto({ actor: null, transaction, input: { buffer, pieceId: piece.id, originalName: 'x.png' } });
        throw new Error('a later step of the same upload fails');
      }),
    ).rejects.toThrow('a later step');
    expect(existsSync(resolveInsideUploads(masterPath(hash, 'png')))).toBe(false);
    expect(await Photo.count({ where: { sha256: hash } })).toBe(0);
    const temps = tmpNames(hash);
    expect(temps).toHaveLength(1);
    // A fresh temp file may belong to an upload still running: left alone.
    const removed = await reconcileOrphans();
    expect(removed.some((o) => o.file.includes(hash))).toBe(false);
    expect(tmpNames(hash)).toEqual(temps);
    // An hour later it is an orphan and goes.
    age(resolveInsideUploads(`tmp/${temps[0]}`));
    const later = await reconcileOrphans();
    expect(later).toContainEqual(expect.objectContaining({ file: `tmp/${temps[0]}`, kind: 'temp' }));
    expect(tmpNames(hash)).toHaveLength(0);
  });

  it('moves the master into place once the transaction commits, with no temp file left', async () => {
    const buffer = await pngOf('#1f5a7a');
    const { photo } = await ingest(buffer);
    expect(readFileSync(photoFile(photo, 'master')).equals(buffer)).toBe(true);
    expect(tmpNames(photo.sha256)).toHaveLength(0);
  });

  it('removes and reports an unreferenced master older than an hour; keeps referenced and fresh ones', async () => {
    const orphanHash = randomBytes(32).toString('hex');
    const orphan = masterPath(orphanHash, 'jpg');
    age(put(orphan, Buffer.from('left by a killed process')));
    const freshHash = randomBytes(32).toString('hex');
    const fresh = masterPath(freshHash, 'jpg');
    put(fresh, Buffer.from('an upload committing right now'));
    const { photo } = await ingest(await pngOf('#5a7a1f'));
    age(photoFile(photo, 'master'));
    const oldTemp = `tmp/${randomBytes(8).toString('hex')}.part`;
    age(put(oldTemp, Buffer.from('half a derivative')));

    const removed = await reconcileOrphans();
    expect(removed).toContainEqual({
      file: orphan,
      kind: 'master',
      bytes: 24,
      modifiedAt: expect.stringMatching(/^\d{4}-/),
    });
    expect(removed).toContainEqual(expect.objectContaining({ file: oldTemp, kind: 'temp' }));
    expect(existsSync(resolveInsideUploads(orphan))).toBe(false);
    expect(existsSync(resolveInsideUploads(oldTemp))).toBe(false);
    expect(existsSync(resolveInsideUploads(fresh))).toBe(true);
    expect(existsSync(photoFile(photo, 'master'))).toBe(true);
    expect(removed.some((o) => o.file.includes(photo.sha256) || o.file === fresh)).toBe(false);
    await removeFile(fresh);
  });

  it('removes derivatives and tiles folders of photos that never committed, once untouched for an hour', async () => {
    const ghost = 2_000_000_000 + Math.floor(Math.random() * 100_000_000);
    const oldDerivative = put(`derivatives/${ghost}/display.webp`, Buffer.from('a derivative of a rolled-back photo'));
    age(oldDerivative);
    age(path.dirname(oldDerivative));
    const freshGhost = ghost + 1;
    put(`tiles/${freshGhost}/info.json`, Buffer.from('{}')); // an upload still running: kept
    const { photo } = await ingest(await pngOf('#1f5a7a'));
    const kept = put(`tiles/${photo.id}/iiif/info.json`, Buffer.from('{}'));
    age(kept);
    age(path.dirname(kept));

    const removed = await reconcileOrphans();
    expect(removed).toContainEqual({
      file: `derivatives/${ghost}`,
      kind: 'derivatives',
      bytes: 35,
      modifiedAt: expect.stringMatching(/^\d{4}-/),
    });
    expect(existsSync(resolveInsideUploads(`derivatives/${ghost}`))).toBe(false);
    expect(existsSync(resolveInsideUploads(`tiles/${freshGhost}/info.json`))).toBe(true);
    expect(existsSync(kept)).toBe(true);
    rmSync(resolveInsideUploads(`tiles/${freshGhost}`), { recursive: true, force: true });
  });

  it('finishes the move of a committed photo whose process died before moving its master', async () => {
    const buffer = await pngOf('#7a1f5a');
    const { photo } = await ingest(buffer);
    const master = photoFile(photo, 'master');
    // As if the process died between the commit and the move: the master is still under tmp/.
    const temp = `tmp/master-${photo.sha256}.png.${randomBytes(8).toString('hex')}.part`;
    age(put(temp, readFileSync(master)));
    await removeFile(path.relative(path.resolve(env.UPLOADS_DIR), master));
    const removed = await reconcileOrphans();
    expect(removed.some((o) => o.file === temp)).toBe(false);
    expect(readFileSync(master).equals(buffer)).toBe(true);
    expect(existsSync(resolveInsideUploads(temp))).toBe(false);
  });
});

async function removeFile(relative: string) {
  const { rm } = await import('node:fs/promises');
  await rm(resolveInsideUploads(relative), { force: true });
}

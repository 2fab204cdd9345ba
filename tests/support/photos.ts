import { createHash } from 'node:crypto';
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { Photo, Region } from '../../server/models/index.ts';
import { masterPath } from '../../server/iiif/files.ts';

/**
 * A photo row with a real master file at the agreed uploads path: a JPEG of coloured
 * bands (so tiles differ by position), stored under its SHA-256 as the media pipeline does.
 */
export async function makePhotoWithMaster(pieceId: number | null, opts: { width?: number; height?: number; seed?: number; regions?: Array<{ x: number; y: number; w: number; h: number; label: string }> } = {}) {
  const width = opts.width ?? 1500;
  const height = opts.height ?? 1000;
  const seed = opts.seed ?? Math.floor(Math.random() * 1e9);
  const bands = [0, 1, 2].map((i) => ({
    input: { create: { width: Math.ceil(width / 3), height, channels: 3 as const, background: { r: (seed + i * 80) % 256, g: (seed >> 3) % 256, b: 40 + i * 60 } } },
    left: i * Math.floor(width / 3),
    top: 0,
  }));
  const buffer = await sharp({ create: { width, height, channels: 3, background: { r: 200, g: 190, b: 170 } } })
    .composite(bands)
    .jpeg({ quality: 90 })
    .toBuffer();
  const sha256 = createHash('sha256').update(buffer).digest('hex');
  const file = masterPath(sha256, 'jpg');
  await mkdir(path.dirname(file), { recursive: true });
  await writeFile(file, buffer);
  const photo = await Photo.create({
    pieceId, trialId: null, sha256, format: 'jpeg', bytes: buffer.length, width, height, view: 'recto',
    originalName: `test-${seed}.jpg`, caption: null, capturedAt: null, exif: {}, gps: null, derivatives: {},
    referencePatch: null, correction: null, createdById: null,
  });
  for (const r of opts.regions ?? []) await Region.create({ photoId: photo.id, ...r, purpose: 'motif', createdById: null });
  return { photo, file, buffer };
}

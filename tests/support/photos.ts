import sharp from 'sharp';
import { sequelize } from '../../server/models/index.ts';
import { ingestPhoto, photoFile, photoKey } from '../../server/media/pipeline.ts';
import { makeRegion } from '../../server/seed/factories.ts';

/**
 * A photo uploaded through the real media pipeline (master stored by SHA-256,
 * derivatives, palette): a JPEG of three coloured bands, so tiles differ by position.
 */
export async function makePhotoWithMaster(
  pieceId: number | null,
  opts: {
    width?: number;
    height?: number;
    seed?: number;
    regions?: Array<{ x: number; y: number; w: number; h: number; label: string }>;
  } = {},
) {
  const width = opts.width ?? 1500;
  const height = opts.height ?? 1000;
  const seed = opts.seed ?? Math.floor(Math.random() * 1e9);
  const third = Math.floor(width / 3);
  const bands = [0, 1, 2].map((i) => ({
    input: {
      create: {
        width: third,
        height,
        channels: 3 as const,
        background: { r: (seed + i * 80) % 256, g: (seed >> 3) % 256, b: 40 + i * 60 },
      },
    },
    left: i * third,
    top: 0,
  }));
  const buffer = await sharp({ create: { width, height, channels: 3, background: { r: 200, g: 190, b: 170 } } })
    .composite(bands)
    .jpeg({ quality: 90 })
    .toBuffer();
  const { photo } = await sequelize.transaction((transaction) =>
    ingestPhoto({ actor: null, transaction, input: { buffer, pieceId, originalName: `test-${seed}.jpg` } }),
  );
  for (const r of opts.regions ?? [])
    await makeRegion({ photoId: photo.id, ...r, purpose: 'motif', createdById: null });
  return {
    photo,
    /** The master's storage key (server/storage). */
    key: photoKey(photo, 'master'),
    /** The master's file on disk (local storage driver only). */
    get file() {
      return photoFile(photo, 'master');
    },
    buffer,
  };
}

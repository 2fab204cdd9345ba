import sharp from 'sharp';
import { Photo, sequelize } from '../../server/models/index.ts';
import { runOnce } from '../../server/jobs/worker.ts';
import { photoFile, photoKey, storePhoto } from '../../server/media/pipeline.ts';
import { enqueueIngest } from '../../server/jobs/handlers/ingest-photo.ts';
import { makeRegion } from '../../server/seed/factories.ts';

/**
 * A photo uploaded through the real media pipeline (master stored by SHA-256, then its ingest job: derivatives,
 * palette, tiles): a JPEG of three coloured bands, so tiles differ by position.
 */
export async function makePhotoWithMaster(
  pieceId: number | null,
  opts: {
    width?: number;
    height?: number;
    seed?: number;
    regions?: Array<{ x: number; y: number; w: number; h: number; label: string }>;
    /** false: leave its ingest job queued (the caller runs it, e.g. after removing the master). */
    ingest?: boolean;
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
  // Stored as an upload is, its ingest job queued with it; then (unless `ingest: false`) that job is run here.
  const { photo } = await sequelize.transaction(async (transaction) => {
    const stored = await storePhoto({
      actor: null,
      transaction,
      input: { buffer, pieceId, originalName: `test-${seed}.jpg` },
    });
    await enqueueIngest(stored.photo.id, transaction);
    return stored;
  });
  for (const r of opts.regions ?? [])
    await makeRegion({ photoId: photo.id, ...r, purpose: 'motif', createdById: null });
  if (opts.ingest !== false) await ingested(photo.id);
  await photo.reload();
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

/**
 * Waits for uploaded photos to be processed (their `ingest-photo` jobs, issue 18): runs ingest jobs in this process
 * until every photo named is done or failed. Another test file's process may hold one of them (the test database is
 * shared): then it asks again until that one finishes. Answers the photos as stored, in the order given.
 */
export async function ingested(...photoIds: number[]) {
  const settled = (p: Photo | null) => !p || p.ingestStage === 'done' || p.ingestStage === 'failed';
  for (;;) {
    const photos = await Promise.all(photoIds.map((id) => Photo.findByPk(id)));
    if (photos.every(settled)) return photos as Photo[];
    if ((await runOnce({ types: ['ingest-photo'] })) === null) await new Promise((r) => setTimeout(r, 50));
  }
}

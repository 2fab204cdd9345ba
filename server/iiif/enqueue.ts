import { Op, type Transaction } from 'sequelize';
import { Photo, sequelize } from '../models/index.ts';
import { enqueue, enqueueMany } from '../jobs/queue.ts';
import { TILE_JOB } from '../jobs/handlers/tile-photo.ts';

/** Queue the deep-zoom tiles of one photo, in the caller's transaction (called after an upload). */
export async function enqueueTiles(photoId: number, transaction?: Transaction, createdById: number | null = null) {
  await Photo.update({ tileStatus: 'queued' }, { where: { id: photoId }, transaction });
  return enqueue(
    { type: TILE_JOB, payload: { photoId }, subject: { type: 'photo', id: photoId }, createdById },
    transaction,
  );
}

/**
 * After start: queue tiles for every photo that has none and no job in hand (photos from before tiling existed, or
 * the demo). In batches of 1,000, each one transaction that locks its photos with SKIP LOCKED, so servers starting
 * together share the work rather than queue a photo twice, and a large backlog never holds a server's start.
 */
export async function enqueueMissingTiles() {
  let total = 0;
  for (;;) {
    const n = await sequelize.transaction(async (transaction) => {
      const photos = await Photo.findAll({
        attributes: ['id'],
        where: { tileStatus: { [Op.in]: ['none'] } },
        order: [['id', 'ASC']],
        limit: 1000,
        transaction,
        lock: transaction.LOCK.UPDATE,
        skipLocked: true,
      });
      if (!photos.length) return 0;
      const ids = photos.map((p) => p.id);
      await Photo.update({ tileStatus: 'queued' }, { where: { id: ids }, transaction });
      await enqueueMany(
        ids.map((photoId) => ({
          type: TILE_JOB,
          payload: { photoId },
          subject: { type: 'photo' as const, id: photoId },
        })),
        transaction,
      );
      return ids.length;
    });
    total += n;
    if (n < 1000) return total;
  }
}

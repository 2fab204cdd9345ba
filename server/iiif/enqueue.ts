import { Op, type Transaction } from 'sequelize';
import { Photo, sequelize } from '../models/index.ts';
import { enqueue } from '../jobs/queue.ts';
import { TILE_JOB } from '../jobs/handlers/tile-photo.ts';

/** Queue the deep-zoom tiles of one photo, in the caller's transaction (called after an upload). */
export async function enqueueTiles(photoId: number, transaction?: Transaction, createdById: number | null = null) {
  await Photo.update({ tileStatus: 'queued' }, { where: { id: photoId }, transaction });
  return enqueue(
    { type: TILE_JOB, payload: { photoId }, subject: { type: 'photo', id: photoId }, createdById },
    transaction,
  );
}

/** At start: queue tiles for every photo that has none and no job in hand (photos from before tiling existed, or the demo). */
export async function enqueueMissingTiles() {
  return sequelize.transaction(async (transaction) => {
    const photos = await Photo.findAll({
      attributes: ['id'],
      where: { tileStatus: { [Op.in]: ['none'] } },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    for (const p of photos) await enqueueTiles(p.id, transaction);
    return photos.length;
  });
}

import { Photo } from '../../models/index.ts';
import { findMaster, tilesPrefix } from '../../iiif/files.ts';
import { storage, withLocalFile } from '../../storage/index.ts';
import { buildTiles } from '../../iiif/tiles.ts';
import { PermanentJobError } from '../queue.ts';
import { registerHandler } from '../registry.ts';
import { hasPendingMaster } from '../../media/files.ts';

export const TILE_JOB = 'tile-photo';

registerHandler(TILE_JOB, {
  async run(job, ctx) {
    const { photoId } = job.payload;
    const photo = await Photo.findByPk(photoId);
    if (!photo) throw new PermanentJobError(`Photo ${photoId} no longer exists.`);
    await photo.update({ tileStatus: 'running' });
    const master = await findMaster(photo);
    if (!master) {
      // A new upload's master is moved into place just after its transaction commits (server/media/pipeline.ts):
      // a worker on another server may claim the job in that instant, while the file is still under tmp/.
      const reason = `The master file of photo ${photoId} is missing (sha256 ${photo.sha256}).`;
      throw (await hasPendingMaster(photo.sha256)) ? new Error(reason) : new PermanentJobError(reason);
    }
    await ctx.progress(0.1);
    // libvips reads a file: the stored one, or (object storage) a copy downloaded for the build and removed after.
    await withLocalFile(master, (file) => buildTiles(photoId, file, `${job.id}-${job.attempts}`));
    // Removed while its tiles were being built: take the tiles away too, so no orphan folder stays behind.
    if (!(await Photo.findByPk(photoId))) {
      await storage().deletePrefix(tilesPrefix(photoId));
      throw new PermanentJobError(`Photo ${photoId} was removed while its tiles were built.`);
    }
    await ctx.progress(0.95);
    await photo.update({ tileStatus: 'done' });
    return { photoId };
  },
  async onFailed(job) {
    await Photo.update({ tileStatus: 'failed' }, { where: { id: job.payload.photoId } });
  },
  async onRetry(payload) {
    await Photo.update({ tileStatus: 'queued' }, { where: { id: payload.photoId } });
  },
});

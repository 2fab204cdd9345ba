import { Op, type Transaction } from 'sequelize';
import { HttpError } from '../../http/errors.ts';
import { IngestGone, runIngest } from '../../media/pipeline.ts';
import { Photo, sequelize } from '../../models/index.ts';
import { enqueue, enqueueMany, PermanentJobError } from '../queue.ts';
import { registerHandler } from '../registry.ts';

/**
 * A photo's processing after its master is stored (issue 18): the steps of shared/schemas/ingest.ts in order
 * (runIngest in server/media/pipeline.ts), the photo's `ingestStage` following them. A file that cannot be read
 * fails at once with the reason in words; other errors are retried with back-off; a worker that dies loses its
 * lease and the job is queued again (server/jobs/queue.ts requeueExpired), its photo back to `queued`.
 */
export const INGEST_JOB = 'ingest-photo';

registerHandler(INGEST_JOB, {
  async run(job, ctx) {
    const { photoId } = job.payload;
    const photo = await Photo.findByPk(photoId);
    if (!photo) throw new PermanentJobError(`Photo ${photoId} no longer exists.`);
    try {
      await runIngest(photo, { progress: ctx.progress, jobTag: `${job.id}-${job.attempts}` });
    } catch (err) {
      if (err instanceof HttpError || err instanceof IngestGone) throw new PermanentJobError(err.message);
      throw err;
    }
    return { photoId };
  },
  async onFailed(job, reason) {
    await Photo.update(
      { ingestStage: 'failed', ingestError: reason.slice(0, 2000) },
      { where: { id: job.payload.photoId } },
    );
  },
  async onRetry(payload) {
    await Photo.update({ ingestStage: 'queued', ingestError: null }, { where: { id: payload.photoId } });
  },
});

/** Queue a stored photo's ingest, in the transaction that wrote its row: a photo never exists without its job. */
export async function enqueueIngest(photoId: number, transaction?: Transaction, createdById: number | null = null) {
  return enqueue(
    { type: INGEST_JOB, payload: { photoId }, subject: { type: 'photo', id: photoId }, createdById },
    transaction,
  );
}

/**
 * After start: queue the ingest of every photo still `queued` with no ingest job queued or running (photos from
 * before ingest jobs whose tiles were never queued). In batches of 1,000, each one transaction that locks its
 * photos with SKIP LOCKED, so servers starting together share the work, and a large backlog never holds a start.
 */
export async function enqueueMissingIngest() {
  let total = 0;
  let after = 0;
  for (;;) {
    const { n, last } = await sequelize.transaction(async (transaction) => {
      const photos = await Photo.findAll({
        attributes: ['id'],
        where: {
          ingestStage: 'queued',
          id: { [Op.gt]: after },
          [Op.and]: sequelize.literal(
            `NOT EXISTS (SELECT 1 FROM jobs j WHERE j.type = '${INGEST_JOB}' AND j.subjectType = 'photo' AND j.subjectId = Photo.id AND j.state IN ('queued', 'running'))`,
          ),
        },
        order: [['id', 'ASC']],
        limit: 1000,
        transaction,
        lock: transaction.LOCK.UPDATE,
        skipLocked: true,
      });
      if (!photos.length) return { n: 0, last: after };
      await enqueueMany(
        photos.map((p) => ({
          type: INGEST_JOB,
          payload: { photoId: p.id },
          subject: { type: 'photo' as const, id: p.id },
        })),
        transaction,
      );
      return { n: photos.length, last: photos[photos.length - 1].id };
    });
    total += n;
    after = last;
    if (n < 1000) return total;
  }
}

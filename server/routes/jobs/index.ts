import { Router } from 'express';
import type { WhereOptions } from 'sequelize';
import { actorOf, requireUser } from '../../http/auth.ts';
import { conflict, forbidden, notFound } from '../../http/errors.ts';
import { parseParams, parseQuery } from '../../http/validate.ts';
import { Job, sequelize } from '../../models/index.ts';
import { can, type Actor } from '../../policies/index.ts';
import { readablePhoto } from '../../iiif/access.ts';
import { retry } from '../../jobs/queue.ts';
import { checkPayload, handlerFor } from '../../jobs/registry.ts';
import { presentJob } from '../../presenters/job.ts';
import { idParams, toPaged } from '../../../shared/schemas/common.ts';
import { jobListQuery } from '../../../shared/schemas/jobs.ts';
import '../../jobs/handlers/index.ts';

export const jobsRouter = Router();

// Retrying is the right of whoever may change the job's subject.
const mayRetry = (actor: Actor, job: Job) =>
  job.type === 'fixity-check' ? can(actor, 'fixity:run') : can(actor, 'photo:update');
// Reading a job: fixity reports are for admins; photo jobs follow the photo.
async function mayRead(actor: Actor, job: Job) {
  if (job.type === 'fixity-check') return can(actor, 'fixity:run');
  if (job.subjectType === 'photo' && job.subjectId != null)
    return readablePhoto(actor, job.subjectId).then(
      () => true,
      () => false,
    );
  return can(actor, 'fixity:run');
}

jobsRouter.get('/', requireUser, async (req, res) => {
  const q = parseQuery(jobListQuery, req);
  const actor = actorOf(req);
  const where: WhereOptions<Job> = {};
  if (q.photoId) {
    await readablePhoto(actor, q.photoId);
    Object.assign(where, { subjectType: 'photo', subjectId: q.photoId });
  } else if (!can(actor, 'fixity:run')) {
    throw forbidden('Ask for the jobs of one photo (photoId).');
  }
  if (q.type) Object.assign(where, { type: q.type });
  const { rows, count } = await Job.findAndCountAll({
    where,
    order: [['id', 'DESC']],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  res.json(
    toPaged(
      rows.map((j) => presentJob(j, mayRetry(actor, j))),
      count,
      q.page,
      q.pageSize,
    ),
  );
});

jobsRouter.get('/:id', requireUser, async (req, res) => {
  const { id } = parseParams(idParams, req);
  const actor = actorOf(req);
  const job = await Job.findByPk(id);
  if (!job || !(await mayRead(actor, job))) throw notFound('Job');
  res.json({ job: presentJob(job, mayRetry(actor, job)) });
});

jobsRouter.post('/:id/retry', requireUser, async (req, res) => {
  const { id } = parseParams(idParams, req);
  const actor = actorOf(req);
  const job = await sequelize.transaction(async (transaction) => {
    const found = await Job.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
    if (!found || !(await mayRead(actor, found))) throw notFound('Job');
    if (!mayRetry(actor, found)) throw forbidden();
    if (found.state !== 'failed') throw conflict(`Only a failed job can be retried; this one is ${found.state}.`);
    await retry(found, transaction);
    return found;
  });
  // A payload its kind does not take is not handed on; the job will fail again with the reason.
  const checked = checkPayload(job.type, job.payload);
  if (checked.ok) await handlerFor(job.type)?.onRetry?.(checked.payload);
  res.json({ job: presentJob(job, mayRetry(actor, job)) });
});

import { Router, type RequestHandler } from 'express';
import { Op } from 'sequelize';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden } from '../../http/errors.ts';
import { Job, sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { enqueue } from '../../jobs/queue.ts';
import { FIXITY_JOB } from '../../jobs/handlers/fixity-check.ts';
import { presentJob } from '../../presenters/job.ts';
import { fixityReportSchema, type FixityLatest } from '../../../shared/schemas/fixity.ts';

export const fixityRouter = Router();

const mayRun: RequestHandler = (req, _res, next) => (can(actorOf(req), 'fixity:run') ? next() : next(forbidden()));

// One check at a time: a second press while one is queued or running answers the one in hand.
fixityRouter.post('/', requireUser, mayRun, async (req, res) => {
  const actor = actorOf(req)!;
  const { job, created } = await sequelize.transaction(async (transaction) => {
    const open = await Job.findOne({
      where: { type: FIXITY_JOB, state: { [Op.in]: ['queued', 'running'] } },
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    if (open) return { job: open, created: false };
    return {
      job: await enqueue({ type: FIXITY_JOB, createdById: actor.id, maxAttempts: 1 }, transaction),
      created: true,
    };
  });
  res.status(created ? 202 : 200).json({ job: presentJob(job, true) });
});

fixityRouter.get('/latest', requireUser, mayRun, async (_req, res) => {
  const [latest, lastDone] = await Promise.all([
    Job.findOne({ where: { type: FIXITY_JOB }, order: [['id', 'DESC']] }),
    Job.findOne({ where: { type: FIXITY_JOB, state: 'done' }, order: [['id', 'DESC']] }),
  ]);
  // A done fixity job's result is the report its handler returned (server/jobs/handlers/fixity-check.ts); parsed so
  // reports stored before a field existed get its default (orphans: []).
  const parsed = lastDone?.result ? fixityReportSchema.safeParse(lastDone.result) : null;
  const body: FixityLatest = {
    job: latest ? presentJob(latest, true) : null,
    report: parsed?.success ? parsed.data : null,
  };
  res.json(body);
});

import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { sequelize as defaultDb, Job } from '../models/index.ts';
import { env } from '../env.ts';
import { handlerFor } from './registry.ts';
import { isJobType, jobPayloads, type JobPayload, type JobType } from '../../shared/schemas/jobs.ts';

/** A claimed job. The worker hands it to its handler only once the payload has passed the kind's schema. */
export type ClaimedJob<P = Record<string, unknown>> = {
  id: number;
  type: string;
  payload: P;
  attempts: number;
  maxAttempts: number;
};

/** Thrown by a handler when retrying cannot help (a missing file, a deleted photo). */
export class PermanentJobError extends Error {}

type EnqueueOptions = {
  subject?: { type: string; id: number };
  createdById?: number | null;
  maxAttempts?: number;
  runAfter?: Date;
};
/** The payload a kind takes (shared/schemas/jobs.ts `jobPayloads`); optional when it takes none. */
type PayloadField<K extends JobType> =
  JobPayload<K> extends Record<string, never> ? { payload?: JobPayload<K> } : { payload: JobPayload<K> };
/** A job of one kind, with the payload that kind takes: `{ type: 'ingest-photo', payload: { photoId } }`. */
export type EnqueueInput<K extends JobType = JobType> = { [T in K]: { type: T } & PayloadField<T> & EnqueueOptions }[K];

/** Queue a job of a known kind; its payload is typed by the kind and checked again before it is written. */
export async function enqueue<K extends JobType>(input: EnqueueInput<K>, transaction?: Transaction) {
  return insertJob(input, transaction);
}

/**
 * Queue a job of a kind outside `jobPayloads` (the queue tests' throwaway kinds). A known kind's
 * payload is still checked against its schema; prefer enqueue() everywhere else.
 */
export async function enqueueUntyped(
  input: { type: string; payload?: Record<string, unknown> } & EnqueueOptions,
  transaction?: Transaction,
) {
  return insertJob(input, transaction);
}

/** Queue many jobs of known kinds in one statement (a start-up backlog); the same checks as enqueue(). */
export async function enqueueMany<K extends JobType>(inputs: EnqueueInput<K>[], transaction?: Transaction) {
  if (!inputs.length) return [];
  const now = new Date();
  return Job.bulkCreate(
    inputs.map((input) => ({
      type: input.type,
      payload: jobPayloads[input.type].parse(input.payload ?? {}) as Record<string, unknown>,
      subjectType: input.subject?.type ?? null,
      subjectId: input.subject?.id ?? null,
      maxAttempts: input.maxAttempts ?? 3,
      error: null,
      result: null,
      lockedBy: null,
      lockedAt: null,
      leaseUntil: null,
      runAfter: input.runAfter ?? now,
      startedAt: null,
      finishedAt: null,
      createdById: input.createdById ?? null,
    })),
    { transaction },
  );
}

async function insertJob(input: { type: string; payload?: object } & EnqueueOptions, transaction?: Transaction) {
  const raw = input.payload ?? {};
  // A programming error (a payload its kind does not take) stops here rather than failing later in the worker.
  const payload = isJobType(input.type) ? jobPayloads[input.type].parse(raw) : raw;
  return Job.create(
    {
      type: input.type,
      payload: payload as Record<string, unknown>,
      subjectType: input.subject?.type ?? null,
      subjectId: input.subject?.id ?? null,
      maxAttempts: input.maxAttempts ?? 3,
      error: null,
      result: null,
      lockedBy: null,
      lockedAt: null,
      leaseUntil: null,
      runAfter: input.runAfter ?? new Date(),
      startedAt: null,
      finishedAt: null,
      createdById: input.createdById ?? null,
    },
    { transaction },
  );
}

/**
 * Claim the oldest due job. SKIP LOCKED lets several workers (in this process or
 * other app servers) run the same query at once: each sees only rows no other
 * open transaction has locked, so no job is handed out twice.
 */
export async function claim(
  workerId: string,
  opts: { db?: Sequelize; types?: string[]; leaseMs?: number } = {},
): Promise<ClaimedJob | null> {
  const db = opts.db ?? defaultDb;
  const leaseMs = opts.leaseMs ?? env.JOB_LEASE_MS;
  return db.transaction(async (transaction) => {
    const now = new Date();
    const leaseUntil = new Date(now.getTime() + leaseMs);
    const typeFilter = opts.types?.length ? 'AND type IN (:types)' : '';
    const rows = await db.query<{ id: number }>(
      `SELECT id FROM jobs WHERE state = 'queued' AND runAfter <= :now ${typeFilter} ORDER BY runAfter, id LIMIT 1 FOR UPDATE SKIP LOCKED`,
      { type: QueryTypes.SELECT, transaction, replacements: { now, types: opts.types ?? [] } },
    );
    if (!rows.length) return null;
    const id = Number(rows[0].id);
    await db.query(
      `UPDATE jobs SET state = 'running', lockedBy = :workerId, lockedAt = :now, leaseUntil = :leaseUntil, startedAt = :now,
         finishedAt = NULL, attempts = attempts + 1, progress = 0, error = NULL, updatedAt = :now WHERE id = :id`,
      { type: QueryTypes.UPDATE, transaction, replacements: { workerId, now, leaseUntil, id } },
    );
    const [job] = await db.query<{ id: number; type: string; payload: unknown; attempts: number; maxAttempts: number }>(
      'SELECT id, type, payload, attempts, maxAttempts FROM jobs WHERE id = :id',
      { type: QueryTypes.SELECT, transaction, replacements: { id } },
    );
    const payload = typeof job.payload === 'string' ? JSON.parse(job.payload) : job.payload;
    return {
      id,
      type: job.type,
      payload: (payload ?? {}) as Record<string, unknown>,
      attempts: Number(job.attempts),
      maxAttempts: Number(job.maxAttempts),
    };
  });
}

/** Record progress (0–1); it also renews the lease. False when the lock was lost. */
export async function reportProgress(
  jobId: number,
  workerId: string,
  progress: number,
  db: Sequelize = defaultDb,
  leaseMs: number = env.JOB_LEASE_MS,
) {
  const now = new Date();
  const leaseUntil = new Date(now.getTime() + leaseMs);
  const [, affected] = await db.query(
    `UPDATE jobs SET progress = :progress, lockedAt = :now, leaseUntil = :leaseUntil, updatedAt = :now
       WHERE id = :jobId AND state = 'running' AND lockedBy = :workerId`,
    {
      type: QueryTypes.UPDATE,
      replacements: { progress: Math.max(0, Math.min(1, progress)), now, leaseUntil, jobId, workerId },
    },
  );
  return Number(affected) > 0;
}

/**
 * The worker's heartbeat while a handler runs: push the lease forward (lockedAt records the beat).
 * False when the job is no longer this worker's (its lease ran out and it was queued again).
 */
export async function renewLease(
  jobId: number,
  workerId: string,
  db: Sequelize = defaultDb,
  leaseMs: number = env.JOB_LEASE_MS,
) {
  const now = new Date();
  const [, affected] = await db.query(
    `UPDATE jobs SET lockedAt = :now, leaseUntil = :leaseUntil WHERE id = :jobId AND state = 'running' AND lockedBy = :workerId`,
    { type: QueryTypes.UPDATE, replacements: { now, leaseUntil: new Date(now.getTime() + leaseMs), jobId, workerId } },
  );
  return Number(affected) > 0;
}

export async function complete(
  jobId: number,
  workerId: string,
  result: Record<string, unknown> | null,
  db: Sequelize = defaultDb,
) {
  const now = new Date();
  await db.query(
    `UPDATE jobs SET state = 'done', progress = 1, result = :result, lockedBy = NULL, lockedAt = NULL, leaseUntil = NULL, finishedAt = :now,
       updatedAt = :now WHERE id = :jobId AND state = 'running' AND lockedBy = :workerId`,
    { type: QueryTypes.UPDATE, replacements: { result: result ? JSON.stringify(result) : null, now, jobId, workerId } },
  );
}

/** A failure re-queues the job with a back-off until its attempts run out; then it stays failed with the reason. */
export async function fail(
  job: ClaimedJob,
  workerId: string,
  reason: string,
  permanent: boolean,
  db: Sequelize = defaultDb,
) {
  const now = new Date();
  const final = permanent || job.attempts >= job.maxAttempts;
  const runAfter = new Date(now.getTime() + 5_000 * job.attempts ** 2);
  await db.query(
    `UPDATE jobs SET state = :state, error = :reason, lockedBy = NULL, lockedAt = NULL, leaseUntil = NULL, runAfter = :runAfter,
       finishedAt = :finishedAt, updatedAt = :now WHERE id = :id AND state = 'running' AND lockedBy = :workerId`,
    {
      type: QueryTypes.UPDATE,
      replacements: {
        state: final ? 'failed' : 'queued',
        reason: reason.slice(0, 2000),
        runAfter,
        finishedAt: final ? now : null,
        now,
        id: job.id,
        workerId,
      },
    },
  );
  return final;
}

export const INTERRUPTED_REASON = 'Interrupted: the worker running it stopped (its lease ran out), on every attempt.';

/**
 * A job still marked running whose lease ran out belongs to a worker that died (or lost the database):
 * it is queued again, or failed with the reason when it has used all its attempts. Its subject follows through the
 * handler's hooks (a photo's tile status goes back to queued, or to failed). Rows from before leases (NULL
 * leaseUntil) are judged by their last heartbeat, lockedAt, against staleMs. Several servers may sweep at once:
 * FOR UPDATE SKIP LOCKED hands each expired row to one of them. Returns how many jobs were released.
 */
export async function requeueExpired(opts: { db?: Sequelize; staleMs?: number; types?: string[] } = {}) {
  const db = opts.db ?? defaultDb;
  const staleMs = opts.staleMs ?? 10 * 60_000;
  const typeFilter = opts.types?.length ? 'AND type IN (:types)' : '';
  const released = await db.transaction(async (transaction) => {
    const now = new Date();
    const cutoff = new Date(now.getTime() - staleMs);
    const rows = await db.query<{ id: number; type: string; payload: unknown; attempts: number; maxAttempts: number }>(
      `SELECT id, type, payload, attempts, maxAttempts FROM jobs WHERE state = 'running'
         AND (leaseUntil < :now OR (leaseUntil IS NULL AND lockedAt < :cutoff)) ${typeFilter}
         ORDER BY id LIMIT 100 FOR UPDATE SKIP LOCKED`,
      { type: QueryTypes.SELECT, transaction, replacements: { now, cutoff, types: opts.types ?? [] } },
    );
    if (!rows.length) return [];
    await db.query(
      `UPDATE jobs SET
         state = IF(attempts >= maxAttempts, 'failed', 'queued'),
         error = IF(attempts >= maxAttempts, :reason, error),
         finishedAt = IF(attempts >= maxAttempts, :now, NULL),
         lockedBy = NULL, lockedAt = NULL, leaseUntil = NULL, runAfter = :now, updatedAt = :now
       WHERE id IN (:ids)`,
      {
        type: QueryTypes.UPDATE,
        transaction,
        replacements: { now, reason: INTERRUPTED_REASON, ids: rows.map((r) => Number(r.id)) },
      },
    );
    return rows;
  });
  for (const row of released) {
    const raw = typeof row.payload === 'string' ? JSON.parse(row.payload) : row.payload;
    const job: ClaimedJob = {
      id: Number(row.id),
      type: row.type,
      payload: (raw ?? {}) as Record<string, unknown>,
      attempts: Number(row.attempts),
      maxAttempts: Number(row.maxAttempts),
    };
    const handler = handlerFor(row.type);
    try {
      if (job.attempts >= job.maxAttempts) await handler?.onFailed?.(job, INTERRUPTED_REASON);
      else await handler?.onRetry?.(job.payload);
    } catch (err) {
      console.error('[jobs] subject update after a lost lease', err);
    }
  }
  return released.length;
}

/** Kept for callers that sweep by age only: releases expired leases, and lease-less locks older than staleMs. */
export async function requeueStale(staleMs: number, db: Sequelize = defaultDb) {
  return requeueExpired({ db, staleMs });
}

/** A failed job starts again with fresh attempts. */
export async function retry(job: Job, transaction?: Transaction) {
  await job.update(
    {
      state: 'queued',
      attempts: 0,
      progress: 0,
      error: null,
      lockedBy: null,
      lockedAt: null,
      leaseUntil: null,
      runAfter: new Date(),
      startedAt: null,
      finishedAt: null,
    },
    { transaction },
  );
  return job;
}

import os from 'node:os';
import { randomBytes } from 'node:crypto';
import type { Sequelize } from 'sequelize';
import { sequelize as defaultDb } from '../models/index.ts';
import { env } from '../env.ts';
import { claim, complete, fail, PermanentJobError, renewLease, reportProgress, requeueExpired } from './queue.ts';
import type { ClaimedJob } from './queue.ts';
import { checkPayload, handlerFor } from './registry.ts';
import './handlers/index.ts';
import { logger } from '../log/index.ts';
import { installSearchHooks } from '../search/hooks.ts';

export type WorkerOptions = {
  db?: Sequelize;
  workerId?: string;
  /** Only these job types (tests use this to stay clear of other suites' jobs). */
  types?: string[];
  /** Lease length; the heartbeat renews it every third of this while a handler runs (default env JOB_LEASE_MS). */
  leaseMs?: number;
};

// Unique per process, so a lock names the server and process that holds it.
export const newWorkerId = () => `${os.hostname()}:${process.pid}:${randomBytes(3).toString('hex')}`;
const processWorkerId = newWorkerId();

/** Claim one due job and run it to the end. Returns the job id, or null when nothing was due. */
export async function runOnce(options: WorkerOptions = {}): Promise<number | null> {
  const db = options.db ?? defaultDb;
  const workerId = options.workerId ?? processWorkerId;
  const leaseMs = options.leaseMs ?? env.JOB_LEASE_MS;
  // A job's writes (an ingest's palette, a repalette…) reach every server's search through the change log, whichever
  // process runs it: an app server, a script or a test.
  installSearchHooks();
  const job = await claim(workerId, { db, types: options.types, leaseMs });
  if (!job) return null;
  // Heartbeat: keep the lease while this process is alive; if the process dies the lease runs out and another
  // worker's sweep queues the job again (requeueExpired).
  const heartbeat = setInterval(
    () => void renewLease(job.id, workerId, db, leaseMs).catch((e) => console.error('[jobs] heartbeat', e)),
    Math.max(100, Math.floor(leaseMs / 3)),
  );
  heartbeat.unref();
  try {
    return await runClaimed(job, db, workerId, leaseMs);
  } finally {
    clearInterval(heartbeat);
  }
}

async function runClaimed(job: ClaimedJob, db: Sequelize, workerId: string, leaseMs: number) {
  const handler = handlerFor(job.type);
  // A malformed payload fails the job at once with the reason; the handler never sees it (nor its onFailed).
  const checked = checkPayload(job.type, job.payload);
  if (!checked.ok) {
    await fail(job, workerId, checked.reason, true, db);
    return job.id;
  }
  job.payload = checked.payload;
  try {
    if (!handler) throw new PermanentJobError(`No handler for jobs of type "${job.type}".`);
    const result = await handler.run(job, {
      db,
      workerId,
      progress: async (value) => {
        await reportProgress(job.id, workerId, value, db, leaseMs);
      },
    });
    await complete(job.id, workerId, result ?? null, db);
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    const final = await fail(job, workerId, reason, err instanceof PermanentJobError, db);
    if (final)
      await handler
        ?.onFailed?.(job, reason)
        .catch((e) => logger.error({ err: e, jobId: job.id, type: job.type }, '[jobs] onFailed'));
  }
  return job.id;
}

/** Run due jobs until none is left (tests and the one-off CLI). */
export async function drain(options: WorkerOptions = {}) {
  const ids: number[] = [];
  for (let id = await runOnce(options); id !== null; id = await runOnce(options)) ids.push(id);
  return ids;
}

export type LoopOptions = WorkerOptions & { pollMs?: number; staleMs?: number; sweepMs?: number };
let loop: { stop: boolean; done: Promise<void> } | null = null;

/** The background loop started by server/index.ts: sweep expired leases, claim, run, sleep when idle. */
export function startWorker(options: LoopOptions = {}) {
  if (loop) return;
  const pollMs = options.pollMs ?? 1000;
  const staleMs = options.staleMs ?? 10 * 60_000;
  // Sweep for expired leases every half lease (at most every 15 s): a dead worker's job is queued again
  // within lease + sweep interval, under a minute with the default 30 s lease.
  const sweepMs = options.sweepMs ?? Math.min(15_000, Math.floor((options.leaseMs ?? env.JOB_LEASE_MS) / 2));
  const state = { stop: false, done: Promise.resolve() };
  let lastSweep = 0;
  state.done = (async () => {
    while (!state.stop) {
      try {
        if (Date.now() - lastSweep > sweepMs) {
          lastSweep = Date.now();
          const n = await requeueExpired({ db: options.db, staleMs, types: options.types });
          if (n) logger.warn({ requeued: n }, `[jobs] re-queued ${n} interrupted job(s)`);
        }
        const id = await runOnce(options);
        if (id !== null) continue;
      } catch (err) {
        logger.error({ err }, '[jobs] worker error');
      }
      await new Promise((r) => setTimeout(r, pollMs));
    }
  })();
  loop = state;
}

/** Stop claiming; resolves once the job in hand (if any) has finished. */
export async function stopWorker() {
  if (!loop) return;
  loop.stop = true;
  await loop.done;
  loop = null;
}

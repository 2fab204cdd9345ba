import { afterAll, describe, expect, it } from 'vitest';
import { spawn } from 'node:child_process';
import { randomUUID } from 'node:crypto';
import path from 'node:path';
import { Op } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize.ts';
import { Job, sequelize } from '../../server/models/index.ts';
// The queue's own tests use throwaway kinds outside the typed map, hence enqueueUntyped.
import {
  claim,
  enqueue as enqueueTyped,
  enqueueUntyped as enqueue,
  requeueExpired,
  requeueStale,
  PermanentJobError,
} from '../../server/jobs/queue.ts';
import { checkPayload, registerHandler } from '../../server/jobs/registry.ts';
import { drain, runOnce, startWorker, stopWorker } from '../../server/jobs/worker.ts';
import { enqueueIngest, INGEST_JOB } from '../../server/jobs/handlers/ingest-photo.ts';
import { Photo } from '../../server/models/index.ts';
import { removePhotoRows } from '../../server/services/photos.ts';
import { makePhotoWithMaster } from '../support/photos.ts';

// Two separate connection pools stand for two app servers sharing the jobs table.
const serverA = createSequelize();
const serverB = createSequelize();
afterAll(async () => {
  // Leave no test jobs behind for a server's worker to pick up later.
  await Job.destroy({ where: { type: { [Op.like]: 't-%' } } });
  await Promise.all([serverA.close(), serverB.close(), sequelize.close()]);
});

// Each test uses its own job type so other suites' queued jobs are never touched.
const uniqueType = (what: string) => `t-${what}-${randomUUID().slice(0, 8)}`;

describe('job queue', () => {
  it('hands each job to exactly one of two workers claiming at once (SELECT … FOR UPDATE SKIP LOCKED)', async () => {
    const type = uniqueType('race');
    const runs: Array<{ job: number; worker: string }> = [];
    registerHandler(type, {
      async run(job, ctx) {
        runs.push({ job: job.id, worker: ctx.workerId });
        // Yield so the other worker's claims interleave with this one's work.
        await new Promise((r) => setImmediate(r));
      },
    });
    const jobs = [];
    for (let i = 0; i < 24; i++) jobs.push(await enqueue({ type, payload: { i } }));
    const [a, b] = await Promise.all([
      drain({ db: serverA, workerId: 'server-a', types: [type] }),
      drain({ db: serverB, workerId: 'server-b', types: [type] }),
    ]);
    const ids = jobs.map((j) => j.id).sort((x, y) => x - y);
    expect([...a, ...b].sort((x, y) => x - y)).toEqual(ids);
    expect(runs).toHaveLength(24);
    expect(new Set(runs.map((r) => r.job)).size).toBe(24);
    const rows = await Job.findAll({ where: { type } });
    expect(rows.every((r) => r.state === 'done' && r.attempts === 1 && r.progress === 1)).toBe(true);
  });

  it('never returns the same job to simultaneous raw claims from two connections', async () => {
    const type = uniqueType('claims');
    for (let i = 0; i < 5; i++) await enqueue({ type });
    const claims = await Promise.all(
      Array.from({ length: 12 }, (_, i) => claim(`w${i}`, { db: i % 2 ? serverA : serverB, types: [type] })),
    );
    const got = claims.filter((c) => c !== null).map((c) => c!.id);
    expect(got).toHaveLength(5);
    expect(new Set(got).size).toBe(5);
  });

  it('re-queues a running job whose lock went stale (a server died) and runs it again', async () => {
    const type = uniqueType('stale');
    let ran = 0;
    registerHandler(type, { run: async () => void (ran += 1) });
    const job = await enqueue({ type });
    const claimed = await claim('server-that-died', { types: [type] });
    expect(claimed?.id).toBe(job.id);
    // The dead server's last heartbeat was an hour ago, and its lease ran out then.
    const hourAgo = new Date(Date.now() - 3600_000);
    await Job.update({ lockedAt: hourAgo, leaseUntil: hourAgo }, { where: { id: job.id } });
    expect(await runOnce({ types: [type] })).toBeNull();
    expect(await requeueStale(10 * 60_000)).toBeGreaterThanOrEqual(1);
    await job.reload();
    expect(job.state).toBe('queued');
    expect(job.lockedBy).toBeNull();
    expect(await runOnce({ types: [type] })).toBe(job.id);
    await job.reload();
    expect(job.state).toBe('done');
    expect(job.attempts).toBe(2);
    expect(ran).toBe(1);
  });

  it('leaves a fresh running job alone', async () => {
    const type = uniqueType('fresh');
    const job = await enqueue({ type });
    await claim('busy-server', { types: [type] });
    await requeueStale(10 * 60_000);
    await job.reload();
    expect(job.state).toBe('running');
    expect(job.lockedBy).toBe('busy-server');
  });

  it('gives a running job a lease that the heartbeat renews while its handler runs', async () => {
    const type = uniqueType('lease');
    let release!: () => void;
    const gate = new Promise<void>((r) => (release = r));
    let seen: Date | null = null;
    registerHandler(type, { run: () => gate });
    const job = await enqueue({ type });
    const running = runOnce({ types: [type], leaseMs: 600 });
    await expect.poll(async () => (await job.reload()).state).toBe('running');
    seen = job.leaseUntil;
    expect(seen!.getTime()).toBeGreaterThan(Date.now() - 600);
    // Well past the first lease: the heartbeat (every lease/3) has pushed it forward, so no sweep takes the job.
    await new Promise((r) => setTimeout(r, 1000));
    await requeueExpired({ types: [type] });
    await job.reload();
    expect(job.state).toBe('running');
    expect(job.leaseUntil!.getTime()).toBeGreaterThan(seen!.getTime());
    release();
    await running;
    await job.reload();
    expect(job.state).toBe('done');
    expect(job.leaseUntil).toBeNull();
  });

  it('re-queues the job of a worker process killed with SIGKILL, and another worker finishes it within a minute', async () => {
    const type = uniqueType('killed');
    let ranBy: string | null = null;
    registerHandler(type, { run: async (_job, ctx) => void (ranBy = ctx.workerId) });
    const job = await enqueue({ type });
    const child = spawn(
      process.execPath,
      ['--import', 'tsx', path.resolve('tests/support/job-worker-child.ts'), type, '1500'],
      { stdio: ['ignore', 'pipe', 'inherit'] },
    );
    let out = '';
    child.stdout.on('data', (d) => (out += String(d)));
    const exited = new Promise((r) => child.on('exit', r));
    await expect.poll(() => out, { timeout: 30_000 }).toContain(`claimed ${job.id}`);
    await job.reload();
    expect(job.state).toBe('running');
    expect(job.lockedBy).toBe(`child:${child.pid}`);
    child.kill('SIGKILL');
    await exited;
    const killedAt = Date.now();
    startWorker({ types: [type], leaseMs: 1500, pollMs: 100 });
    try {
      await expect.poll(async () => (await job.reload()).state, { timeout: 60_000, interval: 200 }).toBe('done');
    } finally {
      await stopWorker();
    }
    expect(Date.now() - killedAt).toBeLessThan(60_000);
    expect(job.attempts).toBe(2);
    expect(ranBy).not.toBeNull();
  });

  it("fails a job whose worker died on its last attempt with the reason, and tells its subject's hooks", async () => {
    const type = uniqueType('lastlease');
    const hooks: string[] = [];
    registerHandler(type, {
      run: async () => {},
      onFailed: async (_job, reason) => void hooks.push(`failed: ${reason}`),
      onRetry: async () => void hooks.push('retry'),
    });
    const first = await enqueue({ type, maxAttempts: 2 });
    const last = await enqueue({ type, maxAttempts: 1 });
    await claim('dead-1', { types: [type], leaseMs: 1 });
    await claim('dead-2', { types: [type], leaseMs: 1 });
    await new Promise((r) => setTimeout(r, 20));
    expect(await requeueExpired({ types: [type] })).toBe(2);
    await first.reload();
    await last.reload();
    expect(first.state).toBe('queued');
    expect(last.state).toBe('failed');
    expect(last.error).toMatch(/lease ran out/);
    expect(hooks.sort()).toEqual([expect.stringMatching(/^failed: Interrupted/), 'retry']);
  });

  it("puts a photo's ingest stage back to queued when its ingest worker died, and to failed on the last attempt", async () => {
    const { photo } = await makePhotoWithMaster(null, { width: 60, height: 40 });
    // Only this photo's job is due, claimed by a worker that then died (a lease of 1 ms).
    await Job.update({ runAfter: new Date(Date.now() + 3600_000) }, { where: { type: INGEST_JOB, state: 'queued' } });
    const job = await enqueueIngest(photo.id);
    await Job.update({ runAfter: new Date(0), maxAttempts: 2 }, { where: { id: job!.id } });
    for (const expected of ['queued', 'failed']) {
      expect((await claim('dead-tiler', { types: [INGEST_JOB], leaseMs: 1 }))?.id).toBe(job!.id);
      await Photo.update({ ingestStage: 'tiles' }, { where: { id: photo.id } });
      await new Promise((r) => setTimeout(r, 20));
      expect(await requeueExpired({ types: [INGEST_JOB] })).toBe(1);
      expect((await Photo.findByPk(photo.id))!.ingestStage).toBe(expected);
      expect((await job!.reload()).state).toBe(expected);
    }
    await Job.update({ runAfter: new Date() }, { where: { type: INGEST_JOB, state: 'queued' } });
    await Job.destroy({ where: { id: job!.id } });
    await sequelize.transaction((transaction) => removePhotoRows([photo], transaction));
  });

  it('retries a failing job with back-off, then marks it failed with the reason', async () => {
    const type = uniqueType('flaky');
    registerHandler(type, {
      run: async () => {
        throw new Error('disk full');
      },
    });
    const job = await enqueue({ type, maxAttempts: 2 });
    await runOnce({ types: [type] });
    await job.reload();
    expect(job.state).toBe('queued');
    expect(job.error).toBe('disk full');
    expect(job.runAfter.getTime()).toBeGreaterThan(Date.now());
    await job.update({ runAfter: new Date(Date.now() - 1000) });
    await runOnce({ types: [type] });
    await job.reload();
    expect(job.state).toBe('failed');
    expect(job.attempts).toBe(2);
  });

  it('fails at once on a permanent error', async () => {
    const type = uniqueType('permanent');
    registerHandler(type, {
      run: async () => {
        throw new PermanentJobError('photo deleted');
      },
    });
    const job = await enqueue({ type });
    await runOnce({ types: [type] });
    await job.reload();
    expect(job.state).toBe('failed');
    expect(job.error).toBe('photo deleted');
    expect(job.attempts).toBe(1);
  });
});

describe('typed job payloads (shared/schemas/jobs.ts jobPayloads)', () => {
  it("checks a known kind's payload: a good one passes, a bad one is refused with each field named", () => {
    expect(checkPayload('ingest-photo', { photoId: 7 })).toEqual({ ok: true, payload: { photoId: 7 } });
    expect(checkPayload('fixity-check', {})).toEqual({ ok: true, payload: {} });
    const bad = checkPayload('ingest-photo', { photoId: 'seven' });
    expect(bad.ok).toBe(false);
    if (!bad.ok)
      expect(bad.reason).toMatch(
        /^The job's payload is not valid for an ingest-photo job \(photoId: .+\), so it was not run\.$/,
      );
    const missing = checkPayload('ingest-photo', null);
    expect(missing.ok).toBe(false);
    // Kinds outside the map pass as they are.
    expect(checkPayload('t-anything', { i: 1 })).toEqual({ ok: true, payload: { i: 1 } });
  });

  it('refuses to queue a known kind with a payload it does not take, and writes nothing', async () => {
    const before = await Job.count({ where: { type: 'ingest-photo' } });
    await expect(enqueue({ type: 'ingest-photo', payload: { photoId: 'abc' } })).rejects.toThrow();
    expect(await Job.count({ where: { type: 'ingest-photo' } })).toBe(before);
    // The typed enqueue takes the kind's payload as is.
    const ok = await enqueueTyped({ type: 'fixity-check', maxAttempts: 1, runAfter: new Date(Date.now() + 3600_000) });
    expect(ok.payload).toEqual({});
    await ok.destroy();
  });

  it('fails a claimed job whose stored payload is malformed, at once and with the reason, without running its handler', async () => {
    // Written past enqueue() (as an old row or a hand edit might be); due long ago, so it is the first tile job claimed.
    const job = await Job.create({
      type: 'ingest-photo',
      payload: { photoId: 'not-a-number' },
      subjectType: null,
      subjectId: null,
      maxAttempts: 3,
      error: null,
      result: null,
      lockedBy: null,
      lockedAt: null,
      runAfter: new Date('2000-01-01T00:00:00Z'),
      startedAt: null,
      finishedAt: null,
      createdById: null,
    });
    try {
      expect(await runOnce({ types: ['ingest-photo'] })).toBe(job.id);
      await job.reload();
      expect(job.state).toBe('failed');
      expect(job.attempts).toBe(1);
      expect(job.error).toMatch(/payload is not valid for an ingest-photo job \(photoId: .+\)/);
    } finally {
      await job.destroy();
    }
  });
});

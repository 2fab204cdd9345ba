import { Router } from 'express';
import { QueryTypes } from 'sequelize';
import { env } from '../../env.ts';
import { sequelize } from '../../models/index.ts';
import { searchEngine } from '../../search/engine.ts';
import { APP_VERSION } from '../../version.ts';
import type { Health } from '../../../shared/schemas/health.ts';

export const healthRouter = Router();

/** Rejects when `p` has not settled within `ms` (a frozen database must not hang the health check). */
const within = <T>(p: Promise<T>, ms: number) =>
  new Promise<T>((resolve, reject) => {
    const t = setTimeout(() => reject(new Error('timed out')), ms);
    p.then(resolve, reject).finally(() => clearTimeout(t));
  });

type Backlog = { queued: number | string; running: number | string; oldestDueAt: Date | string | null };

healthRouter.get('/', async (_req, res) => {
  const budget = env.DB_ACQUIRE_TIMEOUT_MS;
  let dbRoundTripMs: number | null = null;
  let jobs: Health['jobs'] = null;
  try {
    const t0 = performance.now();
    await within(sequelize.query('SELECT 1', { type: QueryTypes.SELECT }), budget);
    dbRoundTripMs = Math.round(performance.now() - t0);
    const [row] = await within(
      sequelize.query<Backlog>(
        `SELECT COALESCE(SUM(state = 'queued'), 0) AS queued, COALESCE(SUM(state = 'running'), 0) AS running,
                MIN(CASE WHEN state = 'queued' AND runAfter <= NOW(3) THEN runAfter END) AS oldestDueAt
           FROM jobs WHERE state IN ('queued', 'running')`,
        { type: QueryTypes.SELECT },
      ),
      budget,
    );
    const oldest = row.oldestDueAt == null ? null : new Date(row.oldestDueAt).getTime();
    jobs = {
      queued: Number(row.queued),
      running: Number(row.running),
      oldestQueuedAgeMs: oldest == null ? null : Math.max(0, Date.now() - oldest),
    };
  } catch {
    // dbRoundTripMs stays null when the first query failed: the database is down.
  }
  const db = dbRoundTripMs === null ? 'down' : 'up';
  const s = searchEngine.status();
  const since = (at: number | null) => (at === null ? null : Math.max(0, Date.now() - at));
  const body: Health = {
    ok: db === 'up',
    db,
    version: APP_VERSION,
    dbRoundTripMs,
    jobs,
    search: {
      text: { loaded: s.textUpdatedAt !== null, sinceUpdateMs: since(s.textUpdatedAt) },
      shade: { loaded: s.shadeUpdatedAt !== null, sinceUpdateMs: since(s.shadeUpdatedAt) },
      pendingChanges: s.pending,
      logPosition: s.logPosition,
      sinceSyncMs: s.sinceSyncMs,
      lastError: s.lastError,
    },
  };
  res.status(db === 'up' ? 200 : 503).json(body);
});

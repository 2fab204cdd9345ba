import { z } from 'zod';
import '../messages.ts';

const ms = z.number().int().min(0);

/** One search index: whether it is loaded, and how long ago it last changed (null before its first load). */
const indexHealth = z.object({ loaded: z.boolean(), sinceUpdateMs: ms.nullable() });

/**
 * GET /api/health: 200 when the database answers, 503 (same body, ok false) when it does not.
 * dbRoundTripMs is one `SELECT 1` (null when down); jobs is the queue's backlog (null when the database is down):
 * queued and running counts and the age of the oldest queued job that is due; search tells whether the text and
 * shade indexes of this server are loaded, when they last changed, how many committed changes wait to be applied,
 * and how far it is behind the search change log (its index lag).
 */
export const healthSchema = z.object({
  ok: z.boolean(),
  db: z.enum(['up', 'down']),
  version: z.string(),
  dbRoundTripMs: ms.nullable(),
  jobs: z.object({ queued: ms, running: ms, oldestQueuedAgeMs: ms.nullable() }).nullable(),
  search: z.object({
    text: indexHealth,
    shade: indexHealth,
    pendingChanges: ms,
    /** The last change-log row this server has read, and how long ago it last caught up with the log (null: not yet). */
    logPosition: ms,
    sinceSyncMs: ms.nullable(),
    /** Why the last attempt to apply the log failed (it is retried), null when it succeeded. */
    lastError: z.string().nullable(),
  }),
});
export type Health = z.infer<typeof healthSchema>;

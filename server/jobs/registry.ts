import type { Sequelize } from 'sequelize';
import type { ClaimedJob } from './queue.ts';
import { isJobType, jobPayloads, type JobPayload, type JobType } from '../../shared/schemas/jobs.ts';

export type JobContext = {
  db: Sequelize;
  workerId: string;
  /** Record progress 0–1 (also the heartbeat that keeps the lock fresh). */
  progress: (value: number) => Promise<void>;
};

/** The payload of a kind: typed by shared/schemas/jobs.ts for known kinds, a plain record for others (tests' kinds). */
export type PayloadOf<K extends string> = K extends JobType ? JobPayload<K> : Record<string, unknown>;

export type JobHandler<P = Record<string, unknown>> = {
  run: (job: ClaimedJob<P>, ctx: JobContext) => Promise<Record<string, unknown> | void>;
  /** Called once a job has finally failed (no attempts left, also when its last worker died), to mark its subject. Not called when its payload was malformed. */
  onFailed?: (job: ClaimedJob<P>, reason: string) => Promise<void>;
  /** Called when a job is queued again: by hand after failing, or by the sweep after its worker's lease ran out. */
  onRetry?: (payload: P) => Promise<void>;
};

const handlers = new Map<string, JobHandler>();

export function registerHandler<K extends string>(type: K, handler: JobHandler<PayloadOf<K>>) {
  // Stored untyped; checkPayload() gives the handler only payloads its kind's schema accepts.
  handlers.set(type, handler as unknown as JobHandler);
}

export const handlerFor = (type: string) => handlers.get(type);

export type PayloadCheck = { ok: true; payload: Record<string, unknown> } | { ok: false; reason: string };

/**
 * Parse a stored payload with its kind's schema (shared/schemas/jobs.ts). Kinds outside the map pass
 * as they are. A refusal names each bad field, so the failed job says why it never ran.
 */
export function checkPayload(type: string, payload: unknown): PayloadCheck {
  if (!isJobType(type)) return { ok: true, payload: (payload ?? {}) as Record<string, unknown> };
  const parsed = jobPayloads[type].safeParse(payload ?? {});
  if (parsed.success) return { ok: true, payload: parsed.data };
  const issues = parsed.error.issues
    .map((i) => (i.path.length ? `${i.path.join('.')}: ${i.message}` : i.message))
    .join('; ');
  const article = /^[aeiou]/.test(type) ? 'an' : 'a';
  return {
    ok: false,
    reason: `The job's payload is not valid for ${article} ${type} job (${issues}), so it was not run.`,
  };
}

import type { Sequelize } from 'sequelize';
import type { ClaimedJob } from './queue.ts';

export type JobContext = {
  db: Sequelize;
  workerId: string;
  /** Record progress 0–1 (also the heartbeat that keeps the lock fresh). */
  progress: (value: number) => Promise<void>;
};

export type JobHandler = {
  run: (job: ClaimedJob, ctx: JobContext) => Promise<Record<string, unknown> | void>;
  /** Called once a job has finally failed (no attempts left), to mark its subject. */
  onFailed?: (job: ClaimedJob, reason: string) => Promise<void>;
  /** Called when a failed job is queued again by hand. */
  onRetry?: (payload: Record<string, unknown>) => Promise<void>;
};

const handlers = new Map<string, JobHandler>();

export function registerHandler(type: string, handler: JobHandler) {
  handlers.set(type, handler);
}

export const handlerFor = (type: string) => handlers.get(type);

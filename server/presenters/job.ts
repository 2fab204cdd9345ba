import type { Job } from '../models/index.ts';
import type { JobView } from '../../shared/schemas/jobs.ts';

const iso = (d: Date | null) => (d ? new Date(d).toISOString() : null);

export function presentJob(job: Job, canRetry: boolean): JobView {
  return {
    id: Number(job.id),
    type: job.type,
    subject: job.subjectType && job.subjectId != null ? { type: job.subjectType, id: job.subjectId } : null,
    state: job.state,
    progress: job.progress,
    attempts: job.attempts,
    maxAttempts: job.maxAttempts,
    error: job.error,
    createdAt: iso(job.createdAt)!,
    startedAt: iso(job.startedAt),
    finishedAt: iso(job.finishedAt),
    abilities: { retry: canRetry && job.state === 'failed' },
  };
}

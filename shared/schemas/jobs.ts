import { z } from 'zod';
import '../messages.ts';
import { pageQuery, paged } from './common.ts';

/**
 * Every job kind with the zod schema of its payload. enqueue() (server/jobs/queue.ts) is typed by this
 * map, and the worker parses a claimed job's payload with it before the handler runs: a malformed
 * payload fails the job with the reason, it never reaches the handler.
 */
export const jobPayloads = {
  /** A photo's processing after its master is stored: the steps of shared/schemas/ingest.ts in order. */
  'ingest-photo': z.object({ photoId: z.number().int().positive() }),
  'fixity-check': z.object({}),
} as const;
export type JobType = keyof typeof jobPayloads;
export const JOB_TYPES = Object.keys(jobPayloads) as [JobType, ...JobType[]];
export type JobPayload<K extends JobType> = z.infer<(typeof jobPayloads)[K]>;
export const isJobType = (type: string): type is JobType => Object.hasOwn(jobPayloads, type);

export const JOB_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type JobState = (typeof JOB_STATES)[number];

export const jobListQuery = pageQuery(20).extend({
  photoId: z.coerce.number().int().positive().optional(),
  type: z.enum(JOB_TYPES).optional(),
});
export type JobListQuery = z.infer<typeof jobListQuery>;

/** A job as the API presents it (server/presenters/job.ts). */
export const jobSchema = z.object({
  id: z.number(),
  type: z.string(),
  subject: z.object({ type: z.string(), id: z.number() }).nullable(),
  state: z.enum(JOB_STATES),
  progress: z.number().min(0).max(1),
  attempts: z.number().int(),
  maxAttempts: z.number().int(),
  error: z.string().nullable(),
  createdAt: z.iso.datetime(),
  startedAt: z.iso.datetime().nullable(),
  finishedAt: z.iso.datetime().nullable(),
  abilities: z.object({ retry: z.boolean() }),
});
export type JobView = z.infer<typeof jobSchema>;
/** GET /api/jobs. */
export const jobListResponse = paged(jobSchema);
export type JobList = z.infer<typeof jobListResponse>;
/** GET /api/jobs/:id, POST /api/jobs/:id/retry, POST /api/admin/fixity. */
export const jobResponse = z.object({ job: jobSchema });

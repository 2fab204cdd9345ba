import { z } from 'zod';
import '../messages.ts';

export const JOB_STATES = ['queued', 'running', 'done', 'failed'] as const;
export type JobState = (typeof JOB_STATES)[number];

export const jobListQuery = z.object({
  photoId: z.coerce.number().int().positive().optional(),
  type: z.enum(['tile-photo', 'fixity-check']).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});
export type JobListQuery = z.infer<typeof jobListQuery>;

export const jobIdParams = z.object({ id: z.coerce.number().int().positive() });

/** A job as the API presents it. */
export type JobView = {
  id: number;
  type: string;
  subject: { type: string; id: number } | null;
  state: JobState;
  progress: number;
  attempts: number;
  maxAttempts: number;
  error: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
  abilities: { retry: boolean };
};

import { z } from 'zod';
import '../messages.ts';
import { jobSchema } from './jobs.ts';

/** A master whose bytes no longer match its recorded sha256 (`actual` is what it hashes to now), or that is missing. */
export const fixityProblemSchema = z.object({
  sha256: z.string(),
  photoIds: z.array(z.number()),
  file: z.string().nullable(),
  actual: z.string().optional(),
});
export type FixityProblem = z.infer<typeof fixityProblemSchema>;

/**
 * A file under uploads/ that no photo points at, removed by the check once older than an hour (a master left by a
 * process killed before its upload committed, a temp file, or a photo's derivatives or tiles folder whose photo row
 * never committed or is gone); `file` is relative to uploads/ (for a folder, its size in bytes is its files' sum).
 */
export const fixityOrphanSchema = z.object({
  file: z.string(),
  kind: z.enum(['master', 'temp', 'derivatives', 'tiles']),
  bytes: z.number().int().min(0),
  modifiedAt: z.iso.datetime(),
});
export type FixityOrphan = z.infer<typeof fixityOrphanSchema>;

/** What the fixity-check job (server/jobs/handlers/fixity-check.ts) records as its result. */
export const fixityReportSchema = z.object({
  checkedAt: z.iso.datetime(),
  masters: z.number().int().min(0),
  ok: z.number().int().min(0),
  mismatches: z.array(fixityProblemSchema),
  missing: z.array(fixityProblemSchema),
  /** Orphan files removed by this check (reports from before this field have none). */
  orphans: z.array(fixityOrphanSchema).default([]),
});
export type FixityReport = z.infer<typeof fixityReportSchema>;

/** GET /api/admin/fixity/latest: the newest check (any state) and the report of the newest finished one. */
export const fixityLatestSchema = z.object({ job: jobSchema.nullable(), report: fixityReportSchema.nullable() });
export type FixityLatest = z.infer<typeof fixityLatestSchema>;

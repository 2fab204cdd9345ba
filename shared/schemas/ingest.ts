import { z } from 'zod';
import '../messages.ts';

/**
 * The order of work after a photo's master is stored (issue 18): the one list the ingest job runs
 * (server/media/ingest.ts keys its work by these names and runs them in this order) and the client shows as
 * progress. reading = EXIF, the colour-managed decode and the WebP derivatives; palette = the palettes (whole
 * photo and every region); tiles = the IIIF deep-zoom tiles.
 */
export const INGEST_STEPS = ['reading', 'palette', 'tiles'] as const;
export type IngestStep = (typeof INGEST_STEPS)[number];

/** A photo's stage: queued until the job starts, each step in turn, then done, or failed with a reason. */
export const INGEST_STAGES = ['queued', ...INGEST_STEPS, 'done', 'failed'] as const;
export type IngestStage = (typeof INGEST_STAGES)[number];

/** The stage in people's words (the photo panel's progress line). */
export const INGEST_STAGE_WORDS: Record<IngestStage, string> = {
  queued: 'Waiting to be processed',
  reading: 'Reading the file (EXIF, colour profile, previews)',
  palette: 'Computing the palette',
  tiles: 'Building the deep-zoom tiles',
  done: 'Ready',
  failed: 'Failed',
};

/** How far along a stage is, 0–1, for a progress bar: each step counts the same. */
export function ingestFraction(stage: IngestStage) {
  if (stage === 'done') return 1;
  const i = INGEST_STEPS.indexOf(stage as IngestStep);
  return i < 0 ? 0 : i / INGEST_STEPS.length;
}

export const isIngestStage = (s: string): s is IngestStage => (INGEST_STAGES as readonly string[]).includes(s);

/** A photo's ingest as the API presents it. `error` is the failure's reason in words, only when failed. */
export const photoIngestSchema = z.object({
  stage: z.enum(INGEST_STAGES),
  error: z.string().nullable(),
});
export type PhotoIngest = z.infer<typeof photoIngestSchema>;

/** POST /api/photos/:id/ingest/retry. */
export const ingestRetryResponse = z.object({ ingest: photoIngestSchema });
export type IngestRetryResponse = z.infer<typeof ingestRetryResponse>;

import { INGEST_STAGE_WORDS, ingestFraction } from '../../../../shared/schemas/ingest';
import { Button } from '../../../components/Button';
import { ProgressBar } from '../../iiif';
import type { Photo } from '../../pieces';
import { useIngestProgress, useRetryIngest } from '../api';

/**
 * A photo still being processed after its upload (the ingest job): a placeholder where the image will be, the
 * stage in words with a progress bar, or "Failed: reason" with Retry for those who may edit the photo.
 */
export function IngestStatus({ photo }: { photo: Photo }) {
  const ingest = useIngestProgress(photo);
  const retry = useRetryIngest(photo);
  const failed = ingest.stage === 'failed';
  return (
    <div className="flex flex-wrap items-start gap-4" data-testid="ingest-status" data-stage={ingest.stage}>
      <div
        aria-hidden="true"
        className="flex h-40 w-56 items-center justify-center rounded-md border border-dashed border-rule-strong bg-paper text-xs text-ink-faint"
      >
        {failed ? 'No preview' : 'Preview on its way'}
      </div>
      <div className="min-w-56 flex-1 space-y-2 text-sm">
        <p className="font-medium">{photo.originalName ?? 'Photo'}</p>
        {failed ? (
          <>
            <p className="text-danger" role="alert">
              Failed: {ingest.error ?? 'the processing stopped.'}
            </p>
            {photo.abilities['photo:update'] ? (
              <Button variant="secondary" disabled={retry.isPending} onClick={() => retry.mutate()}>
                {retry.isPending ? 'Queuing…' : 'Retry'}
              </Button>
            ) : null}
            {retry.error ? <p className="text-danger">{retry.error.message}</p> : null}
          </>
        ) : (
          <>
            <p aria-live="polite">{INGEST_STAGE_WORDS[ingest.stage]}…</p>
            <div className="max-w-md">
              <ProgressBar value={ingestFraction(ingest.stage)} label="Processing" />
            </div>
          </>
        )}
      </div>
    </div>
  );
}

import type { JobView } from '../../../../shared/schemas/jobs';
import { Button } from '../../../components/Button';
import { useRetryJob } from '../../jobs';
import { ProgressBar } from './ProgressBar';

const WORDS: Record<JobView['state'], { text: string; tone: string }> = {
  queued: { text: 'Queued', tone: 'bg-neutral-light text-ink-soft' },
  running: { text: 'Running', tone: 'bg-action-tint text-action' },
  done: { text: 'Done', tone: 'bg-ok-tint text-ok' },
  failed: { text: 'Failed', tone: 'bg-danger-tint text-danger' },
};

/** The state of one background job: queued, running with progress, done, or failed with its reason and a retry button. */
export function JobStatus({ job, title }: { job: JobView; title: string }) {
  const retry = useRetryJob();
  const w = WORDS[job.state];
  return (
    <div className="rounded-md border border-rule bg-sheet p-3 text-sm" data-testid="job-status" data-state={job.state}>
      <div className="flex items-center justify-between gap-3">
        <span className="font-medium">{title}</span>
        <span className={`rounded px-2 py-0.5 text-xs font-medium ${w.tone}`}>{w.text}</span>
      </div>
      {job.state === 'running' || job.state === 'queued' ? (
        <div className="mt-2">
          <ProgressBar value={job.state === 'queued' ? 0 : job.progress} label={`${title} progress`} />
        </div>
      ) : null}
      {job.state === 'failed' ? (
        <div className="mt-2 space-y-2">
          <p className="text-danger" role="alert">
            {job.error ?? 'The job failed.'}{' '}
            <span className="text-ink-faint num">
              (attempt {job.attempts} of {job.maxAttempts})
            </span>
          </p>
          {job.abilities.retry ? (
            <Button variant="secondary" disabled={retry.isPending} onClick={() => retry.mutate(job.id)}>
              {retry.isPending ? 'Queuing…' : 'Try again'}
            </Button>
          ) : null}
          {retry.error ? <p className="text-danger">{retry.error.message}</p> : null}
        </div>
      ) : null}
    </div>
  );
}

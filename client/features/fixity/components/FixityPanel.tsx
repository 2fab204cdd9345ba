import { formatDateTime } from '../../../../shared/format';
import { Button } from '../../../components/Button';
import { JobStatus } from '../../iiif';
import { useFixityLatest, useStartFixity } from '../api';
import type { FixityProblem } from '../../../../shared/schemas/fixity';

function Problems({ title, list }: { title: string; list: FixityProblem[] }) {
  if (!list.length) return null;
  return (
    <div>
      <h3 className="font-medium text-danger">
        {title} <span className="num">({list.length})</span>
      </h3>
      <ul className="mt-1 space-y-1 text-sm">
        {list.map((p) => (
          <li key={p.sha256} className="font-mono text-xs break-all">
            photo {p.photoIds.join(', ')} · expected {p.sha256}
            {p.actual ? ` · found ${p.actual}` : ''}
            {p.file ? ` · ${p.file}` : ' · file not found'}
          </li>
        ))}
      </ul>
    </div>
  );
}

/** Admin panel: re-hash every master against its recorded SHA-256 and show the last report. */
export function FixityPanel() {
  const latest = useFixityLatest();
  const start = useStartFixity();
  const job = latest.data?.job;
  const report = latest.data?.report;
  const busy = job && (job.state === 'queued' || job.state === 'running');
  return (
    <section className="rounded-lg border border-rule bg-sheet p-4 space-y-3" aria-labelledby="fixity-title">
      <div className="flex items-center justify-between gap-3">
        <h2 id="fixity-title" className="text-lg font-semibold">
          Fixity of master files
        </h2>
        <Button onClick={() => start.mutate()} disabled={start.isPending || Boolean(busy)}>
          Check every master now
        </Button>
      </div>
      {start.error ? <p className="text-sm text-danger">{start.error.message}</p> : null}
      {job && job.state !== 'done' ? <JobStatus job={job} title="Fixity check" /> : null}
      {report ? (
        <div className="space-y-2 text-sm" data-testid="fixity-report">
          <p>
            Last check {formatDateTime(report.checkedAt)}: <span className="num">{report.masters}</span> masters,{' '}
            <span className="num text-ok">{report.ok}</span> intact,{' '}
            <span className="num">{report.mismatches.length}</span> changed,{' '}
            <span className="num">{report.missing.length}</span> missing,{' '}
            <span className="num">{report.orphans.length}</span> orphan files removed.
          </p>
          <Problems title="Changed since upload (SHA-256 differs)" list={report.mismatches} />
          <Problems title="Missing" list={report.missing} />
          {report.orphans.length ? (
            <div>
              <h3 className="font-semibold">Orphan files removed (no photo pointed at them, older than an hour)</h3>
              <ul className="list-disc pl-5">
                {report.orphans.map((o) => (
                  <li key={o.file}>
                    <code>{o.file}</code> ({o.kind}, <span className="num">{o.bytes}</span> bytes, last written{' '}
                    {formatDateTime(o.modifiedAt)})
                  </li>
                ))}
              </ul>
            </div>
          ) : null}
        </div>
      ) : latest.isSuccess ? (
        <p className="text-sm text-ink-soft">No check has run yet.</p>
      ) : null}
    </section>
  );
}

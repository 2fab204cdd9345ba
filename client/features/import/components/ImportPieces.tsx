import { useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/Button';
import { ApiError } from '../../../lib/http';
import type { ColumnMapping, ImportError, ImportPreview } from '../../../../shared/schemas/piece-import';
import { REQUIRED_PIECE_FIELDS } from '../../../../shared/schemas/piece-import';
import { ProgressBar } from '../../iiif';
import { paths } from '../../../paths';
import { readHeader, usePreviewImport, usePreviewRows, useRunImport } from '../api';
import { guessMapping, MappingTable } from './MappingTable';
import { ErrorList, Pager, PreviewTable } from './PreviewTable';

const errorsOf = (e: unknown): ImportError[] =>
  e instanceof ApiError && Array.isArray(e.details?.errors) ? (e.details.errors as ImportError[]) : [];

/** Choose a CSV, map its columns, check every row, then import all rows in one go (or none). */
export function ImportPieces() {
  const [file, setFile] = useState<File | null>(null);
  const [mapping, setMapping] = useState<ColumnMapping>({});
  const [progress, setProgress] = useState<number | null>(null);
  const [onlyErrors, setOnlyErrors] = useState(true);
  const [checked, setCheckedState] = useState<ImportPreview | null>(null);
  const [page, setPage] = useState(1);
  const setChecked = (p: ImportPreview | null) => {
    setCheckedState(p);
    setPage(1);
  };
  const check = usePreviewImport();
  // The preview is read a page at a time from the server (a large file's rows are never all sent at once).
  const only = onlyErrors && checked?.invalid ? 'invalid' : 'all';
  const shown = usePreviewRows(checked, page, only);
  const pages = checked
    ? Math.max(1, Math.ceil((only === 'invalid' ? checked.invalid : checked.rows) / checked.pageSize))
    : 1;
  const run = useRunImport();

  async function choose(f: File | null) {
    setFile(f);
    setChecked(null);
    check.reset();
    run.reset();
    setMapping(f ? guessMapping(await readHeader(f)) : {});
  }
  const onProgress = (p: number) => setProgress(p);
  const mapped = new Set(Object.values(mapping));
  const mappingComplete = REQUIRED_PIECE_FIELDS.every((f) => mapped.has(f));
  const busy = check.isPending || run.isPending;
  const failure = run.error ?? check.error;

  return (
    <div className="space-y-6">
      <section className="rounded-lg border border-rule bg-sheet p-4">
        <h2 className="text-lg font-semibold">1. Choose the file</h2>
        <p className="mt-1 text-sm text-ink-soft">
          A CSV saved as UTF-8, one piece per row, a header row first. Lists in one cell are separated by semicolons;
          evidence follows a name in brackets, e.g. <span className="font-mono">madder (attributed); weld</span>{' '}
          (attributed when left out). An identification needs the analysis behind it, which a file cannot carry: import
          the name as attributed, then record the analysis on the piece&rsquo;s page. Dates in EDTF, e.g.{' '}
          <span className="font-mono">1770/1785</span> or <span className="font-mono">18XX</span>.
        </p>
        <label className="mt-3 block text-sm font-medium">
          CSV file (UTF-8)
          <input
            type="file"
            accept=".csv,text/csv"
            className="mt-1 block text-sm"
            onChange={(e) => void choose(e.target.files?.[0] ?? null)}
          />
        </label>
        {file ? (
          <p className="mt-1 text-xs text-ink-faint num">
            {file.name} · {(file.size / 1024).toFixed(1)} kB
          </p>
        ) : null}
      </section>

      {file ? (
        <section className="rounded-lg border border-rule bg-sheet p-4">
          <h2 className="text-lg font-semibold">2. Match the columns</h2>
          <div className="mt-3">
            <MappingTable
              mapping={mapping}
              onChange={(m) => {
                setMapping(m);
                setChecked(null);
              }}
            />
          </div>
          <Button
            className="mt-4"
            disabled={!mappingComplete || busy}
            onClick={() => {
              setProgress(0);
              check.mutate({ file, mapping, onProgress }, { onSuccess: (p) => setChecked(p) });
            }}
          >
            Check every row
          </Button>
        </section>
      ) : null}

      {busy ? (
        <ProgressBar
          value={progress !== null && progress < 1 ? progress : null}
          label={progress !== null && progress < 1 ? 'Uploading' : 'Checking on the server'}
        />
      ) : null}

      {failure ? (
        <section className="rounded-lg border border-danger bg-danger-tint p-4" role="alert">
          <p className="font-medium text-danger">{failure.message}</p>
          <div className="mt-2">
            <ErrorList errors={errorsOf(failure)} />
          </div>
        </section>
      ) : null}

      {checked && !run.isSuccess ? (
        <section className="rounded-lg border border-rule bg-sheet p-4 space-y-3">
          <h2 className="text-lg font-semibold">3. Review and import</h2>
          <p className="text-sm" data-testid="import-summary">
            <span className="num">{checked.rows}</span> rows: <span className="num text-ok">{checked.valid}</span>{' '}
            ready, <span className={`num ${checked.invalid ? 'text-danger' : ''}`}>{checked.invalid}</span> with errors.
            {checked.invalid
              ? ' Nothing is imported until every row is right: correct the file and check it again.'
              : ''}
          </p>
          <label className="inline-flex items-center gap-2 text-sm">
            <input
              type="checkbox"
              checked={onlyErrors}
              onChange={(e) => {
                setOnlyErrors(e.target.checked);
                setPage(1);
              }}
            />{' '}
            Show only rows with errors
          </label>
          {shown.error ? (
            <p className="text-sm text-danger" role="alert">
              {shown.error.message}
            </p>
          ) : null}
          <PreviewTable items={shown.data?.items ?? []} />
          <Pager page={page} pages={pages} onPage={setPage} />
          <Button
            disabled={checked.invalid > 0 || busy}
            onClick={() => {
              setProgress(0);
              run.mutate({ file: file!, mapping, onProgress });
            }}
          >
            Import {checked.valid} pieces
          </Button>
        </section>
      ) : null}

      {run.data ? (
        <p className="rounded-lg border border-ok bg-ok-tint p-4 text-ok" role="status">
          Imported <span className="num">{run.data.imported}</span> pieces as one batch.{' '}
          <Link className="underline" to={paths.archive()}>
            Open the archive
          </Link>
        </p>
      ) : null}
    </div>
  );
}

import type { ImportError, ImportPreviewRow } from '../../../../shared/schemas/piece-import';
import { FIELD_LABELS, type PieceCsvField } from '../../../../shared/schemas/piece-import';

const fieldName = (f: string | null) => (f && f in FIELD_LABELS ? FIELD_LABELS[f as PieceCsvField] : f);

export function ErrorList({ errors }: { errors: ImportError[] }) {
  return (
    <ul className="space-y-1 text-sm text-danger" data-testid="import-errors">
      {errors.map((e, i) => (
        <li key={i}>
          <span className="num font-medium">Line {e.line}</span>
          {e.field ? <span className="text-ink-soft"> · {fieldName(e.field)}</span> : null}: {e.message}
        </li>
      ))}
    </ul>
  );
}

/** A page of the file's rows with their errors beside them; rows with errors stand out. */
export function PreviewTable({ items }: { items: ImportPreviewRow[] }) {
  return (
    <div className="overflow-x-auto rounded-md border border-rule">
      <table className="w-full text-sm">
        <thead className="bg-paper text-left text-ink-soft">
          <tr>
            <th className="px-3 py-2 font-medium">Line</th>
            <th className="px-3 py-2 font-medium">Accession number</th>
            <th className="px-3 py-2 font-medium">Title</th>
            <th className="px-3 py-2 font-medium">Check</th>
          </tr>
        </thead>
        <tbody>
          {items.map((row) => (
            <tr
              key={row.line}
              className={`border-t border-rule align-top ${row.errors.length ? 'bg-danger-tint' : ''}`}
            >
              <td className="px-3 py-1.5 num">{row.line}</td>
              <td className="px-3 py-1.5 font-mono">{row.accessionNumber}</td>
              <td className="px-3 py-1.5">{row.title}</td>
              <td className="px-3 py-1.5">
                {row.errors.length ? (
                  <ul className="text-danger">
                    {row.errors.map((e, i) => (
                      <li key={i}>
                        {e.field ? `${fieldName(e.field)}: ` : ''}
                        {e.message}
                      </li>
                    ))}
                  </ul>
                ) : (
                  <span className="text-ok">ready</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Previous / next through the pages of the preview. */
export function Pager({ page, pages, onPage }: { page: number; pages: number; onPage: (page: number) => void }) {
  if (pages <= 1) return null;
  return (
    <nav aria-label="Pages of the preview" className="flex items-center gap-3 text-sm">
      <button disabled={page <= 1} className="underline disabled:opacity-40" onClick={() => onPage(page - 1)}>
        Previous
      </button>
      <span>
        Page <span className="num">{page}</span> of <span className="num">{pages}</span>
      </span>
      <button disabled={page >= pages} className="underline disabled:opacity-40" onClick={() => onPage(page + 1)}>
        Next
      </button>
    </nav>
  );
}

import type { ImportError, ImportPreview } from '../../../../shared/schemas/piece-import';
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

/** Every row of the file with its errors beside it; rows with errors stand out. */
export function PreviewTable({ preview }: { preview: ImportPreview }) {
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
          {preview.items.map((row) => (
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

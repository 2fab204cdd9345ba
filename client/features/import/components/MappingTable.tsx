import {
  FIELD_LABELS,
  PIECE_CSV_FIELDS,
  REQUIRED_PIECE_FIELDS,
  type ColumnMapping,
  type PieceCsvField,
} from '../../../../shared/schemas/piece-import';

/** A first guess: a header that names a field or its label maps to it; anything else is ignored. */
export function guessMapping(headers: string[]): ColumnMapping {
  const norm = (s: string) => s.toLowerCase().replace(/[^a-z0-9]/g, '');
  const byName = new Map<string, PieceCsvField>();
  for (const f of PIECE_CSV_FIELDS) {
    byName.set(norm(f), f);
    byName.set(norm(FIELD_LABELS[f]), f);
  }
  return Object.fromEntries(headers.map((h) => [h, byName.get(norm(h)) ?? '']));
}

export function MappingTable({ mapping, onChange }: { mapping: ColumnMapping; onChange: (m: ColumnMapping) => void }) {
  const used = new Set(Object.values(mapping).filter(Boolean));
  const missing = REQUIRED_PIECE_FIELDS.filter((f) => !used.has(f));
  return (
    <div>
      <table className="w-full text-sm">
        <thead>
          <tr className="text-left text-ink-soft">
            <th className="py-1 pr-4 font-medium">Column in the file</th>
            <th className="py-1 font-medium">Field in Tinctoria</th>
          </tr>
        </thead>
        <tbody>
          {Object.entries(mapping).map(([header, field]) => (
            <tr key={header} className="border-t border-rule">
              <td className="py-1 pr-4 font-mono">{header || <em className="text-ink-faint">(no name)</em>}</td>
              <td className="py-1">
                <select
                  aria-label={`Field for column ${header}`}
                  className="rounded-md border border-rule-strong bg-sheet px-2 py-1"
                  value={field}
                  onChange={(e) => onChange({ ...mapping, [header]: e.target.value as PieceCsvField | '' })}
                >
                  <option value="">— ignore this column —</option>
                  {PIECE_CSV_FIELDS.map((f) => (
                    <option key={f} value={f}>
                      {FIELD_LABELS[f]}
                      {REQUIRED_PIECE_FIELDS.includes(f) ? ' (required)' : ''}
                    </option>
                  ))}
                </select>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {missing.length ? (
        <p className="mt-2 text-sm text-danger" role="alert">
          Map a column to: {missing.map((f) => FIELD_LABELS[f]).join(', ')}.
        </p>
      ) : null}
    </div>
  );
}

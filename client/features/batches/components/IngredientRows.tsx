import type { BatchIngredientInput } from '../../../../shared/schemas/batches';
import { useChemicals, useDyestuffs } from '../../reference';

type Row = { key: string; grams: string };

/** The chemicals and dyestuffs a bath is made from, each with its amount in g. */
export function IngredientRows({
  rows,
  onChange,
  errors = {},
  field = 'ingredients',
}: {
  rows: Row[];
  onChange: (rows: Row[]) => void;
  errors?: Record<string, string[]>;
  field?: string;
}) {
  const chemicals = useChemicals().data?.items ?? [];
  const dyestuffs = useDyestuffs().data?.items ?? [];
  const set = (i: number, patch: Partial<Row>) => onChange(rows.map((r, j) => (j === i ? { ...r, ...patch } : r)));
  // ingredientsFrom() leaves out rows without a choice, so the server's index counts chosen rows only.
  const sent = rows.map((_, i) => rows.slice(0, i).filter((r) => r.key).length);
  const rowErrors = (i: number, key: string) => (rows[i].key ? errors[`${field}.${sent[i]}.${key}`] : undefined);
  const listError = Object.entries(errors)
    .filter(([k]) => k === field || (k.startsWith(`${field}.`) && !/\.\d+\.grams$/.test(k)))
    .flatMap(([, v]) => v);
  return (
    <fieldset className="sm:col-span-3">
      <legend className="text-sm font-medium">Ingredients</legend>
      <ul className="mt-1 space-y-2">
        {rows.map((r, i) => (
          <li key={i} className="flex flex-wrap items-end gap-2">
            <label className="text-xs text-ink-soft">
              Chemical or dyestuff
              <select
                aria-label={`Ingredient ${i + 1}`}
                value={r.key}
                onChange={(e) => set(i, { key: e.target.value })}
                className="mt-1 block min-w-64 rounded-md border border-rule-strong bg-sheet px-3 py-2 text-sm text-ink"
              >
                <option value="">— choose —</option>
                <optgroup label="Chemicals">
                  {chemicals.map((c) => (
                    <option key={c.id} value={`chemical:${c.id}:${c.name}`}>
                      {c.name}
                      {c.status === 'historical-only' ? ' (historical only)' : ''}
                    </option>
                  ))}
                </optgroup>
                <optgroup label="Dyestuffs">
                  {dyestuffs.map((d) => (
                    <option key={d.id} value={`dyestuff:${d.id}:${d.name}`}>
                      {d.name}
                    </option>
                  ))}
                </optgroup>
              </select>
            </label>
            <label className="text-xs text-ink-soft">
              Amount (g)
              <input
                aria-label={`Amount of ingredient ${i + 1} (g)`}
                aria-invalid={rowErrors(i, 'grams') ? true : undefined}
                type="number"
                step="any"
                min="0"
                value={r.grams}
                onChange={(e) => set(i, { grams: e.target.value })}
                className={`mt-1 block w-28 rounded-md border bg-sheet px-3 py-2 text-sm text-ink num ${rowErrors(i, 'grams') ? 'border-danger' : 'border-rule-strong'}`}
              />
              {rowErrors(i, 'grams') ? (
                <span className="mt-1 block text-sm text-danger">{rowErrors(i, 'grams')!.join(' ')}</span>
              ) : null}
            </label>
            <button
              type="button"
              className="pb-2 text-sm text-action hover:underline"
              onClick={() => onChange(rows.filter((_, j) => j !== i))}
            >
              Remove
            </button>
          </li>
        ))}
      </ul>
      <button
        type="button"
        className="mt-2 text-sm text-action hover:underline"
        onClick={() => onChange([...rows, { key: '', grams: '' }])}
      >
        Add an ingredient
      </button>
      {listError.length ? (
        <p className="mt-1 text-sm text-danger" data-field-error tabIndex={-1}>
          {[...new Set(listError)].join(' ')}
        </p>
      ) : null}
    </fieldset>
  );
}

/** The rows as the API wants them; rows without a choice are left out, amounts stay as typed so zod can say what is wrong. */
export function ingredientsFrom(rows: Row[]): BatchIngredientInput[] {
  return rows
    .filter((r) => r.key)
    .map((r) => {
      const [kind, id, ...name] = r.key.split(':');
      return {
        kind: kind as 'chemical' | 'dyestuff',
        refId: Number(id),
        name: name.join(':'),
        grams: r.grams === '' ? Number.NaN : Number(r.grams),
      };
    });
}

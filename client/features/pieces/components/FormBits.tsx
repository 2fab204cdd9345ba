import { useId, type ReactNode, type TextareaHTMLAttributes } from 'react';

export const errorText = (e?: string[]) => (e?.length ? e.join(' ') : undefined);

export function TextAreaField({
  label,
  error,
  ...rest
}: TextareaHTMLAttributes<HTMLTextAreaElement> & { label: string; error?: string[] }) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium">
        {label}
      </label>
      <textarea
        id={id}
        rows={3}
        aria-invalid={error?.length ? true : undefined}
        aria-describedby={error?.length ? `${id}-err` : undefined}
        className={`mt-1 block w-full rounded-md border bg-sheet px-3 py-2 text-sm ${error?.length ? 'border-danger' : 'border-rule-strong'}`}
        {...rest}
      />
      {error?.length ? (
        <p id={`${id}-err`} className="mt-1 text-sm text-danger">
          {errorText(error)}
        </p>
      ) : null}
    </div>
  );
}

/** A group of checkboxes for terms from a vocabulary. */
export function TermChecklist({
  legend,
  terms,
  value,
  onChange,
  error,
}: {
  legend: string;
  terms: string[];
  value: string[];
  onChange: (v: string[]) => void;
  error?: string[];
}) {
  const id = useId();
  return (
    <fieldset aria-describedby={error?.length ? `${id}-err` : undefined}>
      <legend className="text-sm font-medium">{legend}</legend>
      <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
        {terms.map((t) => (
          <label key={t} className="flex items-center gap-1.5 text-sm">
            <input
              type="checkbox"
              checked={value.includes(t)}
              onChange={(e) => onChange(e.target.checked ? [...value, t] : value.filter((x) => x !== t))}
            />
            {t}
          </label>
        ))}
      </div>
      {error?.length ? (
        <p id={`${id}-err`} className="mt-1 text-sm text-danger">
          {errorText(error)}
        </p>
      ) : null}
    </fieldset>
  );
}

export type Evidenced = { name: string; evidence: 'attributed' | 'identified'; analysisId?: number | null };

/** Rows of name + evidence (attributed | identified), for dyestuffs and historical mordants. */
export function EvidencedList({
  legend,
  suggestions,
  value,
  onChange,
  errors,
  field,
  hint,
  analyses = [],
}: {
  analyses?: Array<{ id: number; label: string }>;
  legend: string;
  suggestions: string[];
  value: Evidenced[];
  onChange: (v: Evidenced[]) => void;
  errors: Record<string, string[]>;
  field: string;
  hint?: ReactNode;
}) {
  const listId = useId();
  const set = (i: number, patch: Partial<Evidenced>) =>
    onChange(value.map((row, j) => (j === i ? { ...row, ...patch } : row)));
  return (
    <fieldset>
      <legend className="text-sm font-medium">{legend}</legend>
      {hint ? <p className="text-xs text-ink-faint">{hint}</p> : null}
      <datalist id={listId}>
        {suggestions.map((s) => (
          <option key={s} value={s} />
        ))}
      </datalist>
      <ul className="mt-1 space-y-2">
        {value.map((row, i) => (
          <li key={i} className="flex flex-wrap items-start gap-2">
            <label className="flex-1 min-w-48 text-sm">
              <span className="sr-only">
                {legend} {i + 1} name
              </span>
              <input
                list={listId}
                value={row.name}
                onChange={(e) => set(i, { name: e.target.value })}
                aria-invalid={errors[`${field}.${i}.name`] ? true : undefined}
                aria-describedby={errors[`${field}.${i}.name`] ? `${listId}-${i}-err` : undefined}
                className="block w-full rounded-md border border-rule-strong bg-sheet px-3 py-2 text-sm"
              />
              {errors[`${field}.${i}.name`] ? (
                <span id={`${listId}-${i}-err`} className="text-danger">
                  {errorText(errors[`${field}.${i}.name`])}
                </span>
              ) : null}
            </label>
            <label className="text-sm">
              <span className="sr-only">
                {legend} {i + 1} evidence
              </span>
              <select
                value={row.evidence}
                onChange={(e) => set(i, { evidence: e.target.value as Evidenced['evidence'] })}
                className="rounded-md border border-rule-strong bg-sheet px-2 py-2 text-sm"
              >
                <option value="attributed">attributed</option>
                <option value="identified">identified (by analysis)</option>
              </select>
            </label>
            {row.evidence === 'identified' ? (
              <label className="text-sm">
                <span className="sr-only">
                  {legend} {i + 1} identified by
                </span>
                <select
                  value={row.analysisId ?? ''}
                  onChange={(e) => set(i, { analysisId: e.target.value ? Number(e.target.value) : null })}
                  aria-invalid={errors[`${field}.${i}.analysisId`] ? true : undefined}
                  aria-describedby={errors[`${field}.${i}.analysisId`] ? `${listId}-${i}-an` : undefined}
                  className="max-w-64 rounded-md border border-rule-strong bg-sheet px-2 py-2 text-sm"
                >
                  <option value="">Identified by which analysis?</option>
                  {analyses.map((a) => (
                    <option key={a.id} value={a.id}>
                      {a.label}
                    </option>
                  ))}
                </select>
                {errors[`${field}.${i}.analysisId`] ? (
                  <span id={`${listId}-${i}-an`} className="block text-danger">
                    {errorText(errors[`${field}.${i}.analysisId`])}
                  </span>
                ) : null}
              </label>
            ) : null}
            <button
              type="button"
              className="px-2 py-2 text-sm text-action hover:underline"
              onClick={() => onChange(value.filter((_, j) => j !== i))}
            >
              Remove
            </button>
          </li>
        ))}
      </ul>
      <button
        type="button"
        className="mt-2 text-sm text-action hover:underline"
        onClick={() => onChange([...value, { name: '', evidence: 'attributed' }])}
      >
        Add a line
      </button>
      {errors[field] ? (
        <p className="mt-1 text-sm text-danger" data-field-error tabIndex={-1}>
          {errorText(errors[field])}
        </p>
      ) : null}
    </fieldset>
  );
}

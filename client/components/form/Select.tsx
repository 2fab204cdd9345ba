import { useId, type SelectHTMLAttributes } from 'react';

type Props = SelectHTMLAttributes<HTMLSelectElement> & {
  label: string;
  error?: string[];
  options: ReadonlyArray<{ value: string; label: string }>;
};

/** A labelled select that shows its error beside it, like Field. */
export function Select({ label, error, options, className, ...select }: Props) {
  const id = useId();
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
      </label>
      <select
        id={id}
        aria-invalid={error?.length ? true : undefined}
        aria-describedby={error?.length ? `${id}-err` : undefined}
        className={`mt-1 block w-full rounded-md border bg-sheet px-3 py-2 text-sm ${error?.length ? 'border-danger' : 'border-rule-strong'}`}
        {...select}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      {error?.length ? (
        <p id={`${id}-err`} className="mt-1 text-sm text-danger">
          {error.join(' ')}
        </p>
      ) : null}
    </div>
  );
}

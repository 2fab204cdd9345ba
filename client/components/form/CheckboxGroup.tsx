import type { ReactNode } from 'react';

type Props<V extends string | number> = {
  legend: string;
  hint?: ReactNode;
  options: ReadonlyArray<{ value: V; label: ReactNode }>;
  selected: readonly V[];
  onChange: (selected: V[]) => void;
  error?: string[];
};

/** A set of tick boxes under one legend, with what is wrong said under them (focusable, as the forms' errors are). */
export function CheckboxGroup<V extends string | number>({
  legend,
  hint,
  options,
  selected,
  onChange,
  error,
}: Props<V>) {
  return (
    <fieldset>
      <legend className="text-sm font-medium">{legend}</legend>
      {hint ? <p className="text-xs text-ink-faint">{hint}</p> : null}
      <div className="mt-1 flex flex-wrap gap-x-4 gap-y-1">
        {options.map((o) => (
          <label key={o.value} className="flex items-center gap-2 text-sm">
            <input
              type="checkbox"
              checked={selected.includes(o.value)}
              onChange={(e) =>
                onChange(e.target.checked ? [...selected, o.value] : selected.filter((v) => v !== o.value))
              }
            />
            {o.label}
          </label>
        ))}
      </div>
      {error ? (
        <p className="mt-1 text-sm text-danger" data-field-error tabIndex={-1}>
          {error.join(' ')}
        </p>
      ) : null}
    </fieldset>
  );
}

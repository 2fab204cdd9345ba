import type { SelectHTMLAttributes } from 'react';
import { FieldFrame } from './FieldFrame';

type Props = SelectHTMLAttributes<HTMLSelectElement> & {
  label: string;
  error?: string[];
  options: ReadonlyArray<{ value: string; label: string }>;
};

/** A labelled select that shows its error beside it, like Field. */
export function Select({ label, error, options, className, ...select }: Props) {
  return (
    <FieldFrame label={label} error={error} className={className}>
      {(control) => (
        <select {...control} {...select}>
          {options.map((o) => (
            <option key={o.value} value={o.value}>
              {o.label}
            </option>
          ))}
        </select>
      )}
    </FieldFrame>
  );
}

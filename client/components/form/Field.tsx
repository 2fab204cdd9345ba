import { useId, type InputHTMLAttributes, type ReactNode } from 'react';

type Props = InputHTMLAttributes<HTMLInputElement> & {
  label: string;
  error?: string[] | string;
  hint?: ReactNode;
  unit?: string;
};

/** A labelled input that says what is wrong right beside it. */
export function Field({ label, error, hint, unit, className, ...input }: Props) {
  const id = useId();
  const errors = typeof error === 'string' ? [error] : error;
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
        {unit ? <span className="ml-1 font-normal text-ink-faint">({unit})</span> : null}
      </label>
      <input
        id={id}
        aria-invalid={errors?.length ? true : undefined}
        aria-describedby={errors?.length ? `${id}-err` : hint ? `${id}-hint` : undefined}
        className={`mt-1 block w-full rounded-md border bg-sheet px-3 py-2 text-sm ${errors?.length ? 'border-danger' : 'border-rule-strong'} focus:border-action`}
        {...input}
      />
      {errors?.length ? (
        <p id={`${id}-err`} className="mt-1 text-sm text-danger">
          {errors.join(' ')}
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

import { useId, type TextareaHTMLAttributes } from 'react';

type Props = TextareaHTMLAttributes<HTMLTextAreaElement> & { label: string; error?: string[]; hint?: string };

/** A labelled text area that shows its error beside it, like Field. */
export function TextArea({ label, error, hint, className, ...area }: Props) {
  const id = useId();
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
      </label>
      <textarea
        id={id}
        aria-invalid={error?.length ? true : undefined}
        aria-describedby={error?.length ? `${id}-err` : hint ? `${id}-hint` : undefined}
        className={`mt-1 block w-full rounded-md border bg-sheet px-3 py-2 text-sm ${error?.length ? 'border-danger' : 'border-rule-strong'} focus:border-action`}
        {...area}
      />
      {error?.length ? (
        <p id={`${id}-err`} className="mt-1 text-sm text-danger">
          {error.join(' ')}
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

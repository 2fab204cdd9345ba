import { useId, type ReactNode } from 'react';

/** What a frame hands its control: the id its label points at, and the accessibility and border state. */
export type ControlProps = {
  id: string;
  'aria-invalid': true | undefined;
  'aria-describedby': string | undefined;
  className: string;
};

type Props = {
  label: string;
  error?: string[] | string;
  hint?: ReactNode;
  unit?: string;
  className?: string;
  children: (control: ControlProps) => ReactNode;
};

/**
 * The one label-control-message layout of every form control (Field, TextArea, Select): the label above, the control,
 * then what is wrong right beside it (or the hint when nothing is), tied to the control for screen readers.
 */
export function FieldFrame({ label, error, hint, unit, className, children }: Props) {
  const id = useId();
  const errors = typeof error === 'string' ? [error] : error;
  const invalid = Boolean(errors?.length);
  return (
    <div className={className}>
      <label htmlFor={id} className="block text-sm font-medium text-ink">
        {label}
        {unit ? <span className="ml-1 font-normal text-ink-faint">({unit})</span> : null}
      </label>
      {children({
        id,
        'aria-invalid': invalid ? true : undefined,
        'aria-describedby': invalid ? `${id}-err` : hint ? `${id}-hint` : undefined,
        className: `mt-1 block w-full rounded-md border bg-sheet px-3 py-2 text-sm ${invalid ? 'border-danger' : 'border-rule-strong'} focus:border-action`,
      })}
      {invalid ? (
        <p id={`${id}-err`} className="mt-1 text-sm text-danger">
          {errors!.join(' ')}
        </p>
      ) : hint ? (
        <p id={`${id}-hint`} className="mt-1 text-xs text-ink-faint">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

import type { InputHTMLAttributes, ReactNode } from 'react';
import { FieldFrame } from './FieldFrame';

type Props = InputHTMLAttributes<HTMLInputElement> & {
  label: string;
  error?: string[] | string;
  hint?: ReactNode;
  unit?: string;
};

/** A labelled input that says what is wrong right beside it. */
export function Field({ label, error, hint, unit, className, ...input }: Props) {
  return (
    <FieldFrame label={label} error={error} hint={hint} unit={unit} className={className}>
      {(control) => <input {...control} {...input} />}
    </FieldFrame>
  );
}

import type { TextareaHTMLAttributes } from 'react';
import { FieldFrame } from './FieldFrame';

type Props = TextareaHTMLAttributes<HTMLTextAreaElement> & { label: string; error?: string[]; hint?: string };

/** A labelled text area that shows its error beside it, like Field. */
export function TextArea({ label, error, hint, className, ...area }: Props) {
  return (
    <FieldFrame label={label} error={error} hint={hint} className={className}>
      {(control) => <textarea {...control} {...area} />}
    </FieldFrame>
  );
}

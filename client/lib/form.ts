import { useCallback, useEffect, useRef, useState } from 'react';
import type { z } from 'zod';
import { ApiError } from './http';
import { fieldErrorsOf as sharedFieldErrorsOf, type FieldErrors } from '../../shared/field-errors';

/** Messages keyed by the field's path joined with dots ("steps.0.ph"), exactly as the server's 400 details.fields. */
export type { FieldErrors };

/** A zod error as per-field messages, keyed the way the server keys them (shared/field-errors.ts): the first problem of each field ("Enter the code", not also "Letters only"). */
export const fieldErrorsOf = (error: z.ZodError): FieldErrors => sharedFieldErrorsOf(error.issues, { first: true });

/** What is wrong with the values by the schema, as per-field messages, or null when they pass. For values that are not typed into a form (a query in the address bar); a form uses check(). */
export function errorsFor(schema: z.ZodType, raw: unknown): FieldErrors | null {
  const parsed = schema.safeParse(raw);
  return parsed.success ? null : fieldErrorsOf(parsed.error);
}

/** Per-field errors the server sent back, if any. */
export const serverFieldErrors = (err: unknown): FieldErrors =>
  err instanceof ApiError && err.details?.fields ? err.details.fields : {};

/** A message for the whole form when the error is not about one field. */
export const formMessage = (err: unknown): string | null =>
  err instanceof ApiError
    ? err.details?.fields
      ? null
      : err.message
    : err
      ? 'Something went wrong. Try again.'
      : null;

/** Messages for a field and everything under it ("factors" also gathers "factors.0.levels"). */
export const errorsUnder = (errors: FieldErrors, key: string): string[] | undefined => {
  const all = Object.entries(errors)
    .filter(([k]) => k === key || k.startsWith(`${key}.`))
    .flatMap(([, v]) => v);
  return all.length ? [...new Set(all)] : undefined;
};

/**
 * The one validation style of every form: check the values with the shared schema before sending,
 * show each message under its field, put the cursor on the first field in error, and show the
 * server's 400 details.fields on the same fields. Fields mark themselves with aria-invalid; a group
 * without an input of its own (a list of rows) marks its message with data-field-error and tabIndex -1.
 */
export function useFormErrors() {
  const formRef = useRef<HTMLFormElement>(null);
  const [errors, setErrors] = useState<FieldErrors>({});
  const [focusTick, setFocusTick] = useState(0);

  useEffect(() => {
    if (!focusTick) return;
    const first = formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"], [data-field-error]');
    first?.focus();
  }, [focusTick]);

  const show = useCallback((next: FieldErrors) => {
    setErrors(next);
    if (Object.keys(next).length) setFocusTick((t) => t + 1);
  }, []);

  /** The parsed values, or null after showing what is wrong. */
  const check = useCallback(
    <S extends z.ZodType>(schema: S, raw: unknown): z.infer<S> | null => {
      const parsed = schema.safeParse(raw);
      if (parsed.success) {
        setErrors({});
        return parsed.data;
      }
      show(fieldErrorsOf(parsed.error));
      return null;
    },
    [show],
  );

  /** After a failed request: its per-field messages under the fields (keys may be prefixed, e.g. the recipe's "steps.0."). */
  const fromServer = useCallback((err: unknown) => show(serverFieldErrors(err)), [show]);

  return {
    formRef,
    errors,
    check,
    fromServer,
    show,
    clear: () => setErrors({}),
    under: (key: string) => errorsUnder(errors, key),
  };
}

/**
 * The one mapping from zod issues to per-field messages, used by the server's 400 answers
 * (server/http/errors.ts) and by the client's forms (client/lib/form.ts), so both key a field the same way.
 */

/** Messages keyed by the field's path joined with dots ("steps.0.ph"); "_" for the whole input. */
export type FieldErrors = Record<string, string[]>;

/** The key of one field: its path joined with dots, "_" for the input as a whole. */
export const fieldKey = (path: ReadonlyArray<PropertyKey>): string => path.map(String).join('.') || '_';

/**
 * Per-field messages from zod issues (`error.issues`). `first: true` keeps only the first problem of
 * each field (a form shows "Enter the code", not also "Letters only"); otherwise every message is kept.
 */
export function fieldErrorsOf(
  issues: ReadonlyArray<{ path: ReadonlyArray<PropertyKey>; message: string }>,
  { first = false } = {},
): FieldErrors {
  const errors: FieldErrors = {};
  for (const issue of issues) {
    const list = (errors[fieldKey(issue.path)] ??= []);
    if (!first || !list.length) list.push(issue.message);
  }
  return errors;
}

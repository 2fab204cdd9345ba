import type { z } from 'zod';
import { ApiError } from './http';

export type FieldErrors = Record<string, string[]>;

/** Parse a form with the shared schema; errors come back keyed by field for <Field error>. */
export function parseForm<S extends z.ZodType>(schema: S, form: HTMLFormElement): { data: z.infer<S>; errors: null } | { data: null; errors: FieldErrors } {
  const parsed = schema.safeParse(Object.fromEntries(new FormData(form)));
  if (parsed.success) return { data: parsed.data, errors: null };
  const errors: FieldErrors = {};
  for (const i of parsed.error.issues) (errors[String(i.path[0] ?? '_')] ??= []).push(i.message);
  return { data: null, errors };
}

/** Per-field errors the server sent back, if any. */
export const serverFieldErrors = (err: unknown): FieldErrors => (err instanceof ApiError && err.details?.fields ? err.details.fields : {});

/** A message for the whole form when the error is not about one field. */
export const formMessage = (err: unknown): string | null => (err instanceof ApiError ? (err.details?.fields ? null : err.message) : err ? 'Something went wrong. Try again.' : null);

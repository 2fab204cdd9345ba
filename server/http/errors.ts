import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { fieldErrorsOf } from '../../shared/field-errors.ts';

/** An error with an HTTP status and a stable code, rendered as { error: { code, message, details? } }. */
export class HttpError extends Error {
  constructor(
    public status: number,
    public code: string,
    message: string,
    public details?: unknown,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, details?: unknown) => new HttpError(400, 'invalid_input', message, details);
export const unauthorized = (message = 'Sign in to continue.') => new HttpError(401, 'unauthenticated', message);
export const forbidden = (message = 'Your role does not allow this.') => new HttpError(403, 'forbidden', message);
export const notFound = (what = 'Resource') => new HttpError(404, 'not_found', `${what} not found.`);
export const conflict = (message: string, details?: unknown) => new HttpError(409, 'conflict', message, details);
export const unprocessable = (message: string, details?: unknown) =>
  new HttpError(422, 'unprocessable', message, details);

/** Per-field details from a zod error: { "field.path": ["message", …] }. */
export const zodDetails = (err: ZodError) => ({ fields: fieldErrorsOf(err.issues) });

export const apiNotFound: RequestHandler = (req, _res, next) =>
  next(new HttpError(404, 'not_found', `No API route ${req.method} ${req.path}.`));

export const errorHandler: ErrorRequestHandler = (err, _req, res, _next) => {
  if (err instanceof ZodError) {
    res
      .status(400)
      .json({ error: { code: 'invalid_input', message: 'Some fields are not valid.', details: zodDetails(err) } });
    return;
  }
  if (err instanceof HttpError) {
    res.status(err.status).json({
      error: { code: err.code, message: err.message, ...(err.details === undefined ? {} : { details: err.details }) },
    });
    return;
  }
  // Express's router decodes each path parameter with decodeURIComponent: a malformed escape
  // ("%E0%A4%A", "%FF") throws URIError (status 400 set by the router) — the sender's fault, not ours.
  if (err instanceof URIError) {
    res.status(400).json({
      error: {
        code: 'invalid_input',
        message: 'The address has a malformed part (a broken %-escape) and was refused.',
      },
    });
    return;
  }
  if (err?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'invalid_json', message: 'The request body is not valid JSON.' } });
    return;
  }
  if (err?.type === 'entity.too.large') {
    res.status(413).json({ error: { code: 'too_large', message: 'The request body is too large.' } });
    return;
  }
  if (err?.name === 'SequelizeUniqueConstraintError') {
    res
      .status(409)
      .json({ error: { code: 'conflict', message: 'A record with that value already exists.', details: err.fields } });
    return;
  }
  console.error(err);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server.' } });
};

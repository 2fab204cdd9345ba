import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { fieldErrorsOf } from '../../shared/field-errors.ts';
import { logger } from '../log/index.ts';

/** An error with an HTTP status and a stable code, rendered as { error: { code, message, details? } }. */
export class HttpError extends Error {
  constructor(
    public status: number,
    public code: string,
    message: string,
    public details?: unknown,
    /** Sent as Retry-After (seconds) with a 503 or 429. */
    public retryAfterS?: number,
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

/** Sequelize's names for a database that cannot be reached or did not answer in time (acquire, connect, socket). */
const DB_DOWN_NAMES = new Set([
  'SequelizeConnectionError',
  'SequelizeConnectionAcquireTimeoutError',
  'SequelizeConnectionRefusedError',
  'SequelizeConnectionTimedOutError',
  'SequelizeHostNotFoundError',
  'SequelizeHostNotReachableError',
]);
/** MariaDB connector codes of a lost or silent connection, and MariaDB's statement timeout (max_statement_time). */
const DB_DOWN_CODES = new Set([
  'ER_SOCKET_TIMEOUT',
  'ER_CONNECTION_TIMEOUT',
  'ER_GET_CONNECTION_TIMEOUT',
  'ER_SOCKET_UNEXPECTED_CLOSE',
  'ER_CONNECTION_ALREADY_CLOSED',
  'ER_CMD_CONNECTION_CLOSED',
  'ER_STATEMENT_TIMEOUT',
  'ECONNRESET',
  'ECONNREFUSED',
  'ETIMEDOUT',
]);
export const isDatabaseUnavailable = (err: unknown): boolean => {
  const e = err as { name?: string; code?: string; parent?: { code?: string }; original?: { code?: string } } | null;
  if (!e) return false;
  if (e.name && DB_DOWN_NAMES.has(e.name)) return true;
  const code = e.parent?.code ?? e.original?.code ?? (e.name?.startsWith('Sequelize') ? undefined : e.code);
  return e.name === 'SequelizeDatabaseError' && code !== undefined && DB_DOWN_CODES.has(code);
};
/** Seconds a client should wait before retrying after a database_unavailable 503 (common practice: a few seconds). */
export const DB_RETRY_AFTER_S = 5;

export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  // Every error body carries the request id (set by the request logger, server/log/index.ts).
  const requestId = typeof req.id === 'string' ? req.id : undefined;
  const json = res.json.bind(res);
  res.json = (body: { error?: Record<string, unknown> }) =>
    json(requestId && body?.error ? { error: { ...body.error, requestId } } : body);
  if (err instanceof ZodError) {
    res
      .status(400)
      .json({ error: { code: 'invalid_input', message: 'Some fields are not valid.', details: zodDetails(err) } });
    return;
  }
  if (err instanceof HttpError) {
    if (err.retryAfterS !== undefined) res.set('Retry-After', String(err.retryAfterS));
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
  if (isDatabaseUnavailable(err)) {
    res
      .status(503)
      .set('Retry-After', String(DB_RETRY_AFTER_S))
      .json({
        error: { code: 'database_unavailable', message: 'The database is not answering. Try again in a few seconds.' },
      });
    return;
  }
  (req.log ?? logger).error({ err }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server.' } });
};

import type { RequestHandler } from 'express';
import { HttpError } from './errors.ts';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The Vite dev server's origins (npm run dev); never allowed in production. */
export const DEV_ORIGINS = ['http://127.0.0.1:5173', 'http://localhost:5173'];

/** Origins besides the request's own that may send state-changing requests: the public origin, and Vite's in development. */
export const appOrigins = (publicUrl: string, production: boolean) => [
  new URL(publicUrl).origin,
  ...(production ? [] : DEV_ORIGINS),
];

/**
 * Refuse state-changing requests that do not come from the app's own origin.
 * With an Origin header it must equal the request's own origin (or one allowed);
 * without one, only Sec-Fetch-Site: same-origin passes.
 */
export function originCheck(allowed: string[] = []): RequestHandler {
  return (req, _res, next) => {
    if (SAFE.has(req.method)) return next();
    const origin = req.get('origin');
    const own = `${req.protocol}://${req.get('host')}`;
    if (origin ? origin === own || allowed.includes(origin) : req.get('sec-fetch-site') === 'same-origin')
      return next();
    next(new HttpError(403, 'bad_origin', 'This request did not come from Tinctoria itself and was refused.'));
  };
}

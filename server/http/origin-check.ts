import type { RequestHandler } from 'express';
import { HttpError } from './errors.ts';

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

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

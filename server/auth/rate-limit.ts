import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { HttpError } from '../http/errors.ts';

const WINDOW_MS = 15 * 60_000;
/** Failed sign-ins allowed per e-mail address and per IP address in 15 minutes. */
export const LOGIN_LIMITS = { perEmail: 10, perIp: 30 } as const;

const tooMany = (retryAfterS: number) =>
  new HttpError(429, 'too_many_attempts', `Too many failed sign-in attempts. Wait ${Math.ceil(retryAfterS / 60)} minutes and try again, or set a new password.`, { retryAfterSeconds: retryAfterS });

/**
 * Sign-in limits, created per app instance (the counters live in memory in that app).
 * Only failed attempts count, so a team signing in from one office is not locked out;
 * the per-IP limit is looser because many people may share one address.
 */
export function loginRateLimits(): RequestHandler[] {
  const common = {
    windowMs: WINDOW_MS,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    skipSuccessfulRequests: true,
    handler: (_req: Parameters<RequestHandler>[0], _res: Parameters<RequestHandler>[1], next: Parameters<RequestHandler>[2]) => next(tooMany(WINDOW_MS / 1000)),
  };
  return [
    rateLimit({ ...common, limit: LOGIN_LIMITS.perIp }),
    rateLimit({
      ...common,
      limit: LOGIN_LIMITS.perEmail,
      keyGenerator: (req) => `email:${String((req.body as { email?: unknown } | undefined)?.email ?? '').trim().toLowerCase()}`,
    }),
  ];
}

const RESET_WINDOW_MS = 60 * 60_000;
/** Password-reset requests allowed per e-mail address and per IP address in an hour: each may send a mail. */
export const RESET_LIMITS = { perEmail: 5, perIp: 20 } as const;

/**
 * Password-reset request limits, per app instance. Every request counts (a known address gets a mail each time),
 * and the same limit applies to any address, so the answer still says nothing about which addresses have accounts.
 */
export function resetRequestRateLimits(): RequestHandler[] {
  const common = {
    windowMs: RESET_WINDOW_MS,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    handler: (_req: Parameters<RequestHandler>[0], _res: Parameters<RequestHandler>[1], next: Parameters<RequestHandler>[2]) =>
      next(
        new HttpError(429, 'too_many_requests', `Too many password-reset requests. Wait ${RESET_WINDOW_MS / 60_000} minutes and try again, or ask an administrator.`, {
          retryAfterSeconds: RESET_WINDOW_MS / 1000,
        }),
      ),
  };
  return [
    rateLimit({ ...common, limit: RESET_LIMITS.perIp }),
    rateLimit({
      ...common,
      limit: RESET_LIMITS.perEmail,
      keyGenerator: (req) => `reset:${String((req.body as { email?: unknown } | undefined)?.email ?? '').trim().toLowerCase()}`,
    }),
  ];
}

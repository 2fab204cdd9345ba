import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';
import { HttpError } from '../http/errors.ts';
import { DatabaseRateLimitStore } from './rate-limit-store.ts';

/** Failed sign-ins allowed per e-mail address and per IP address in 15 minutes. */
export const LOGIN_LIMITS = { perEmail: 10, perIp: 30 } as const;
/** Password-reset requests allowed per e-mail address and per IP address in an hour: each may send a mail. */
export const RESET_LIMITS = { perEmail: 5, perIp: 20 } as const;

type PairOptions = {
  windowMs: number;
  limits: { perEmail: number; perIp: number };
  keyPrefix: string;
  /** Names this pair's counters in the shared table: `<storePrefix>-ip` and `<storePrefix>-email`. */
  storePrefix: string;
  skipSuccessfulRequests?: boolean;
  error: () => HttpError;
};

/**
 * One limiter per IP address and one per e-mail address in the body. The counters live in MariaDB
 * (rate-limit-store.ts), so every app server on the same database counts together and a restart forgets nothing.
 */
function perIpAndEmail({
  windowMs,
  limits,
  keyPrefix,
  storePrefix,
  skipSuccessfulRequests = false,
  error,
}: PairOptions): RequestHandler[] {
  const common = {
    windowMs,
    standardHeaders: 'draft-8' as const,
    legacyHeaders: false,
    skipSuccessfulRequests,
    handler: (
      _req: Parameters<RequestHandler>[0],
      _res: Parameters<RequestHandler>[1],
      next: Parameters<RequestHandler>[2],
    ) => next(error()),
  };
  return [
    rateLimit({ ...common, limit: limits.perIp, store: new DatabaseRateLimitStore(`${storePrefix}-ip`) }),
    rateLimit({
      ...common,
      limit: limits.perEmail,
      store: new DatabaseRateLimitStore(`${storePrefix}-email`),
      keyGenerator: (req) =>
        `${keyPrefix}:${String((req.body as { email?: unknown } | undefined)?.email ?? '')
          .trim()
          .toLowerCase()}`,
    }),
  ];
}

const LOGIN_WINDOW_MS = 15 * 60_000;
/**
 * Sign-in limits. Only failed attempts count, so a team signing in from one office is not locked out;
 * the per-IP limit is looser because many people may share one address.
 */
export const loginRateLimits = () =>
  perIpAndEmail({
    windowMs: LOGIN_WINDOW_MS,
    limits: LOGIN_LIMITS,
    keyPrefix: 'email',
    storePrefix: 'login',
    skipSuccessfulRequests: true,
    error: () =>
      new HttpError(
        429,
        'too_many_attempts',
        `Too many failed sign-in attempts. Wait ${LOGIN_WINDOW_MS / 60_000} minutes and try again, or set a new password.`,
        {
          retryAfterSeconds: LOGIN_WINDOW_MS / 1000,
        },
      ),
  });

const RESET_WINDOW_MS = 60 * 60_000;
/**
 * Password-reset request limits. Every request counts (a known address gets a mail each time), and the same limit
 * applies to any address, so the answer still says nothing about which addresses have accounts.
 */
export const resetRequestRateLimits = () =>
  perIpAndEmail({
    windowMs: RESET_WINDOW_MS,
    limits: RESET_LIMITS,
    keyPrefix: 'reset',
    storePrefix: 'reset',
    error: () =>
      new HttpError(
        429,
        'too_many_requests',
        `Too many password-reset requests. Wait ${RESET_WINDOW_MS / 60_000} minutes and try again, or ask an administrator.`,
        {
          retryAfterSeconds: RESET_WINDOW_MS / 1000,
        },
      ),
  });

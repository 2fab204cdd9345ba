import type { Request, RequestHandler } from 'express';
import type { User } from '../models/index.ts';
import { abilities, type Actor } from '../policies/index.ts';
import { unauthorized } from './errors.ts';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    // passport's req.user is our User model.
    interface User {
      id: number;
    }
  }
}

export const currentUser = (req: Request): User | null => (req.user as User | undefined) ?? null;
export const actorOf = (req: Request): Actor => {
  const u = currentUser(req);
  return u ? { id: u.id, role: u.role } : null;
};

/** 401 for a signed-out request on a protected route. */
export const requireUser: RequestHandler = (req, _res, next) => (currentUser(req) ? next() : next(unauthorized()));

export { abilities };

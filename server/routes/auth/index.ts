import { Router, type NextFunction, type Request, type Response } from 'express';
import { loginSchema, type ResetLink, type Session } from '../../../shared/schemas/auth.ts';
import { resetPasswordSchema, resetRequestSchema, tokenParams } from '../../../shared/schemas/team.ts';
import { ACTIONS } from '../../../shared/abilities.ts';
import { passport } from '../../auth/passport.ts';
import { loginRateLimits, resetRequestRateLimits } from '../../auth/rate-limit.ts';
import { abilities, actorOf } from '../../http/auth.ts';
import { isProduction } from '../../env.ts';
import type { Actor } from '../../policies/index.ts';
import { HttpError, unauthorized } from '../../http/errors.ts';
import { parseBody, parseParams } from '../../http/validate.ts';
import { sequelize, type User } from '../../models/index.ts';
import { presentUser } from '../../presenters/user.ts';
import { liveResetToken, requestPasswordReset, resetPassword } from '../../services/password-reset.ts';

// The local outbox route does not exist in production, so nobody is offered it there.
const sessionAbilities = (actor: Actor) => ({
  ...abilities(actor, ACTIONS),
  ...(isProduction ? { 'outbox:read': false } : {}),
});

/** The answer of /me and /login: who is signed in and what they may do. */
const session = (req: Request, user: User): Session => ({
  user: presentUser(user),
  abilities: sessionAbilities(actorOf(req)),
});

const badCredentials = () =>
  new HttpError(401, 'bad_credentials', 'That e-mail and password do not match an active account.');

/** Sign-in, sign-out, the current user and password reset. Rate-limit counters live in MariaDB, shared by every app server. */
export function authRouter() {
  const router = Router();

  router.post('/login', ...loginRateLimits(), (req: Request, res: Response, next: NextFunction) => {
    req.body = parseBody(loginSchema, req);
    passport.authenticate('local', (err: unknown, user: User | false) => {
      if (err) return next(err);
      if (!user) return next(badCredentials());
      // passport 0.7 regenerates the session id on login (no fixation).
      req.logIn(user, (e) => (e ? next(e) : res.json(session(req, user))));
    })(req, res, next);
  });

  router.post('/logout', (req, res, next) => {
    req.logout((err) => {
      if (err) return next(err);
      req.session.destroy((e) => {
        if (e) return next(e);
        res.clearCookie('tinctoria.sid');
        res.status(204).end();
      });
    });
  });

  router.get('/me', (req, res, next) => {
    if (!req.user) return next(unauthorized());
    res.json(session(req, req.user as User));
  });

  // 202 whatever the address; the lookup and the mail happen after the answer. Limited, as each may send a mail.
  router.post('/password-reset', ...resetRequestRateLimits(), (req, res) => {
    const { email } = parseBody(resetRequestSchema, req);
    res
      .status(202)
      .json({ message: 'If that address belongs to an account, a link to set a new password is on its way.' });
    requestPasswordReset(email).catch((err) => req.log.error({ err }, '[mail] password reset not sent'));
  });

  // Checked when the page opens, so a used or expired link says so before anyone types a password.
  router.get('/password-reset/:token', async (req, res) => {
    const { token } = parseParams(tokenParams, req);
    const record = await liveResetToken(token);
    res.json({ expiresAt: record.expiresAt.toISOString() } satisfies ResetLink);
  });

  router.post('/password-reset/:token', async (req, res) => {
    const { token } = parseParams(tokenParams, req);
    const input = parseBody(resetPasswordSchema, req);
    await sequelize.transaction((transaction) => resetPassword({ transaction, input: { ...input, token } }));
    res.status(204).end();
  });

  return router;
}

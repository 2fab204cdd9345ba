import { Router, type NextFunction, type Request, type Response } from 'express';
import { loginSchema } from '../../../shared/schemas/auth.ts';
import { passport } from '../../auth/passport.ts';
import { abilities, actorOf } from '../../http/auth.ts';
import { HttpError, unauthorized } from '../../http/errors.ts';
import { parseBody } from '../../http/validate.ts';
import type { User } from '../../models/index.ts';
import { presentUser } from '../../presenters/user.ts';
import { ACTIONS } from '../../../shared/abilities.ts';

export const authRouter = Router();

const badCredentials = () => new HttpError(401, 'bad_credentials', 'That e-mail and password do not match an active account.');

authRouter.post('/login', (req: Request, res: Response, next: NextFunction) => {
  req.body = parseBody(loginSchema, req);
  passport.authenticate('local', (err: unknown, user: User | false) => {
    if (err) return next(err);
    if (!user) return next(badCredentials());
    // passport 0.7 regenerates the session id on login (no fixation).
    req.logIn(user, (e) => (e ? next(e) : res.json({ user: presentUser(user), abilities: abilities(actorOf(req), ACTIONS) })));
  })(req, res, next);
});

authRouter.post('/logout', (req, res, next) => {
  req.logout((err) => {
    if (err) return next(err);
    req.session.destroy((e) => {
      if (e) return next(e);
      res.clearCookie('tinctoria.sid');
      res.status(204).end();
    });
  });
});

authRouter.get('/me', (req, res, next) => {
  if (!req.user) return next(unauthorized());
  res.json({ user: presentUser(req.user as User), abilities: abilities(actorOf(req), ACTIONS) });
});

import type { IncomingMessage } from 'node:http';
import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { User } from '../models/index.ts';
import { hashPassword, verifyPassword } from './passwords.ts';
import { sessionUserOf } from './session.ts';

// Verify against a real hash when the e-mail is unknown, so both failures take as long.
let dummyHash: Promise<string> | undefined;
const dummy = () => (dummyHash ??= hashPassword('no such account, no such password'));

passport.use(
  new LocalStrategy({ usernameField: 'email', passwordField: 'password' }, async (email, password, done) => {
    try {
      const user = await User.findOne({ where: { email: email.trim().toLowerCase() } });
      const ok = await verifyPassword(user?.passwordHash ?? (await dummy()), password);
      if (!user || !user.passwordHash || !ok || !user.active) return done(null, false);
      return done(null, user);
    } catch (err) {
      return done(err);
    }
  }),
);

passport.serializeUser((user, done) => done(null, (user as User).id));
// The session store read the user with the session (one round trip, `SessionStore.get`); the row becomes a model
// instance without another query. Only when it did not (or the ids disagree) is the user read here.
passport.deserializeUser(
  async (req: IncomingMessage, id: number, done: (err: unknown, user?: User | false) => void) => {
    try {
      const row = sessionUserOf(req);
      const user =
        row !== undefined && (row === null || row.id === id)
          ? row &&
            User.build({ ...row, active: Boolean(row.active) } as User['_creationAttributes'], {
              isNewRecord: false,
              raw: true,
            })
          : await User.findByPk(id);
      // A deactivated user's session no longer signs anyone in.
      done(null, user && user.active ? user : false);
    } catch (err) {
      done(err);
    }
  },
);

export { passport };

import passport from 'passport';
import { Strategy as LocalStrategy } from 'passport-local';
import { User } from '../models/index.ts';
import { hashPassword, verifyPassword } from './passwords.ts';

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
passport.deserializeUser(async (id: number, done) => {
  try {
    const user = await User.findByPk(id);
    // A deactivated user's session no longer signs anyone in.
    done(null, user && user.active ? user : false);
  } catch (err) {
    done(err);
  }
});

export { passport };

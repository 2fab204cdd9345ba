import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import session from 'express-session';
import connectSessionSequelize from 'connect-session-sequelize';
import { QueryTypes } from 'sequelize';
import { env, isProduction } from '../env.ts';
import { sequelize } from '../models/index.ts';

const SequelizeStore = connectSessionSequelize(session.Store);

/**
 * The store's read, on every signed-in request: one plain query instead of a model instance per request
 * (connect-session-sequelize's `findOne`), and a session past its expiry is no session at all (the store's own read
 * does not look at `expires`, and its sweep is off: checkExpirationInterval 0), so a copied cookie does not outlive
 * the 14 days a browser keeps it.
 */
class SessionStore extends SequelizeStore {
  get(sid: string, fn: (err: unknown, session?: session.SessionData | null) => void) {
    sequelize
      .query<{ data: string | null; expires: Date | string | null }>(
        'SELECT data, expires FROM sessions WHERE sid = ?',
        { replacements: [sid], type: QueryTypes.SELECT },
      )
      .then(([row]) => {
        const live = row?.data && (row.expires === null || new Date(row.expires).getTime() > Date.now());
        fn(null, live ? (JSON.parse(row.data!) as session.SessionData) : null);
      }, fn);
  }
}

/** Outside production a generated secret is kept in the runtime folder, so sessions survive restarts. */
function sessionSecret(): string {
  if (env.SESSION_SECRET) return env.SESSION_SECRET;
  const file = path.join(env.DATA_DIR, 'session-secret');
  if (!existsSync(file)) {
    mkdirSync(env.DATA_DIR, { recursive: true });
    writeFileSync(file, randomBytes(32).toString('hex'), { mode: 0o600 });
  }
  return readFileSync(file, 'utf8').trim();
}

export const SESSION_COOKIE = 'tinctoria.sid';

export function sessionMiddleware() {
  // disableTouch is an option of connect-session-sequelize 7 that its type definitions leave out.
  const options: ConstructorParameters<typeof SequelizeStore>[0] & { disableTouch: boolean } = {
    db: sequelize,
    table: 'Session',
    checkExpirationInterval: 0,
    // No UPDATE of the session row on every signed-in request (the store's touch()): with rolling off the browser's
    // cookie keeps the expiry it got at sign-in, so moving the row's `expires` bought nothing, and under load every
    // request of one user queued on that one row's lock and on the connection pool (issue 16, point 7).
    disableTouch: true,
    expiration: 14 * 24 * 60 * 60 * 1000,
    extendDefaultFields: (defaults: { data: string; expires: Date }, sess: { passport?: { user?: number } }) => ({
      data: defaults.data,
      expires: defaults.expires,
      userId: sess.passport?.user ?? null,
    }),
  };
  const store = new SessionStore(options);
  return session({
    name: SESSION_COOKIE,
    secret: sessionSecret(),
    store,
    resave: false,
    saveUninitialized: false,
    // Not rolling: a response to a request still in flight during a new sign-in would put the old, destroyed session id back in the cookie.
    rolling: false,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: isProduction ? 'auto' : false,
      maxAge: 14 * 24 * 60 * 60 * 1000,
    },
  });
}

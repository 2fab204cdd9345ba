import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import session from 'express-session';
import connectSessionSequelize from 'connect-session-sequelize';
import { QueryTypes } from 'sequelize';
import { env, isProduction } from '../env.ts';
import { sequelize } from '../models/index.ts';

const SequelizeStore = connectSessionSequelize(session.Store);

/** The user row read with the session (`SessionStore.get`), handed to passport's deserializer on the request. */
export const SESSION_USER = Symbol('tinctoria.sessionUser');

export interface SessionUserRow {
  id: number;
  email: string;
  name: string;
  role: string;
  passwordHash: string | null;
  active: number | boolean;
  createdAt: Date;
  updatedAt: Date;
}

type RequestWithSessionUser = Express.Request & { [SESSION_USER]?: SessionUserRow | null };

/**
 * The store's read, on every signed-in request: one plain query instead of a model instance per request
 * (connect-session-sequelize's `findOne`), and a session past its expiry is no session at all (the store's own read
 * does not look at `expires`, and its sweep is off: checkExpirationInterval 0), so a copied cookie does not outlive
 * the 14 days a browser keeps it.
 *
 * The same query reads the session's user (LEFT JOIN on `sessions.userId`, which is written from the session's
 * `passport.user` whenever the session is saved), so a signed-in request costs one round trip to MariaDB before its
 * handler instead of two (issue 16, point 9). The row travels under a symbol on the session data (never enumerated,
 * never serialised back) to `createSession`, which puts it on the request for passport's deserializer
 * (`server/auth/passport.ts`); the deserializer still reads the user itself when the ids disagree or nothing came.
 */
class SessionStore extends SequelizeStore {
  get(sid: string, fn: (err: unknown, session?: session.SessionData | null) => void) {
    sequelize
      .query<{ data: string | null; expires: Date | string | null; userId: number | null } & Prefixed>(
        `SELECT s.data, s.expires, s.userId, ${USER_COLUMNS} FROM sessions s LEFT JOIN users u ON u.id = s.userId
         WHERE s.sid = ?`,
        { replacements: [sid], type: QueryTypes.SELECT },
      )
      .then(([row]) => {
        const live = row?.data && (row.expires === null || new Date(row.expires).getTime() > Date.now());
        if (!live) return fn(null, null);
        const data = JSON.parse(row.data!) as session.SessionData & { [SESSION_USER]?: SessionUserRow | null };
        Object.defineProperty(data, SESSION_USER, { value: userFromRow(row), enumerable: false });
        fn(null, data);
      }, fn);
  }

  createSession(req: Express.Request, data: session.SessionData) {
    const user = (data as { [SESSION_USER]?: SessionUserRow | null })[SESSION_USER];
    if (user !== undefined) (req as RequestWithSessionUser)[SESSION_USER] = user;
    return super.createSession(req as Parameters<session.Store['createSession']>[0], data);
  }
}

const USER_FIELDS = ['id', 'email', 'name', 'role', 'passwordHash', 'active', 'createdAt', 'updatedAt'] as const;
type Prefixed = { [K in (typeof USER_FIELDS)[number] as `u_${K}`]: unknown };
const USER_COLUMNS = USER_FIELDS.map((f) => `u.${f} AS u_${f}`).join(', ');

function userFromRow(row: Prefixed): SessionUserRow | null {
  if (row.u_id == null) return null;
  return Object.fromEntries(USER_FIELDS.map((f) => [f, row[`u_${f}`]])) as unknown as SessionUserRow;
}

/** The user read with this request's session, if the store read one (undefined: not read, null: no such user). */
export function sessionUserOf(req: object): SessionUserRow | null | undefined {
  return (req as RequestWithSessionUser)[SESSION_USER];
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

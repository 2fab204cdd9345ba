import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { LOGIN_LIMITS } from '../../server/auth/rate-limit.ts';
import { hashPassword } from '../../server/auth/passwords.ts';
import { Session, sequelize, User } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

afterAll(() => sequelize.close());

const login = (app: ReturnType<typeof createApp>, email: string, password: string, ip = '127.0.0.1') =>
  request(app).post('/api/auth/login').set('Origin', ORIGIN).set('X-Forwarded-For', ip).send({ email, password });

// The counters live in the shared test database (and outlive an app instance), so each test uses its own account and
// its own client address; a random one so a re-run on the same database within the window starts from nothing.
const unique = () => `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}`;
const randomIp = () => `10.${[0, 0, 0].map(() => Math.floor(Math.random() * 250) + 1).join('.')}`;
async function member(password: string) {
  const email = `limits-${unique()}@limits.test`;
  await User.create({ email, name: 'Orla Penn', role: 'researcher', passwordHash: await hashPassword(password) });
  return email;
}

describe('sign-in hardening', () => {
  it('limits failed sign-ins per e-mail: the 11th try in 15 minutes answers 429, even with the right password', async () => {
    // Failures are keyed by the forwarded address (trusted from loopback here), never by 127.0.0.1: the counters
    // are shared in MariaDB, and a test must not lock the loopback address out for every other test file.
    const app = createApp({ trustProxy: 'loopback' });
    const email = await member('the-right-password');
    const ip = randomIp();
    for (let i = 0; i < LOGIN_LIMITS.perEmail; i++) await login(app, email, 'wrong password', ip).expect(401);
    const res = await login(app, email, 'the-right-password', ip).expect(429);
    expect(res.body.error).toMatchObject({
      code: 'too_many_attempts',
      message: expect.stringMatching(/Too many failed sign-in attempts/),
    });
    expect(res.headers['ratelimit-policy']).toBeDefined();
    // Another address from the same IP is not affected; a fresh app (another server, or a restart) on the same
    // database still refuses, from any IP address: the counters are in MariaDB, not in the process.
    await login(app, 'curator@demo.test', 'tinctoria-demo', ip).expect(200);
    await login(createApp({ trustProxy: 'loopback' }), email, 'the-right-password', randomIp()).expect(429);
  });

  it('limits failed sign-ins per IP address across e-mails; successful sign-ins do not count', async () => {
    // Behind a trusted proxy (here: loopback), the client address comes from X-Forwarded-For.
    const app = createApp({ trustProxy: 'loopback' });
    const [ip, otherIp] = [randomIp(), randomIp()];
    for (let i = 0; i < 5; i++) await login(app, 'dyer@demo.test', 'tinctoria-demo', ip).expect(200);
    for (let i = 0; i < LOGIN_LIMITS.perIp; i++)
      await login(app, `spray-${i}-${unique()}@nowhere.test`, 'guess', ip).expect(401);
    await login(app, 'dyer@demo.test', 'tinctoria-demo', ip).expect(429);
    await login(createApp({ trustProxy: 'loopback' }), 'dyer@demo.test', 'tinctoria-demo', ip).expect(429);
    await login(app, 'dyer@demo.test', 'tinctoria-demo', otherIp).expect(200);
  });

  it('refuses state-changing requests with a foreign or missing Origin on every new route', async () => {
    const app = createApp();
    const admin = await signedInAgent(app, 'admin');
    for (const [method, url] of [
      ['post', '/api/invitations'],
      ['patch', '/api/team/1'],
      ['post', '/api/auth/password-reset'],
      ['post', `/api/invitations/${'A'.repeat(43)}/accept`],
    ] as const) {
      const foreign = await admin[method](url).set('Origin', 'http://evil.example').send({});
      expect(foreign.status, `${method} ${url}`).toBe(403);
      expect(foreign.body.error.code).toBe('bad_origin');
      expect((await admin[method](url).send({})).status, `${method} ${url} without Origin`).toBe(403);
    }
  });

  it('sends a Content-Security-Policy of self only', async () => {
    const res = await request(createApp()).get('/api/health');
    const csp = Object.fromEntries(
      String(res.headers['content-security-policy'])
        .split(';')
        .map((d) => d.trim().split(/\s+/))
        .map(([k, ...v]) => [k, v]),
    );
    expect(csp['default-src']).toEqual(["'self'"]);
    expect(csp['script-src']).toEqual(["'self'"]);
    expect(csp['connect-src']).toEqual(["'self'"]);
    expect(csp['font-src']).toEqual(["'self'"]);
    expect(csp['frame-ancestors']).toEqual(["'self'"]);
    expect(csp['object-src']).toEqual(["'none'"]);
  });

  it('keeps a session across a server restart: a cookie from one app instance works on another over the same database', async () => {
    const first = createApp();
    const res = await login(first, 'curator@demo.test', 'tinctoria-demo').expect(200);
    const cookie = res.headers['set-cookie'][0].split(';')[0];
    const second = createApp();
    const me = await request(second).get('/api/auth/me').set('Cookie', cookie).expect(200);
    expect(me.body.user.email).toBe('curator@demo.test');
  });

  it('refuses a session past its expiry on the server, whatever the cookie says', async () => {
    const app = createApp();
    const res = await login(app, 'researcher@demo.test', 'tinctoria-demo').expect(200);
    const cookie = res.headers['set-cookie'][0].split(';')[0];
    await request(app).get('/api/auth/me').set('Cookie', cookie).expect(200);
    const sid = decodeURIComponent(cookie.split('=')[1]).slice(2).split('.')[0];
    const [changed] = await Session.update({ expires: new Date(Date.now() - 1000) }, { where: { sid } });
    expect(changed).toBe(1);
    await request(app).get('/api/auth/me').set('Cookie', cookie).expect(401);
  });

  it('reads the session and its user in one query, and still sees a role change or deactivation on the next request', async () => {
    const app = createApp();
    const email = await member('a-long-enough-password');
    const res = await login(app, email, 'a-long-enough-password', randomIp()).expect(200);
    const cookie = res.headers['set-cookie'][0].split(';')[0];
    await request(app).get('/api/auth/me').set('Cookie', cookie).expect(200);

    // Every query this process sends while one signed-in request is answered (the route reads nothing else).
    const seen: string[] = [];
    sequelize.addHook('afterQuery', 'count-session-reads', (_options, query) => {
      seen.push(String((query as { sql?: string }).sql ?? ''));
    });
    try {
      const me = await request(app).get('/api/auth/me').set('Cookie', cookie).expect(200);
      expect(me.body.user.email).toBe(email);
    } finally {
      sequelize.removeHook('afterQuery', 'count-session-reads');
    }
    const touching = seen.filter((sql) => /\b(sessions|users)\b/.test(sql));
    expect(touching).toHaveLength(1);
    expect(touching[0]).toMatch(/FROM sessions s LEFT JOIN users u/);

    // The user is read with every request, so a role change made anywhere shows at once ...
    await User.update({ role: 'curator' }, { where: { email } });
    const after = await request(app).get('/api/auth/me').set('Cookie', cookie).expect(200);
    expect(after.body.user.role).toBe('curator');
    // ... and a deactivated user (sessions left in place here, by raw SQL) signs nobody in.
    await sequelize.query('UPDATE users SET active = 0 WHERE email = ?', { replacements: [email] });
    await request(app).get('/api/auth/me').set('Cookie', cookie).expect(401);
  });
});

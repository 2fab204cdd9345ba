import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { sequelize } from '../../server/models/index.ts';

const app = createApp();
const ORIGIN = 'http://127.0.0.1:3000';
afterAll(() => sequelize.close());

describe('sign-in core', () => {
  it('signs a demo account in and out, with the session in MariaDB', async () => {
    const agent = request.agent(app);
    await agent.get('/api/auth/me').expect(401);
    const login = await agent
      .post('/api/auth/login')
      .set('Origin', ORIGIN)
      .send({ email: 'Curator@demo.test', password: 'tinctoria-demo' })
      .expect(200);
    expect(login.body.user).toEqual({
      id: expect.any(Number),
      email: 'curator@demo.test',
      name: 'Ysolde Marrin',
      role: 'curator',
    });
    expect(login.body.abilities['piece:create']).toBe(true);
    expect(login.body.abilities['team:manage']).toBe(false);
    const cookie = login.headers['set-cookie'][0];
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    const [rows] = await sequelize.query('SELECT COUNT(*) AS n FROM sessions WHERE userId = ?', {
      replacements: [login.body.user.id],
    });
    expect(Number((rows as Array<{ n: number }>)[0].n)).toBeGreaterThan(0);
    await agent.get('/api/auth/me').expect(200);
    await agent.post('/api/auth/logout').set('Origin', ORIGIN).expect(204);
    await agent.get('/api/auth/me').expect(401);
  });

  it('answers a wrong password and an unknown e-mail with the same 401', async () => {
    const a = await request(app)
      .post('/api/auth/login')
      .set('Origin', ORIGIN)
      .send({ email: 'curator@demo.test', password: 'wrong' })
      .expect(401);
    const b = await request(app)
      .post('/api/auth/login')
      .set('Origin', ORIGIN)
      .send({ email: 'nobody@demo.test', password: 'wrong' })
      .expect(401);
    // Word for word the same, so the answer never tells which e-mail addresses have accounts (the request id differs).
    const { requestId: _a, ...sameA } = a.body.error;
    const { requestId: _b, ...sameB } = b.body.error;
    expect(sameA).toEqual(sameB);
    expect(a.body.error.code).toBe('bad_credentials');
  });

  it('validates the body with per-field details', async () => {
    const res = await request(app)
      .post('/api/auth/login')
      .set('Origin', ORIGIN)
      .send({ email: 'not-an-email' })
      .expect(400);
    expect(Object.keys(res.body.error.details.fields)).toEqual(expect.arrayContaining(['email', 'password']));
  });

  it('refuses a state-changing request from a foreign origin or with no origin', async () => {
    await request(app)
      .post('/api/auth/login')
      .set('Origin', 'http://evil.example')
      .send({ email: 'curator@demo.test', password: 'tinctoria-demo' })
      .expect(403);
    const res = await request(app)
      .post('/api/auth/login')
      .send({ email: 'curator@demo.test', password: 'tinctoria-demo' })
      .expect(403);
    expect(res.body.error.code).toBe('bad_origin');
  });
});

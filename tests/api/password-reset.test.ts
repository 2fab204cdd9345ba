import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { hashPassword } from '../../server/auth/passwords.ts';
import { hashToken } from '../../server/auth/tokens.ts';
import { AuthToken, User, sequelize } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { newestMailTo, startTestMail, tokenFrom, waitForMail } from '../support/mail.ts';

const app = createApp();
let mail: Awaited<ReturnType<typeof startTestMail>>;
beforeAll(async () => {
  mail = await startTestMail();
});
afterAll(async () => {
  await mail.close();
  await sequelize.close();
});

async function member(password = 'the-old-password') {
  const email = `reset-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}@reset.test`;
  await User.create({ email, name: 'Pell Varrow', role: 'researcher', passwordHash: await hashPassword(password) });
  return email;
}

describe('password reset by e-mail', () => {
  it('answers 202 for a known and an unknown address alike, and mails only the known one', async () => {
    const email = await member();
    const known = await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email }).expect(202);
    const unknown = await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: 'nobody-here@reset.test' }).expect(202);
    expect(known.body).toEqual(unknown.body);
    const message = await waitForMail(email);
    expect(message.subject).toMatch(/Tinctoria/);
    expect(message.html).toMatch(/reset-password\//);
    expect(await newestMailTo('nobody-here@reset.test')).toBeNull();
    await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email: 'not an address' }).expect(400);
  });

  it('sets a new password once, ends the old sessions, and refuses the link a second time', async () => {
    const email = await member();
    const old = await signedInAgent(app, { email, password: 'the-old-password' });
    await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email }).expect(202);
    const token = tokenFrom(await waitForMail(email), 'reset-password');

    await request(app).post(`/api/auth/password-reset/${token}`).set('Origin', ORIGIN).send({ password: 'short' }).expect(400);
    await request(app).post(`/api/auth/password-reset/${token}`).set('Origin', ORIGIN).send({ password: 'the-new-password' }).expect(204);
    await old.get('/api/auth/me').expect(401);
    await request(app).post('/api/auth/login').set('Origin', ORIGIN).send({ email, password: 'the-old-password' }).expect(401);
    await signedInAgent(app, { email, password: 'the-new-password' });

    const reused = await request(app).post(`/api/auth/password-reset/${token}`).set('Origin', ORIGIN).send({ password: 'a-third-password' }).expect(410);
    expect(reused.body.error.code).toBe('token_used');
  });

  it('refuses an expired link', async () => {
    const email = await member();
    await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email }).expect(202);
    const token = tokenFrom(await waitForMail(email), 'reset-password');
    const stored = await AuthToken.findOne({ where: { tokenHash: hashToken(token) } });
    // Two hours (see TOKEN_TTL_MS).
    expect(Math.abs(stored!.expiresAt.getTime() - stored!.createdAt.getTime() - 2 * 3600_000)).toBeLessThan(1000);
    await stored!.update({ expiresAt: new Date(Date.now() - 1000) });
    const res = await request(app).post(`/api/auth/password-reset/${token}`).set('Origin', ORIGIN).send({ password: 'the-new-password' }).expect(410);
    expect(res.body.error.code).toBe('token_expired');
    await signedInAgent(app, { email, password: 'the-old-password' });
  });

  it('an invitation token does not reset a password', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = `swap-${Date.now().toString(36)}@reset.test`;
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'dyer' }).expect(201);
    const token = tokenFrom(await waitForMail(email), 'join');
    await request(app).post(`/api/auth/password-reset/${token}`).set('Origin', ORIGIN).send({ password: 'the-new-password' }).expect(404);
  });
});

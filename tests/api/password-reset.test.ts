import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { hashPassword } from '../../server/auth/passwords.ts';
import { RESET_LIMITS } from '../../server/auth/rate-limit.ts';
import { hashToken } from '../../server/auth/tokens.ts';
import { mailDir } from '../../server/mail/index.ts';
import { mailFiles, readMail } from '../../server/mail/outbox.ts';
import { AuthToken, User } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { newestMailTo, useTestMail, tokenFrom, waitForMail } from '../support/mail.ts';

const app = createApp();
useTestMail();

async function member(password = 'the-old-password') {
  const email = `reset-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}@reset.test`;
  await User.create({ email, name: 'Pell Varrow', role: 'researcher', passwordHash: await hashPassword(password) });
  return email;
}

async function mailsTo(to: string) {
  let n = 0;
  for (const f of await mailFiles(mailDir())) if ((await readMail(mailDir(), f)).to.includes(to.toLowerCase())) n++;
  return n;
}

describe('password reset by e-mail', () => {
  it('limits requests per address and per IP address, the same for known and unknown addresses', async () => {
    // The counters are in the shared database: a client address of its own (random, so a re-run within the hour
    // starts from nothing), so the other tests here and in other files are not affected.
    const limited = createApp({ trustProxy: 'loopback' });
    const ip = `10.${[0, 0, 0].map(() => Math.floor(Math.random() * 250) + 1).join('.')}`;
    const ask = (email: string) =>
      request(limited)
        .post('/api/auth/password-reset')
        .set('Origin', ORIGIN)
        .set('X-Forwarded-For', ip)
        .send({ email });
    const email = await member();
    for (let i = 0; i < RESET_LIMITS.perEmail; i++) await ask(i % 2 ? email : email.toUpperCase()).expect(202);
    const refused = await ask(email).expect(429);
    expect(refused.body.error).toMatchObject({ code: 'too_many_requests', details: { retryAfterSeconds: 3600 } });
    expect(refused.body.error.message).toMatch(/Wait 60 minutes/);
    // An unknown address is limited the same way, so the answers still say nothing about which addresses exist.
    const unknown = `nobody-${Date.now().toString(36)}@reset.test`;
    for (let i = 0; i < RESET_LIMITS.perEmail; i++) await ask(unknown).expect(202);
    await ask(unknown).expect(429);
    // Other addresses get through until the per-IP limit (the refused requests counted too).
    const used = 2 * (RESET_LIMITS.perEmail + 1);
    for (let i = used; i < RESET_LIMITS.perIp; i++)
      await ask(`other-${i}-${Date.now().toString(36)}@reset.test`).expect(202);
    await ask(`one-more-${Date.now().toString(36)}@reset.test`).expect(429);
    // The known address got one mail per accepted request, none for the refused one.
    await waitForMail(email);
    for (let i = 0; i < 50 && (await mailsTo(email)) < RESET_LIMITS.perEmail; i++)
      await new Promise((r) => setTimeout(r, 100));
    await new Promise((r) => setTimeout(r, 300));
    expect(await mailsTo(email)).toBe(RESET_LIMITS.perEmail);
  });

  it('answers 202 for a known and an unknown address alike, and mails only the known one', async () => {
    const email = await member();
    const known = await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email }).expect(202);
    const unknown = await request(app)
      .post('/api/auth/password-reset')
      .set('Origin', ORIGIN)
      .send({ email: 'nobody-here@reset.test' })
      .expect(202);
    expect(known.body).toEqual(unknown.body);
    const message = await waitForMail(email);
    expect(message.subject).toMatch(/Tinctoria/);
    expect(message.html).toMatch(/reset-password\//);
    expect(await newestMailTo('nobody-here@reset.test')).toBeNull();
    await request(app)
      .post('/api/auth/password-reset')
      .set('Origin', ORIGIN)
      .send({ email: 'not an address' })
      .expect(400);
  });

  it('sets a new password once, ends the old sessions, and refuses the link a second time', async () => {
    const email = await member();
    const old = await signedInAgent(app, { email, password: 'the-old-password' });
    await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email }).expect(202);
    const token = tokenFrom(await waitForMail(email), 'reset-password');

    await request(app)
      .post(`/api/auth/password-reset/${token}`)
      .set('Origin', ORIGIN)
      .send({ password: 'short' })
      .expect(400);
    // The page checks the link when it opens.
    await request(app).get(`/api/auth/password-reset/${token}`).expect(200);
    await request(app)
      .post(`/api/auth/password-reset/${token}`)
      .set('Origin', ORIGIN)
      .send({ password: 'the-new-password' })
      .expect(204);
    await old.get('/api/auth/me').expect(401);
    await request(app)
      .post('/api/auth/login')
      .set('Origin', ORIGIN)
      .send({ email, password: 'the-old-password' })
      .expect(401);
    await signedInAgent(app, { email, password: 'the-new-password' });

    const reused = await request(app)
      .post(`/api/auth/password-reset/${token}`)
      .set('Origin', ORIGIN)
      .send({ password: 'a-third-password' })
      .expect(410);
    expect(reused.body.error.code).toBe('token_used');
    const opened = await request(app).get(`/api/auth/password-reset/${token}`).expect(410);
    expect(opened.body.error.message).toBe(
      'This link has already been used (or a newer one was sent). Sign in with your password, or ask for a new link.',
    );
    const unknown = await request(app)
      .get(`/api/auth/password-reset/${'C'.repeat(43)}`)
      .expect(404);
    expect(unknown.body.error.message).toMatch(/^This link is not valid/);
  });

  it('refuses an expired link', async () => {
    const email = await member();
    await request(app).post('/api/auth/password-reset').set('Origin', ORIGIN).send({ email }).expect(202);
    const token = tokenFrom(await waitForMail(email), 'reset-password');
    const stored = await AuthToken.findOne({ where: { tokenHash: hashToken(token) } });
    // Two hours (see TOKEN_TTL_MS).
    expect(Math.abs(stored!.expiresAt.getTime() - stored!.createdAt.getTime() - 2 * 3600_000)).toBeLessThan(1000);
    await stored!.update({ expiresAt: new Date(Date.now() - 1000) });
    const res = await request(app)
      .post(`/api/auth/password-reset/${token}`)
      .set('Origin', ORIGIN)
      .send({ password: 'the-new-password' })
      .expect(410);
    expect(res.body.error.code).toBe('token_expired');
    expect(res.body.error.message).toBe('This link has expired: reset links work for 2 hours. Ask for a new one.');
    await signedInAgent(app, { email, password: 'the-old-password' });
  });

  it('an invitation token does not reset a password', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = `swap-${Date.now().toString(36)}@reset.test`;
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'dyer' }).expect(201);
    const token = tokenFrom(await waitForMail(email), 'join');
    await request(app)
      .post(`/api/auth/password-reset/${token}`)
      .set('Origin', ORIGIN)
      .send({ password: 'the-new-password' })
      .expect(404);
  });
});

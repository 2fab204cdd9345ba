import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { hashToken } from '../../server/auth/tokens.ts';
import { AuthToken, User } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { useTestMail, tokenFrom, waitForMail } from '../support/mail.ts';

const app = createApp();
useTestMail();

const unique = (what: string) => `${what}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}@invite.test`;

describe('invitations through the local mail catcher', () => {
  it('invites by e-mail, the link sets name and password, and the new member can sign in', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = unique('dyer');
    const res = await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'dyer' }).expect(201);
    expect(res.body.invitation).toMatchObject({ email, role: 'dyer' });
    // 7 days, to the minute.
    expect(Math.abs(Date.parse(res.body.invitation.expiresAt) - Date.now() - 7 * 24 * 3600_000)).toBeLessThan(60_000);

    const message = await waitForMail(email);
    expect(message.subject).toMatch(/Tinctoria/);
    expect(message.text).toMatch(/Tinctoria/);
    expect(message.html).toMatch(/<a href="http[^"]+\/join\//);
    expect(message.text).toMatch(/Jory Fenmarch/);
    const token = tokenFrom(message, 'join');

    // Only the hash is stored.
    const stored = await AuthToken.findOne({ where: { email, purpose: 'invitation' } });
    expect(stored?.tokenHash).toBe(hashToken(token));
    expect(stored?.tokenHash).not.toContain(token);

    await request(app).get(`/api/invitations/${token}`).expect(200, { invitation: res.body.invitation });
    const visitor = request.agent(app);
    const accepted = await visitor.post(`/api/invitations/${token}/accept`).set('Origin', ORIGIN).send({ name: 'Wren Tallowby', password: 'a-long-new-password' }).expect(201);
    expect(accepted.body.user).toMatchObject({ email, name: 'Wren Tallowby', role: 'dyer' });
    await visitor.get('/api/auth/me').expect(200);

    const newcomer = await signedInAgent(app, { email, password: 'a-long-new-password' });
    const me = await newcomer.get('/api/auth/me').expect(200);
    expect(me.body.user.role).toBe('dyer');
    expect(me.body.abilities['trial:create']).toBe(true);
    expect(me.body.abilities['team:manage']).toBe(false);

    // Single use.
    const again = await request(app).post(`/api/invitations/${token}/accept`).set('Origin', ORIGIN).send({ name: 'Someone Else', password: 'another-long-password' }).expect(410);
    expect(again.body.error.code).toBe('token_used');
  });

  it('refuses an expired invitation and an unknown token', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = unique('late');
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'researcher' }).expect(201);
    const token = tokenFrom(await waitForMail(email), 'join');
    await AuthToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { tokenHash: hashToken(token) } });
    const res = await request(app).post(`/api/invitations/${token}/accept`).set('Origin', ORIGIN).send({ name: 'Late Comer', password: 'a-long-new-password' }).expect(410);
    expect(res.body.error.code).toBe('token_expired');
    expect(await User.findOne({ where: { email } })).toBeNull();

    const bogus = 'A'.repeat(43);
    await request(app).post(`/api/invitations/${bogus}/accept`).set('Origin', ORIGIN).send({ name: 'Nobody', password: 'a-long-new-password' }).expect(404);
    await request(app).get('/api/invitations/short').expect(400);
  });

  it('a second invitation to the same address spends the first; an existing member cannot be invited', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = unique('twice');
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'curator' }).expect(201);
    const first = tokenFrom(await waitForMail(email), 'join');
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'researcher' }).expect(201);
    await request(app).get(`/api/invitations/${first}`).expect(410);

    const taken = await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email: 'curator@demo.test', role: 'dyer' }).expect(409);
    expect(taken.body.error.details.fields.email).toBeDefined();
  });

  it('validates the acceptance form with per-field details', async () => {
    const res = await request(app).post(`/api/invitations/${'B'.repeat(43)}/accept`).set('Origin', ORIGIN).send({ name: '', password: 'short' }).expect(400);
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(['name', 'password']);
  });
});

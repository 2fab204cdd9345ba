import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { hashToken } from '../../server/auth/tokens.ts';
import { AuthToken, User } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { useTestMail, tokenFrom, waitForMail } from '../support/mail.ts';

const app = createApp();
useTestMail();

const unique = (what: string) =>
  `${what}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}@invite.test`;

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
    const accepted = await visitor
      .post(`/api/invitations/${token}/accept`)
      .set('Origin', ORIGIN)
      .send({ name: 'Wren Tallowby', password: 'a-long-new-password' })
      .expect(201);
    expect(accepted.body.user).toMatchObject({ email, name: 'Wren Tallowby', role: 'dyer' });
    await visitor.get('/api/auth/me').expect(200);

    const newcomer = await signedInAgent(app, { email, password: 'a-long-new-password' });
    const me = await newcomer.get('/api/auth/me').expect(200);
    expect(me.body.user.role).toBe('dyer');
    expect(me.body.abilities['trial:create']).toBe(true);
    expect(me.body.abilities['team:manage']).toBe(false);

    // Single use.
    const again = await request(app)
      .post(`/api/invitations/${token}/accept`)
      .set('Origin', ORIGIN)
      .send({ name: 'Someone Else', password: 'another-long-password' })
      .expect(410);
    expect(again.body.error.code).toBe('invitation_accepted');
    // The used link explains itself: the address is on the team, so sign in.
    const used = await request(app).get(`/api/invitations/${token}`).expect(410);
    expect(used.body.error).toMatchObject({ code: 'invitation_accepted', details: { reason: 'joined', email } });
    expect(used.body.error.message).toBe(
      `This invitation has already been used: ${email} is on the team. Sign in with that address.`,
    );
  });

  it('refuses an expired invitation and an unknown token', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = unique('late');
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'researcher' }).expect(201);
    const token = tokenFrom(await waitForMail(email), 'join');
    await AuthToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { tokenHash: hashToken(token) } });
    const res = await request(app)
      .post(`/api/invitations/${token}/accept`)
      .set('Origin', ORIGIN)
      .send({ name: 'Late Comer', password: 'a-long-new-password' })
      .expect(410);
    expect(res.body.error.code).toBe('invitation_expired');
    expect(res.body.error.message).toMatch(
      /^This invitation expired on \d{4}-\d{2}-\d{2}\. Ask Jory Fenmarch or another admin to send a new one\.$/,
    );
    expect(await User.findOne({ where: { email } })).toBeNull();

    const bogus = 'A'.repeat(43);
    await request(app)
      .post(`/api/invitations/${bogus}/accept`)
      .set('Origin', ORIGIN)
      .send({ name: 'Nobody', password: 'a-long-new-password' })
      .expect(404);
    await request(app).get('/api/invitations/short').expect(400);
  });

  it('a second invitation to the same address spends the first; an existing member cannot be invited', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = unique('twice');
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'curator' }).expect(201);
    const first = tokenFrom(await waitForMail(email), 'join');
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'researcher' }).expect(201);
    const replaced = await request(app).get(`/api/invitations/${first}`).expect(410);
    expect(replaced.body.error.message).toBe(
      'A newer invitation was sent to this address; use the link in the latest e-mail.',
    );

    const taken = await admin
      .post('/api/invitations')
      .set('Origin', ORIGIN)
      .send({ email: 'curator@demo.test', role: 'dyer' })
      .expect(409);
    expect(taken.body.error.details.fields.email).toBeDefined();
  });

  it('validates the acceptance form with per-field details', async () => {
    const res = await request(app)
      .post(`/api/invitations/${'B'.repeat(43)}/accept`)
      .set('Origin', ORIGIN)
      .send({ name: '', password: 'short' })
      .expect(400);
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(['name', 'password']);
  });
});

describe('pending invitations (admin)', () => {
  it('lists pending invitations with who sent them, resends with a new link, and withdraws', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = unique('pending');
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'curator' }).expect(201);
    const first = tokenFrom(await waitForMail(email), 'join');

    const list = await admin.get('/api/team/invitations').expect(200);
    const mine = list.body.items.filter((i: { email: string }) => i.email === email);
    expect(mine).toEqual([
      {
        id: expect.any(Number),
        email,
        role: 'curator',
        sentAt: expect.any(String),
        expiresAt: expect.any(String),
        expired: false,
        invitedBy: 'Jory Fenmarch',
      },
    ]);

    // Resend: a new mail with a new link; the old link now points to the latest e-mail.
    const resent = await admin.post(`/api/team/invitations/${mine[0].id}/resend`).set('Origin', ORIGIN).expect(201);
    expect(resent.body.invitation).toMatchObject({ email, role: 'curator', expired: false });
    let second = first;
    for (let i = 0; i < 50 && second === first; i++) second = tokenFrom(await waitForMail(email), 'join');
    expect(second).not.toBe(first);
    await request(app).get(`/api/invitations/${first}`).expect(410);
    await request(app).get(`/api/invitations/${second}`).expect(200);
    const after = (await admin.get('/api/team/invitations').expect(200)).body.items.filter(
      (i: { email: string }) => i.email === email,
    );
    expect(after.map((i: { id: number }) => i.id)).toEqual([resent.body.invitation.id]);

    // Withdraw: gone from the list; the link says it was withdrawn.
    await admin.delete(`/api/team/invitations/${resent.body.invitation.id}`).set('Origin', ORIGIN).expect(204);
    expect(
      (await admin.get('/api/team/invitations').expect(200)).body.items.some(
        (i: { email: string }) => i.email === email,
      ),
    ).toBe(false);
    const withdrawn = await request(app).get(`/api/invitations/${second}`).expect(410);
    expect(withdrawn.body.error).toMatchObject({
      code: 'invitation_withdrawn',
      message: 'This invitation was withdrawn. Ask Jory Fenmarch or another admin if you should still join.',
    });
    // A withdrawn or accepted invitation cannot be resent or withdrawn again.
    await admin.post(`/api/team/invitations/${resent.body.invitation.id}/resend`).set('Origin', ORIGIN).expect(404);
    await admin.delete(`/api/team/invitations/${resent.body.invitation.id}`).set('Origin', ORIGIN).expect(404);
  });

  it('lists an expired invitation as expired, and resending it gives a fresh week', async () => {
    const admin = await signedInAgent(app, 'admin');
    const email = unique('expired');
    await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email, role: 'dyer' }).expect(201);
    await AuthToken.update({ expiresAt: new Date(Date.now() - 1000) }, { where: { email, purpose: 'invitation' } });
    const [item] = (await admin.get('/api/team/invitations').expect(200)).body.items.filter(
      (i: { email: string }) => i.email === email,
    );
    expect(item.expired).toBe(true);
    const resent = await admin.post(`/api/team/invitations/${item.id}/resend`).set('Origin', ORIGIN).expect(201);
    expect(Math.abs(Date.parse(resent.body.invitation.expiresAt) - Date.now() - 7 * 24 * 3600_000)).toBeLessThan(
      60_000,
    );
  });
});

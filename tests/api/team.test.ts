import { afterAll, describe, expect, it } from 'vitest';
import { Op } from 'sequelize';
import { createApp } from '../../server/app.ts';
import { hashPassword } from '../../server/auth/passwords.ts';
import { Session, User, sequelize } from '../../server/models/index.ts';
import type { Role } from '../../shared/roles.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

const app = createApp();
afterAll(() => sequelize.close());

async function makeUser(role: Role, password = 'team-test-password') {
  const email = `${role}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 6)}@team.test`;
  const user = await User.create({ email, name: `Test ${role}`, role, passwordHash: await hashPassword(password) });
  return { user, creds: { email, password } };
}

describe('the team (admin)', () => {
  it('lists the team as a page of members without password hashes', async () => {
    const admin = await signedInAgent(app, 'admin');
    const res = await admin.get('/api/team?pageSize=200').expect(200);
    expect(res.body).toMatchObject({ page: 1, pageSize: 200, total: expect.any(Number) });
    const curator = res.body.items.find((m: { email: string }) => m.email === 'curator@demo.test');
    expect(Object.keys(curator).sort()).toEqual(['active', 'createdAt', 'email', 'id', 'name', 'role']);
  });

  it('changes a role, which applies at once to the signed-in member', async () => {
    const { user, creds } = await makeUser('researcher');
    const them = await signedInAgent(app, creds);
    expect((await them.get('/api/auth/me')).body.abilities['piece:create']).toBe(false);
    const admin = await signedInAgent(app, 'admin');
    const res = await admin.patch(`/api/team/${user.id}`).set('Origin', ORIGIN).send({ role: 'curator' }).expect(200);
    expect(res.body.member).toMatchObject({ id: user.id, role: 'curator', active: true });
    expect((await them.get('/api/auth/me')).body.abilities['piece:create']).toBe(true);
  });

  it('deactivation ends every session of that member at once and blocks sign-in', async () => {
    const { user, creds } = await makeUser('dyer');
    const a = await signedInAgent(app, creds);
    const b = await signedInAgent(app, creds);
    expect(await Session.count({ where: { userId: user.id } })).toBe(2);
    const admin = await signedInAgent(app, 'admin');
    await admin.patch(`/api/team/${user.id}`).set('Origin', ORIGIN).send({ active: false }).expect(200);
    expect(await Session.count({ where: { userId: user.id } })).toBe(0);
    await a.get('/api/auth/me').expect(401);
    await b.get('/api/auth/me').expect(401);
    await admin.post('/api/auth/login').set('Origin', ORIGIN).send(creds).expect(401);
    await admin.patch(`/api/team/${user.id}`).set('Origin', ORIGIN).send({ active: true }).expect(200);
    await signedInAgent(app, creds);
  });

  it('protects the last active admin and refuses self-deactivation with 409', async () => {
    const { user: soleAdmin, creds } = await makeUser('admin');
    const me = await signedInAgent(app, creds);
    const self = await me.patch(`/api/team/${soleAdmin.id}`).set('Origin', ORIGIN).send({ active: false }).expect(409);
    expect(self.body.error.details.reason).toBe('self');

    // Make this the only active admin for a moment; the others are switched back on in finally.
    const others = await User.findAll({ where: { role: 'admin', active: true, id: { [Op.ne]: soleAdmin.id } } });
    await User.update({ active: false }, { where: { id: others.map((o) => o.id) } });
    try {
      const demote = await me
        .patch(`/api/team/${soleAdmin.id}`)
        .set('Origin', ORIGIN)
        .send({ role: 'curator' })
        .expect(409);
      expect(demote.body.error.details.reason).toBe('last_admin');
    } finally {
      await User.update({ active: true }, { where: { id: others.map((o) => o.id) } });
    }
    // With another admin present, demoting oneself is allowed.
    await me.patch(`/api/team/${soleAdmin.id}`).set('Origin', ORIGIN).send({ role: 'curator' }).expect(200);
  });

  it('answers 404 for a missing member and 400 for an empty change', async () => {
    const admin = await signedInAgent(app, 'admin');
    await admin.patch('/api/team/999999999').set('Origin', ORIGIN).send({ role: 'dyer' }).expect(404);
    const res = await admin.patch('/api/team/1').set('Origin', ORIGIN).send({}).expect(400);
    expect(res.body.error.details.fields.role).toBeDefined();
  });
});

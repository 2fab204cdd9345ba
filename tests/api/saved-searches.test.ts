import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { AuditEvent, SavedSearch, User, sequelize } from '../../server/models/index.ts';
import { makeSavedSearch } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

const app = createApp();
afterAll(() => sequelize.close());
const run = `${Date.now() % 1_000_000}`;

describe('saved searches', () => {
  it('saves a search by name, tidied (no paging, no unknown keys), lists it and opens it again', async () => {
    const researcher = await signedInAgent(app, 'researcher');
    const res = await researcher
      .post('/api/saved-searches')
      .set('Origin', ORIGIN)
      .send({ name: `Madder reds ${run}`, query: '?q=madder&dyestuff=madder&fibre=cotton&page=3&bogus=1&hex=9b2f2f' })
      .expect(201);
    expect(res.body.savedSearch).toMatchObject({
      name: `Madder reds ${run}`,
      query: 'q=madder&dyestuff=madder&fibre=cotton&hex=9b2f2f',
      href: '/search?q=madder&dyestuff=madder&fibre=cotton&hex=9b2f2f',
    });
    const list = (await researcher.get('/api/saved-searches').expect(200)).body.items;
    expect(list.map((s: { name: string }) => s.name)).toContain(`Madder reds ${run}`);
    const audit = await AuditEvent.findOne({ where: { entity: 'saved-search', entityId: res.body.savedSearch.id } });
    expect(audit?.action).toBe('create');
  });

  it('refuses a second search of the same name for the same person (409), and an empty or wrong search (400)', async () => {
    const dyer = await signedInAgent(app, 'dyer');
    const body = { name: `Twice ${run}`, query: 'q=weld' };
    await dyer.post('/api/saved-searches').set('Origin', ORIGIN).send(body).expect(201);
    const again = await dyer.post('/api/saved-searches').set('Origin', ORIGIN).send(body).expect(409);
    expect(again.body.error.details.fields.name[0]).toMatch(/already have a search called/);
    const empty = await dyer
      .post('/api/saved-searches')
      .set('Origin', ORIGIN)
      .send({ name: 'x', query: 'page=2' })
      .expect(400);
    expect(empty.body.error.details.fields.query[0]).toMatch(/Choose words, a facet or a shade/);
    const wrong = await dyer
      .post('/api/saved-searches')
      .set('Origin', ORIGIN)
      .send({ name: 'x', query: 'hex=zzzzzz' })
      .expect(400);
    expect(wrong.body.error.details.fields.query[0]).toMatch(/six hex digits/);
    const noName = await dyer.post('/api/saved-searches').set('Origin', ORIGIN).send({ query: 'q=a' }).expect(400);
    expect(noName.body.error.details.fields.name[0]).toMatch(/Name the search/);
    // A malformed body is a 400 with a message, never a 5xx.
    await dyer.post('/api/saved-searches').set('Origin', ORIGIN).send({ name: 3, query: [] }).expect(400);
  });

  it('shows each person only their own, and deletes only their own (another’s answers 404)', async () => {
    const curator = await signedInAgent(app, 'curator');
    const other = await User.findOne({ where: { email: 'researcher@demo.test' }, rejectOnEmpty: true });
    const theirs = await makeSavedSearch({ userId: other.id, name: `Private ${run}` });
    const mine = (await curator.get('/api/saved-searches').expect(200)).body.items;
    expect(mine.some((s: { id: number }) => s.id === theirs.id)).toBe(false);
    await curator.delete(`/api/saved-searches/${theirs.id}`).set('Origin', ORIGIN).expect(404);
    const own = (
      await curator
        .post('/api/saved-searches')
        .set('Origin', ORIGIN)
        .send({ name: `Gone ${run}`, query: 'q=x' })
        .expect(201)
    ).body.savedSearch;
    await curator.delete(`/api/saved-searches/${own.id}`).set('Origin', ORIGIN).expect(204);
    expect(await SavedSearch.findByPk(own.id)).toBeNull();
    expect(await SavedSearch.findByPk(theirs.id)).not.toBeNull();
  });

  it('asks a visitor to sign in', async () => {
    await request(app).get('/api/saved-searches').expect(401);
    await request(app).post('/api/saved-searches').set('Origin', ORIGIN).send({ name: 'a', query: 'q=a' }).expect(401);
  });
});

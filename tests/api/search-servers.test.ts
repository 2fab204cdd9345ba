import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { installSearchHooks } from '../../server/search/hooks.ts';
import { ingested } from '../support/photos.ts';
import { clothJpeg } from '../support/images.ts';
import { freePort, startServerProcess, type ServerProcess } from '../support/server.ts';

// Issue 16: two app server processes on one database behave as one for search. Writes go through A (or through a
// script in this test process, as a CLI would write), reads through B, at once: B catches up with the search change
// log before it answers, so no waiting or polling here. Each server is a real `server/index.ts` process.
let a: ServerProcess;
let b: ServerProcess;

beforeAll(async () => {
  const [portA, portB] = [await freePort(), await freePort()];
  [a, b] = await Promise.all([startServerProcess(portA), startServerProcess(portB)]);
}, 180_000);

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await sequelize.close();
});

const unique = () => `zq${Date.now().toString(36)}${Math.random().toString(36).slice(2, 6)}`;

async function signIn(server: ServerProcess, role: 'curator' | 'researcher' | 'admin') {
  const agent = request.agent(server.url);
  await agent
    .post('/api/auth/login')
    .set('Origin', server.url)
    .send({ email: `${role}@demo.test`, password: 'tinctoria-demo' })
    .expect(200);
  return agent;
}

type Hit = { id: number; title: string };
const ids = (body: { items: Hit[] }) => body.items.map((i) => i.id);

describe('search on one server sees every write made through another', () => {
  it('text, facets, publication, unpublication, deletion and restore made on A answer at once on B', async () => {
    const curatorA = await signIn(a, 'curator');
    const researcherB = await signIn(b, 'researcher');
    const word = unique();
    const created = await curatorA
      .post('/api/pieces')
      .set('Origin', a.url)
      .send({
        accessionNumber: `SRV.${Date.now()}`,
        objectName: 'fragment',
        title: `Sprigged ${word} cotton`,
        dateEdtf: '1780',
        fibres: ['cotton'],
        techniques: ['block printing'],
        dyestuffs: [{ name: 'weld', evidence: 'attributed' }],
        historicalMordants: [{ name: 'potash alum', evidence: 'attributed' }],
      })
      .expect(201);
    const id = created.body.piece.id as number;

    // A new draft: found on B by a signed-in researcher, with its facets counted; not by a visitor.
    const found = await researcherB.get('/api/search').query({ q: word }).expect(200);
    expect(ids(found.body)).toEqual([id]);
    expect(found.body.facets.dyestuff).toEqual(expect.arrayContaining([expect.objectContaining({ value: 'weld' })]));
    const narrowed = await researcherB.get('/api/search').query({ q: word, dyestuff: 'weld' }).expect(200);
    expect(ids(narrowed.body)).toEqual([id]);
    expect((await request(b.url).get('/api/search').query({ q: word }).expect(200)).body.items).toEqual([]);

    // A title edit: the new words find it on B, the old ones no longer do.
    const renamed = unique();
    await curatorA
      .patch(`/api/pieces/${id}`)
      .set('Origin', a.url)
      .send({ title: `Trailing ${renamed} chintz` });
    expect(ids((await researcherB.get('/api/search').query({ q: renamed }).expect(200)).body)).toEqual([id]);
    expect((await researcherB.get('/api/search').query({ q: word }).expect(200)).body.items).toEqual([]);

    // Published on A: visitors on B see it; unpublished on A: visitors on B no longer see it, title and all.
    await curatorA.patch(`/api/pieces/${id}`).set('Origin', a.url).send({ status: 'published' }).expect(200);
    expect(ids((await request(b.url).get('/api/search').query({ q: renamed }).expect(200)).body)).toEqual([id]);
    await curatorA.patch(`/api/pieces/${id}`).set('Origin', a.url).send({ status: 'draft' }).expect(200);
    const hidden = await request(b.url).get('/api/search').query({ q: renamed }).expect(200);
    expect(hidden.body.items).toEqual([]);
    expect(JSON.stringify(hidden.body)).not.toContain(renamed);

    // Deleted on A: gone on B; restored on A (by an admin): back on B.
    await curatorA.delete(`/api/pieces/${id}`).set('Origin', a.url).expect(204);
    expect((await researcherB.get('/api/search').query({ q: renamed }).expect(200)).body.items).toEqual([]);
    const adminA = await signIn(a, 'admin');
    await adminA.post(`/api/pieces/${id}/restore`).set('Origin', a.url).expect(200);
    expect(ids((await researcherB.get('/api/search').query({ q: renamed }).expect(200)).body)).toEqual([id]);
  }, 60_000);

  it('a photo uploaded on A is found by its shade on B, and leaves B when its piece is deleted', async () => {
    const curatorA = await signIn(a, 'curator');
    const researcherB = await signIn(b, 'researcher');
    const word = unique();
    const piece = await curatorA
      .post('/api/pieces')
      .set('Origin', a.url)
      .send({ accessionNumber: `SRV.${word}`, objectName: 'fragment', title: `Shade ${word}`, dateEdtf: '1790' })
      .expect(201);
    const id = piece.body.piece.id as number;
    const up = await curatorA
      .post(`/api/pieces/${id}/photos`)
      .set('Origin', a.url)
      .attach('photo', await clothJpeg({ seed: 11 }), 'recto.jpg')
      .expect(201);
    // The palette is written by the photo's ingest job (a server's worker, or this process), with its change-log
    // rows in the same transaction: B's shade index finds it through the log.
    const photoId = up.body.photos[0].id as number;
    const shadeAt = (lab: { L: number; a: number; b: number }) =>
      researcherB
        .get('/api/search/shade')
        .query({ ...lab, maxDeltaE: 1, q: word })
        .expect(200);
    // B reads the new photo before its palette exists; the palette must still reach B when the job writes it, even
    // when the job runs in a process that serves nothing (here: this test's, through `ingested`).
    expect((await shadeAt({ L: 50, a: 0, b: 0 })).body.items).toEqual([]);
    await ingested(photoId);
    const stored = (await curatorA.get(`/api/photos/${photoId}`).expect(200)).body.photo;
    const colour = (stored.palette as { lab: { L: number; a: number; b: number }; background: boolean }[]).find(
      (c) => !c.background,
    )!;
    const shade = () => shadeAt(colour.lab);
    const hit = await shade();
    expect(hit.body.items.map((i: { pieceId: number }) => i.pieceId)).toEqual([id]);
    expect(hit.body.items[0].deltaE00).toBeLessThan(0.01);

    await curatorA.delete(`/api/pieces/${id}`).set('Origin', a.url).expect(204);
    expect((await shade()).body.items).toEqual([]);
  }, 60_000);

  it('writes made outside any app server (a script, the command line) reach both servers', async () => {
    installSearchHooks();
    const word = unique();
    const p = await makePiece({ title: `Scripted ${word} resist print`, status: 'published' });
    for (const server of [a, b])
      expect(ids((await request(server.url).get('/api/search').query({ q: word }).expect(200)).body)).toEqual([p.id]);
    await p.update({ status: 'draft' });
    for (const server of [a, b])
      expect((await request(server.url).get('/api/search').query({ q: word }).expect(200)).body.items).toEqual([]);
  }, 60_000);

  it('the archive list on B, cached there, shows every write made on A at once (issue 16, point 9)', async () => {
    const curatorA = await signIn(a, 'curator');
    const researcherB = await signIn(b, 'researcher');
    const newest = { sort: 'createdAt', dir: 'desc', pageSize: 5 };
    type Row = { id: number; title: string; status: string; thumbUrl: string | null };
    const staffList = async () =>
      (await researcherB.get('/api/pieces').query(newest).expect(200)).body as {
        items: Row[];
        total: number;
      };
    const publicList = async () =>
      (await request(b.url).get('/api/pieces').query(newest).expect(200)).body as {
        items: Row[];
        total: number;
      };
    // Read twice on B first, so that what follows is answered from B's cache unless a write shows up in the log.
    await staffList();
    const before = await staffList();
    const beforePublic = await publicList();

    const word = unique();
    const created = await curatorA
      .post('/api/pieces')
      .set('Origin', a.url)
      .send({ accessionNumber: `LST.${word}`, objectName: 'fragment', title: `Listed ${word}`, dateEdtf: '1800' })
      .expect(201);
    const id = created.body.piece.id as number;
    const staff = await staffList();
    expect(staff.items[0]).toMatchObject({ id, title: `Listed ${word}`, status: 'draft', thumbUrl: null });
    expect(staff.total).toBe(before.total + 1);
    expect((await publicList()).items.map((r) => r.id)).not.toContain(id);

    await curatorA.patch(`/api/pieces/${id}`).set('Origin', a.url).send({ status: 'published' }).expect(200);
    const published = await publicList();
    expect(published.items[0]).toMatchObject({ id, status: 'published' });
    expect(published.total).toBe(beforePublic.total + 1);

    await curatorA
      .post(`/api/pieces/${id}/photos`)
      .set('Origin', a.url)
      .attach('photo', await clothJpeg({ seed: 5 }), 'recto.jpg')
      .expect(201);
    expect((await publicList()).items[0].thumbUrl).toMatch(/^\/media\/photos\/\d+\/thumb$/);

    // Cached indeed: a change written behind the app's back (raw SQL, no log row) is not seen on B ...
    await sequelize.query('UPDATE pieces SET title = ? WHERE id = ?', { replacements: [`Unlogged ${word}`, id] });
    expect((await publicList()).items[0].title).toBe(`Listed ${word}`);
    // ... until a logged write shows up: then the list is read again, with both.
    await curatorA.patch(`/api/pieces/${id}`).set('Origin', a.url).send({ status: 'draft' }).expect(200);
    expect((await publicList()).items.map((r) => r.id)).not.toContain(id);
    expect((await staffList()).items[0]).toMatchObject({ id, title: `Unlogged ${word}`, status: 'draft' });

    await curatorA.delete(`/api/pieces/${id}`).set('Origin', a.url).expect(204);
    expect((await staffList()).items.map((r) => r.id)).not.toContain(id);
  }, 60_000);

  it('each server reports how far it is behind the change log', async () => {
    const health = await request(b.url).get('/api/health').expect(200);
    expect(health.body.search).toMatchObject({ pendingChanges: 0, lastError: null });
    expect(health.body.search.logPosition).toBeGreaterThan(0);
    expect(health.body.search.sinceSyncMs).toBeLessThan(5_000);
  });
});

import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { AuditEvent, Piece, sequelize } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

const app = createApp();
afterAll(() => sequelize.close());

// Unique accession numbers per run, in the pattern the schema accepts (e.g. 2099.123.4).
const run = `${Date.now() % 1_000_000}`;
let n = 0;
const accession = () => `2099.${run}.${++n}`;
const newPiece = (extra: Record<string, unknown> = {}) => ({
  accessionNumber: accession(),
  objectName: 'sample book page',
  title: `Catalogue test ${run}-${n}`,
  dateText: 'about 1770–1785',
  dateEdtf: '1770/1785',
  fibres: ['cotton'],
  techniques: ['block printing', 'mordant printing'],
  dyestuffs: [{ name: 'madder', evidence: 'attributed' }],
  historicalMordants: [{ name: 'aluminium acetate (basic)', evidence: 'attributed' }],
  heightMm: 420.5,
  widthMm: 310,
  ...extra,
});

describe('pieces: create, read, validate', () => {
  it('lets a curator create a draft, derives the years from EDTF and writes a history row', async () => {
    const curator = await signedInAgent(app, 'curator');
    const body = newPiece();
    const res = await curator.post('/api/pieces').set('Origin', ORIGIN).send(body).expect(201);
    expect(res.body.piece).toMatchObject({
      accessionNumber: body.accessionNumber,
      status: 'draft',
      earliestYear: 1770,
      latestYear: 1785,
      heightMm: 420.5,
    });
    expect(res.body.piece.abilities).toMatchObject({
      'piece:update': true,
      'piece:delete': true,
      'piece:restore': false,
    });
    const rows = await AuditEvent.findAll({ where: { entity: 'piece', entityId: res.body.piece.id } });
    expect(rows.map((r) => r.action)).toEqual(['create']);
    expect(rows[0].changes).toHaveProperty('accessionNumber');
  });

  it('answers invalid input with per-field details', async () => {
    const curator = await signedInAgent(app, 'curator');
    const res = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send({
        accessionNumber: '1931..4',
        objectName: '',
        title: 'x',
        dateEdtf: '1785/1770',
        heightMm: -3,
        dyestuffs: [{ name: 'madder', evidence: 'guessed' }],
      })
      .expect(400);
    const fields = res.body.error.details.fields;
    expect(Object.keys(fields)).toEqual(
      expect.arrayContaining(['accessionNumber', 'objectName', 'heightMm', 'dyestuffs.0.evidence']),
    );
    // Date rules run once the fields themselves are well-formed.
    const dates = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ dateEdtf: '1785/1770' }))
      .expect(400);
    expect(dates.body.error.details.fields.dateEdtf[0]).toMatch(/ends \(1770\) before it starts \(1785\)/);
  });

  it('refuses year bounds that contradict the EDTF date, and terms outside the vocabularies', async () => {
    const curator = await signedInAgent(app, 'curator');
    const years = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ earliestYear: 1760, latestYear: 1785 }))
      .expect(400);
    expect(years.body.error.details.fields.earliestYear[0]).toMatch(/1770/);
    const vocab = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ fibres: ['unobtainium'] }))
      .expect(400);
    expect(vocab.body.error.details.fields.fibres[0]).toMatch(/unobtainium/);
  });

  it('lets an approximate or uncertain date carry a wider search range; an exact one must agree with its years', async () => {
    // EDTF qualifiers ~ (approximate) and ? (uncertain): Library of Congress EDTF specification (2019), level 1.
    const curator = await signedInAgent(app, 'curator');
    const about = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ dateText: 'about 1760', dateEdtf: '1760~', earliestYear: 1755, latestYear: 1765 }))
      .expect(201);
    expect(about.body.piece).toMatchObject({ dateEdtf: '1760~', earliestYear: 1755, latestYear: 1765 });
    const perhaps = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ dateEdtf: '1785?/1795', earliestYear: 1780, latestYear: 1795 }))
      .expect(201);
    expect(perhaps.body.piece).toMatchObject({ earliestYear: 1780, latestYear: 1795 });
    // The exact end (1795) may not be widened, nor an approximate start narrowed.
    const wide = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ dateEdtf: '1785?/1795', earliestYear: 1780, latestYear: 1800 }))
      .expect(400);
    expect(Object.keys(wide.body.error.details.fields)).toEqual(['latestYear']);
    expect(wide.body.error.details.fields.latestYear[0]).toMatch(/ends in 1795/);
    const exact = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ dateEdtf: '1760', earliestYear: 1755, latestYear: 1765 }))
      .expect(400);
    expect(Object.keys(exact.body.error.details.fields).sort()).toEqual(['earliestYear', 'latestYear']);
    // An edit to the years alone is checked against the stored date too.
    await curator
      .patch(`/api/pieces/${about.body.piece.id}`)
      .set('Origin', ORIGIN)
      .send({ earliestYear: 1750 })
      .expect(200);
    const narrow = await curator
      .patch(`/api/pieces/${about.body.piece.id}`)
      .set('Origin', ORIGIN)
      .send({ latestYear: 1759 })
      .expect(400);
    expect(narrow.body.error.details.fields.latestYear[0]).toMatch(/1760/);
  });

  it('refuses dates that are not in the calendar, with the reason beside the date', async () => {
    const curator = await signedInAgent(app, 'curator');
    const cases: Array<[string, RegExp]> = [
      ['1850-02-30', /^February 1850 has 28 days; there is no day 30$/],
      ['1851-02-29', /^1851 is not a leap year/],
      ['1850-13', /^There is no month 13/],
      ['1850-04-31', /^April has 30 days/],
    ];
    for (const [dateEdtf, message] of cases) {
      const res = await curator.post('/api/pieces').set('Origin', ORIGIN).send(newPiece({ dateEdtf })).expect(400);
      expect(res.body.error.details.fields).toEqual({ dateEdtf: [expect.stringMatching(message)] });
    }
    await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ dateEdtf: '1852-02-29' }))
      .expect(201);
    const piece = await curator.post('/api/pieces').set('Origin', ORIGIN).send(newPiece()).expect(201);
    const patched = await curator
      .patch(`/api/pieces/${piece.body.piece.id}`)
      .set('Origin', ORIGIN)
      .send({ dateEdtf: '1900-02-29' })
      .expect(400);
    expect(patched.body.error.details.fields.dateEdtf[0]).toMatch(/^1900 is not a leap year/);
  });

  it('answers a duplicate accession number with 409 naming the field', async () => {
    const curator = await signedInAgent(app, 'curator');
    const body = newPiece();
    await curator.post('/api/pieces').set('Origin', ORIGIN).send(body).expect(201);
    const res = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send({ ...body, title: 'another' })
      .expect(409);
    expect(res.body.error.details.fields.accessionNumber).toEqual(['That accession number is already used.']);
  });

  it("accepts accession numbers in many institutions' schemes, unique whatever their case and spacing", async () => {
    const curator = await signedInAgent(app, 'curator');
    const schemes = [`${run}.4.12a-b`, `T.${run}-1950`, `${run}-94-1`, `L${run}.3`, `EX ${run}/1`, `${run}.245a,b`];
    for (const accessionNumber of schemes) {
      const res = await curator
        .post('/api/pieces')
        .set('Origin', ORIGIN)
        .send(newPiece({ accessionNumber }))
        .expect(201);
      expect(res.body.piece.accessionNumber).toBe(accessionNumber);
    }
    // Case and spaces do not make a new number; the message names the number as it is written.
    const clash = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ accessionNumber: `ex${run}/1` }))
      .expect(409);
    expect(clash.body.error.details.fields.accessionNumber).toEqual([
      `That accession number is already used (as EX ${run}/1).`,
    ]);
    const spaced = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ accessionNumber: ` t.${run}  -1950 ` }))
      .expect(400);
    expect(spaced.body.error.details.fields.accessionNumber[0]).toMatch(/^Use letters and digits/);
    // Renumbering onto another piece's number is refused the same way; renumbering itself in other case is allowed.
    const other = await curator.post('/api/pieces').set('Origin', ORIGIN).send(newPiece()).expect(201);
    const renum = await curator
      .patch(`/api/pieces/${other.body.piece.id}`)
      .set('Origin', ORIGIN)
      .send({ accessionNumber: `l${run}.3` })
      .expect(409);
    expect(renum.body.error.details.fields.accessionNumber[0]).toMatch(/already used \(as L/);
    // The archive's search finds a number however it is typed.
    const typed = await curator
      .get('/api/pieces')
      .query({ q: `ex${run} /1` })
      .expect(200);
    expect(typed.body.items.map((p: { accessionNumber: string }) => p.accessionNumber)).toEqual([`EX ${run}/1`]);
    const first = await curator
      .get('/api/pieces')
      .query({ q: `L${run}.3` })
      .expect(200);
    await curator
      .patch(`/api/pieces/${first.body.items[0].id}`)
      .set('Origin', ORIGIN)
      .send({ accessionNumber: `l${run}.3` })
      .expect(200);
    // Even a write that skips the service cannot add a second spelling: the key column is unique.
    await expect(
      Piece.create({
        accessionNumber: `${run}.245A, B`,
        objectName: 'panel',
        title: 'raw',
        fibres: [],
        techniques: [],
        dyestuffs: [],
        historicalMordants: [],
        status: 'draft',
      } as never),
    ).rejects.toThrow();
  });

  it('lets only curators and admins create: visitor 401, researcher and dyer 403', async () => {
    await request(app).post('/api/pieces').set('Origin', ORIGIN).send(newPiece()).expect(401);
    for (const role of ['researcher', 'dyer'] as const) {
      const agent = await signedInAgent(app, role);
      await agent.post('/api/pieces').set('Origin', ORIGIN).send(newPiece()).expect(403);
    }
    const admin = await signedInAgent(app, 'admin');
    await admin.post('/api/pieces').set('Origin', ORIGIN).send(newPiece()).expect(201);
  });
});

describe('pieces: visibility, updates, history', () => {
  it('shows drafts to signed-in users only; visitors get 404 and published pieces only in lists', async () => {
    const curator = await signedInAgent(app, 'curator');
    const draft = (await curator.post('/api/pieces').set('Origin', ORIGIN).send(newPiece()).expect(201)).body.piece;
    await request(app).get(`/api/pieces/${draft.id}`).expect(404);
    const researcher = await signedInAgent(app, 'researcher');
    await researcher.get(`/api/pieces/${draft.id}`).expect(200);
    const visitorList = await request(app).get('/api/pieces').query({ q: run, pageSize: 100 }).expect(200);
    expect(visitorList.body.items.map((p: { id: number }) => p.id)).not.toContain(draft.id);
    expect(visitorList.body.items.every((p: { status: string }) => p.status === 'published')).toBe(true);

    await curator.patch(`/api/pieces/${draft.id}`).set('Origin', ORIGIN).send({ status: 'published' }).expect(200);
    await request(app).get(`/api/pieces/${draft.id}`).expect(200);
    const after = await request(app).get('/api/pieces').query({ q: run, pageSize: 100 }).expect(200);
    expect(after.body.items.map((p: { id: number }) => p.id)).toContain(draft.id);
  });

  it('records who changed which fields, in order, and shows it to curators and researchers only', async () => {
    const curator = await signedInAgent(app, 'curator');
    const p = (await curator.post('/api/pieces').set('Origin', ORIGIN).send(newPiece()).expect(201)).body.piece;
    await curator
      .patch(`/api/pieces/${p.id}`)
      .set('Origin', ORIGIN)
      .send({ title: 'Renamed', condition: 'Sound' })
      .expect(200);
    await curator.patch(`/api/pieces/${p.id}`).set('Origin', ORIGIN).send({ status: 'published' }).expect(200);
    const h = await curator.get(`/api/pieces/${p.id}/history`).expect(200);
    expect(h.body.items.map((e: { action: string }) => e.action)).toEqual(['publish', 'update', 'create']);
    expect(h.body.items[1]).toMatchObject({ actor: { name: 'Ysolde Marrin' }, fields: ['title', 'condition'] });
    expect(h.body.items[1].changes.title).toEqual({ from: p.title, to: 'Renamed' });
    await (await signedInAgent(app, 'researcher')).get(`/api/pieces/${p.id}/history`).expect(200);
    await (await signedInAgent(app, 'dyer')).get(`/api/pieces/${p.id}/history`).expect(403);
    await request(app).get(`/api/pieces/${p.id}/history`).expect(401);
  });

  it('checks the merged dates on update and refuses edits from roles that may not', async () => {
    const curator = await signedInAgent(app, 'curator');
    const p = (await curator.post('/api/pieces').set('Origin', ORIGIN).send(newPiece()).expect(201)).body.piece;
    const bad = await curator.patch(`/api/pieces/${p.id}`).set('Origin', ORIGIN).send({ latestYear: 1790 }).expect(400);
    expect(bad.body.error.details.fields.latestYear).toBeDefined();
    const moved = await curator
      .patch(`/api/pieces/${p.id}`)
      .set('Origin', ORIGIN)
      .send({ dateEdtf: '18XX' })
      .expect(200);
    expect(moved.body.piece).toMatchObject({ earliestYear: 1800, latestYear: 1899 });
    await (
      await signedInAgent(app, 'dyer')
    )
      .patch(`/api/pieces/${p.id}`)
      .set('Origin', ORIGIN)
      .send({ title: 'no' })
      .expect(403);
    await request(app).patch(`/api/pieces/${p.id}`).set('Origin', ORIGIN).send({ title: 'no' }).expect(401);
  });

  it('sorts, pages and filters the list', async () => {
    const curator = await signedInAgent(app, 'curator');
    const tag = `F${run}x${++n}`;
    const made = [];
    for (const [i, extra] of [
      { fibres: ['linen'], techniques: ['resist'], dyestuffs: [{ name: 'indigo', evidence: 'attributed' }] },
      { fibres: ['cotton'], techniques: ['resist'], dyestuffs: [{ name: 'weld', evidence: 'attributed' }] },
      { fibres: ['linen'], techniques: ['discharge'], dyestuffs: [{ name: 'indigo', evidence: 'attributed' }] },
    ].entries()) {
      made.push(
        (
          await curator
            .post('/api/pieces')
            .set('Origin', ORIGIN)
            .send(newPiece({ title: `${tag} ${'CBA'[i]}`, ...extra }))
            .expect(201)
        ).body.piece,
      );
    }
    const byTitle = await curator.get('/api/pieces').query({ q: tag, sort: 'title', dir: 'asc' }).expect(200);
    expect(byTitle.body.items.map((p: { title: string }) => p.title)).toEqual([`${tag} A`, `${tag} B`, `${tag} C`]);
    expect(byTitle.body).toMatchObject({ total: 3, page: 1, pageSize: 25 });
    const page2 = await curator.get('/api/pieces').query({ q: tag, sort: 'title', pageSize: 2, page: 2 }).expect(200);
    expect(page2.body.items.map((p: { title: string }) => p.title)).toEqual([`${tag} C`]);
    const linen = await curator.get('/api/pieces').query({ q: tag, fibre: 'linen' }).expect(200);
    expect(linen.body.total).toBe(2);
    const resistIndigo = await curator
      .get('/api/pieces')
      .query({ q: tag, technique: 'resist', dyestuff: 'indigo' })
      .expect(200);
    expect(resistIndigo.body.items.map((p: { id: number }) => p.id)).toEqual([made[0].id]);
    // Natural order of accession numbers: .2 before .12, a number before its parts, either direction.
    const base = `2097.${run}`;
    for (const item of ['12a-b', '10', '2', '12', '9'])
      await curator
        .post('/api/pieces')
        .set('Origin', ORIGIN)
        .send(newPiece({ accessionNumber: `${base}.${item}` }))
        .expect(201);
    const natural = await curator
      .get('/api/pieces')
      .query({ q: `${base}.`, sort: 'accessionNumber' })
      .expect(200);
    const order = ['2', '9', '10', '12', '12a-b'].map((i) => `${base}.${i}`);
    expect(natural.body.items.map((p: { accessionNumber: string }) => p.accessionNumber)).toEqual(order);
    const reversed = await curator
      .get('/api/pieces')
      .query({ q: `${base}.`, sort: 'accessionNumber', dir: 'desc' })
      .expect(200);
    expect(reversed.body.items.map((p: { accessionNumber: string }) => p.accessionNumber)).toEqual(
      [...order].reverse(),
    );
    const bad = await curator.get('/api/pieces').query({ sort: 'colour' }).expect(400);
    expect(bad.body.error.details.fields.sort).toBeDefined();
  });
});

describe('pieces: soft delete and restore', () => {
  it('hides a deleted piece, keeps its row, and lets only an admin restore it', async () => {
    const curator = await signedInAgent(app, 'curator');
    const p = (await curator.post('/api/pieces').set('Origin', ORIGIN).send(newPiece()).expect(201)).body.piece;
    await (await signedInAgent(app, 'researcher')).delete(`/api/pieces/${p.id}`).set('Origin', ORIGIN).expect(403);
    await curator.delete(`/api/pieces/${p.id}`).set('Origin', ORIGIN).expect(204);
    expect(await Piece.findByPk(p.id)).toBeNull();
    expect((await Piece.findByPk(p.id, { paranoid: false }))?.deletedAt).toBeInstanceOf(Date);
    const researcher = await signedInAgent(app, 'researcher');
    await researcher.get(`/api/pieces/${p.id}`).expect(404);
    const seen = await curator.get(`/api/pieces/${p.id}`).expect(200);
    expect(seen.body.piece.deletedAt).not.toBeNull();
    const listed = await curator.get('/api/pieces').query({ deleted: 'only', q: p.accessionNumber }).expect(200);
    expect(listed.body.items.map((x: { id: number }) => x.id)).toEqual([p.id]);
    await researcher.get('/api/pieces').query({ deleted: 'only' }).expect(403);
    await request(app).get('/api/pieces').query({ deleted: 'only' }).expect(401);
    // The number stays taken while the piece can be restored.
    const dup = await curator
      .post('/api/pieces')
      .set('Origin', ORIGIN)
      .send(newPiece({ accessionNumber: p.accessionNumber }))
      .expect(409);
    expect(dup.body.error.message).toMatch(/deleted/);

    await curator.post(`/api/pieces/${p.id}/restore`).set('Origin', ORIGIN).expect(403);
    const admin = await signedInAgent(app, 'admin');
    const restored = await admin.post(`/api/pieces/${p.id}/restore`).set('Origin', ORIGIN).expect(200);
    expect(restored.body.piece.deletedAt).toBeNull();
    await admin.post(`/api/pieces/${p.id}/restore`).set('Origin', ORIGIN).expect(409);
    await researcher.get(`/api/pieces/${p.id}`).expect(200);
    const h = await curator.get(`/api/pieces/${p.id}/history`).expect(200);
    expect(h.body.items.map((e: { action: string }) => e.action)).toEqual(['restore', 'delete', 'create']);
  });
});

describe('vocabularies', () => {
  it('lists the seeded fibres, techniques, dyestuffs and mordants with their hazards', async () => {
    const res = await request(app).get('/api/vocabularies').expect(200);
    expect(res.body.fibres.map((t: { term: string }) => t.term)).toContain('cotton');
    expect(res.body.techniques.map((t: { term: string }) => t.term)).toContain('mordant printing');
    expect(res.body.dyestuffs.length).toBeGreaterThan(0);
    expect(res.body.mordants.length).toBeGreaterThan(0);
  });
});

describe('pieces: the archive list as sent', () => {
  it('answers JSON with an entity tag, and 304 to a client that already holds that page', async () => {
    const first = await request(app).get('/api/pieces?pageSize=5').expect(200);
    expect(first.headers['content-type']).toMatch(/^application\/json/);
    expect(first.headers.etag).toMatch(/^W\/"[0-9a-f]+-[A-Za-z0-9+/]{27}"$/);
    expect(first.body.items.length).toBeGreaterThan(0);
    await request(app).get('/api/pieces?pageSize=5').set('If-None-Match', first.headers.etag).expect(304);
  });
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app.ts';
import { BatchEvent, Chemical, MordantBatch, sequelize } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

const app = createApp();
let dyer: TestAgent;
let alumId: number;
const tag = `${Date.now() % 1_000_000}`;
afterAll(() => sequelize.close());
beforeAll(async () => {
  dyer = await signedInAgent(app, 'dyer');
  alumId = (await Chemical.findOne({ where: { name: 'potash alum' }, rejectOnEmpty: true })).id;
});

const makeBatch = async (suffix: string, volumeMl: number) => {
  const res = await dyer
    .post('/api/batches')
    .set('Origin', ORIGIN)
    .send({
      code: `T${tag}-${suffix}`,
      kind: 'mordant-bath',
      name: `Alum bath ${suffix}`,
      volumeMl,
      madeOn: '2024-05-01',
      checkBy: '2024-05-20',
      ingredients: [{ kind: 'chemical', refId: alumId, name: 'potash alum', grams: 100 }],
      uptakePerUse: 0.12,
    });
  expect(res.status).toBe(201);
  return res.body as { id: number; remainingMl: number; uses: number };
};
const post = (id: number, body: object) => dyer.post(`/api/batches/${id}/events`).set('Origin', ORIGIN).send(body);

describe('bath ledger through the API', () => {
  it('follows a worked reuse history: draws, a top-up, water, to exhaustion', async () => {
    // Worked history [common practice: a bath kept and topped up, not poured away];
    // the volumes are plain sums: 2000 − 160 − 400 + 400 − 600 + 300 − 900 = 640 mL.
    const b = await makeBatch('ledger', 2000);
    expect(b).toMatchObject({ remainingMl: 2000, uses: 0 });
    for (const e of [
      { type: 'use', volumeMl: 160, fibreMassG: 250 },
      { type: 'use', volumeMl: 400, fibreMassG: 250 },
      {
        type: 'top-up',
        volumeMl: 400,
        additions: [{ kind: 'chemical', refId: alumId, name: 'potash alum', grams: 35 }],
      },
      { type: 'use', volumeMl: 600, fibreMassG: 300 },
      { type: 'water', volumeMl: 300 },
      { type: 'use', volumeMl: 900, fibreMassG: 400 },
    ])
      expect((await post(b.id, e)).status).toBe(201);
    const got = (await dyer.get(`/api/batches/${b.id}`).expect(200)).body;
    expect(got).toMatchObject({ remainingMl: 640, uses: 4, fibreMassG: 1200, status: 'active' });
    expect(got.estimatedStrength.estimate).toBe(true);
    // Top-up restores the made strength (mass balance on the ledger estimate): uptake 12 % per load of 100 g
    // fibre (2000 mL at 1:20 [common practice, recalled from memory]), kept = 0.88^(fibre g / 100) per use:
    // alum now = 100 × 1840/2000 × 0.88^2.5 × 1440/1840 × 0.88^2.5, + 35, × 1240/1840 × 0.88^3, × 640/1540 × 0.88^4
    //          = 8.35 g; made 50 g/L × 2000 mL − 8.35 g = 91.65 g, and water back to the 2000 mL made: 1360 mL.
    expect(got.topUpSuggestion.items).toEqual([{ name: 'potash alum', refId: alumId, thickener: false, grams: 91.65 }]);
    expect(got.topUpSuggestion.waterMl).toBe(1360);
    expect(got.uptake).toMatchObject({ value: 0.12, referenceLoadG: 100, estimate: true, drawOnly: false });
    expect(got.timeline).toHaveLength(7);
    expect(got.timeline.map((p: { remainingMl: number }) => p.remainingMl)).toEqual([
      2000, 1840, 1440, 1840, 1240, 1540, 640,
    ]);

    // Following the suggestion brings the estimate back to the bath as made.
    const topped = await post(b.id, {
      type: 'top-up',
      volumeMl: 1360,
      additions: [{ kind: 'chemical', refId: alumId, name: 'potash alum', grams: 91.65 }],
    });
    expect(topped.status).toBe(201);
    expect(topped.body.batch).toMatchObject({ remainingMl: 2000, estimatedStrength: { value: 1 } });
    expect((await dyer.get(`/api/batches/${b.id}`).expect(200)).body.topUpSuggestion).toBeNull();

    const last = await post(b.id, { type: 'use', volumeMl: 2000, fibreMassG: 300 });
    expect(last.status).toBe(201);
    expect(last.body.batch).toMatchObject({ remainingMl: 0, uses: 5, status: 'exhausted' });
  });

  it('gives a stock or print paste left without an uptake 0 (only drawn from: volume falls, strength stays), a bath 10 %', async () => {
    const mk = (kind: string, suffix: string) =>
      dyer
        .post('/api/batches')
        .set('Origin', ORIGIN)
        .send({
          code: `T${tag}-${suffix}`,
          kind,
          name: `${kind} ${suffix}`,
          volumeMl: 1000,
          madeOn: '2024-05-01',
          ingredients: [{ kind: 'chemical', refId: alumId, name: 'potash alum', grams: 60 }],
        });
    const stock = await mk('stock', 'stk');
    expect(stock.status).toBe(201);
    const bath = await mk('mordant-bath', 'dflt');
    expect((await dyer.get(`/api/batches/${bath.body.id}`)).body.uptakePerUse).toBe(0.1);
    const got = (await dyer.get(`/api/batches/${stock.body.id}`)).body;
    expect(got).toMatchObject({ kind: 'stock', uptakePerUse: 0, uptake: { drawOnly: true } });
    const used = await post(stock.body.id, { type: 'use', volumeMl: 400, fibreMassG: 500 });
    expect(used.body.batch).toMatchObject({ remainingMl: 600, estimatedStrength: { value: 1 } });
    expect((await dyer.get(`/api/batches/${stock.body.id}`)).body.topUpSuggestion).toBeNull();
  });

  it('refuses a draw larger than what is left and leaves the batch unchanged', async () => {
    const b = await makeBatch('over', 500);
    await post(b.id, { type: 'use', volumeMl: 200 }).expect(201);
    const before = await BatchEvent.count({ where: { batchId: b.id } });
    const res = await post(b.id, { type: 'use', volumeMl: 301 });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'conflict', details: { remainingMl: 300, requestedMl: 301 } });
    expect(await BatchEvent.count({ where: { batchId: b.id } })).toBe(before);
    expect((await dyer.get(`/api/batches/${b.id}`)).body).toMatchObject({
      remainingMl: 300,
      uses: 1,
      status: 'active',
    });
  });

  it('offers disposal only for an exhausted batch or with a reason, then refuses any further event', async () => {
    const b = await makeBatch('dispose', 300);
    const disposal = {
      type: 'disposal',
      route: 'collected by a licensed waste contractor',
      ruleFollowed: 'SDS section 13 and the local trade-effluent rule',
    };
    const early = await post(b.id, disposal);
    expect(early.status).toBe(422);
    expect(early.body.error.details.fields.reason).toBeDefined();
    expect((await post(b.id, { ...disposal, reason: 'contaminated with iron' })).body.batch.status).toBe('disposed');
    const after = await post(b.id, { type: 'water', volumeMl: 100 });
    expect(after.status).toBe(409);
    expect((await MordantBatch.findByPk(b.id))!.status).toBe('disposed');
    expect((await dyer.get(`/api/batches/${b.id}`)).body.remainingMl).toBe(300);
  });

  it('never takes more than is left when two draws arrive at once (row lock)', async () => {
    const b = await makeBatch('race', 1000);
    const [r1, r2] = await Promise.all([
      post(b.id, { type: 'use', volumeMl: 600 }),
      post(b.id, { type: 'use', volumeMl: 600 }),
    ]);
    expect([r1.status, r2.status].sort()).toEqual([201, 409]);
    expect((await dyer.get(`/api/batches/${b.id}`)).body).toMatchObject({ remainingMl: 400, uses: 1 });
    const five = await Promise.all(Array.from({ length: 5 }, () => post(b.id, { type: 'use', volumeMl: 150 })));
    expect(five.filter((r) => r.status === 201)).toHaveLength(2);
    expect((await dyer.get(`/api/batches/${b.id}`)).body.remainingMl).toBe(100);
  });

  it('lists batches with filters and the due-for-check list', async () => {
    const b = await makeBatch('due', 100);
    const due = (await dyer.get('/api/batches?due=1&pageSize=100').expect(200)).body;
    expect(due.items.some((x: { id: number }) => x.id === b.id)).toBe(true);
    expect(due.items.every((x: { dueForCheck: boolean }) => x.dueForCheck)).toBe(true);
    const exhausted = (await dyer.get('/api/batches?status=exhausted&pageSize=100').expect(200)).body;
    expect(exhausted.items.find((x: { code: string }) => x.code === 'MB-07')).toMatchObject({
      remainingMl: 0,
      uses: 6,
      status: 'exhausted',
    });
    // MB-07's strength is what 100 g alum and 50 g calcium acetate make (tests/unit/stoichiometry.test.ts), not 75 g/L.
    const mb07 = (
      await dyer.get(`/api/batches/${exhausted.items.find((x: { code: string }) => x.code === 'MB-07').id}`).expect(200)
    ).body;
    expect(mb07.made).toMatchObject({
      limiting: 'calcium acetate',
      active: { name: 'aluminium acetate (basic)', gPerL: 17.08 },
      metal: { symbol: 'Al', gPerL: 2.84 },
    });
    expect(mb07.made.byProducts).toContainEqual(
      expect.objectContaining({ name: 'calcium sulfate (gypsum)', fate: 'precipitate' }),
    );
  });

  it('keeps the role rules: visitors 401, curators may read but not draw, a dyer may not edit another dyer’s batch', async () => {
    const b = await makeBatch('roles', 100);
    await request(app).get(`/api/batches/${b.id}`).expect(401);
    const curator = await signedInAgent(app, 'curator');
    await curator.get(`/api/batches/${b.id}`).expect(200);
    await curator
      .post(`/api/batches/${b.id}/events`)
      .set('Origin', ORIGIN)
      .send({ type: 'water', volumeMl: 10 })
      .expect(403);
    const tamsin = await signedInAgent(app, { email: 'tamsin.orrery@weldfold.test', password: 'tinctoria-demo' });
    await tamsin.patch(`/api/batches/${b.id}`).set('Origin', ORIGIN).send({ notes: 'x' }).expect(403);
    await dyer.patch(`/api/batches/${b.id}`).set('Origin', ORIGIN).send({ notes: 'settled overnight' }).expect(200);
    await dyer.get('/api/batches/999999999').expect(404);
  });
});

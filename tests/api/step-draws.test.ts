import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app.ts';
import { BatchEvent, Chemical, RecipeStep, sequelize } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

// A recipe step that draws from a bath is one record: the step and the bath's `use` event are written,
// edited and removed together, in one transaction, and the bath's ledger may refuse the step.
const app = createApp();
let dyer: TestAgent;
let alumId: number;
const tag = `${Date.now() % 1_000_000}`;
afterAll(() => sequelize.close());
beforeAll(async () => {
  dyer = await signedInAgent(app, 'dyer');
  alumId = (await Chemical.findOne({ where: { name: 'potash alum' }, rejectOnEmpty: true })).id;
});

const makeBath = async (suffix: string, volumeMl: number) => {
  const res = await dyer
    .post('/api/batches')
    .set('Origin', ORIGIN)
    .send({
      code: `D${tag}-${suffix}`,
      kind: 'mordant-bath',
      name: `Alum bath ${suffix}`,
      volumeMl,
      madeOn: '2024-05-01',
      ingredients: [{ kind: 'chemical', refId: alumId, name: 'potash alum', grams: 100 }],
    });
  expect(res.status).toBe(201);
  return res.body as { id: number; code: string };
};
const makeTrial = async () =>
  (await dyer.post('/api/trials').set('Origin', ORIGIN).send({ dryMassG: 250 }).expect(201)).body.trial as {
    id: number;
    code: string;
  };
const draw = (batchId: number | null, batchVolumeMl: number | null, id?: number) => ({
  id,
  operation: 'mordant-bath',
  liquorRatio: 30,
  batchId,
  batchVolumeMl,
  ingredients: [],
});
const putSteps = (trialId: number, steps: object[]) =>
  dyer.put(`/api/trials/${trialId}/steps`).set('Origin', ORIGIN).send({ steps });
const bath = async (id: number) => (await dyer.get(`/api/batches/${id}`).expect(200)).body;
const uses = (b: {
  events: Array<{ type: string; trialId: number | null; stepId: number | null; volumeMl: number | null }>;
}) => b.events.filter((e) => e.type === 'use');

describe('a recipe step drawing from a bath', () => {
  it('records the draw once, as a use linked to the trial and the step', async () => {
    const b = await makeBath('create', 1000);
    const t = await makeTrial();
    const res = await putSteps(t.id, [draw(b.id, 300)]).expect(200);
    const step = res.body.trial.steps[0];
    expect(step.batch).toMatchObject({ code: b.code, remainingMl: 700 });
    const got = await bath(b.id);
    expect(got.remainingMl).toBe(700);
    expect(uses(got)).toEqual([
      expect.objectContaining({ volumeMl: 300, trialId: t.id, trialCode: t.code, stepId: step.id }),
    ]);
  });

  it('edits the event when the volume changes, and keeps one event through a save without changes', async () => {
    const b = await makeBath('edit', 1000);
    const t = await makeTrial();
    const first = (await putSteps(t.id, [draw(b.id, 300)]).expect(200)).body.trial.steps[0];
    const second = (await putSteps(t.id, [draw(b.id, 450, first.id)]).expect(200)).body.trial.steps[0];
    let got = await bath(b.id);
    expect(uses(got)).toHaveLength(1);
    expect(uses(got)[0]).toMatchObject({ volumeMl: 450, stepId: second.id });
    expect(got.remainingMl).toBe(550);
    // Saved again unchanged (the editor sends the step's id back): still one use of 450 mL.
    await putSteps(t.id, [draw(b.id, 450, second.id), { operation: 'rinse', ingredients: [] }]).expect(200);
    got = await bath(b.id);
    expect(uses(got).map((e) => e.volumeMl)).toEqual([450]);
  });

  it('moves the draw when the step changes bath', async () => {
    const a = await makeBath('from', 1000);
    const b = await makeBath('to', 1000);
    const t = await makeTrial();
    const first = (await putSteps(t.id, [draw(a.id, 200)]).expect(200)).body.trial.steps[0];
    const moved = (await putSteps(t.id, [draw(b.id, 250, first.id)]).expect(200)).body.trial.steps[0];
    expect(moved.batch.code).toBe(b.code);
    expect(uses(await bath(a.id))).toHaveLength(0);
    expect((await bath(a.id)).remainingMl).toBe(1000);
    expect(uses(await bath(b.id))).toEqual([
      expect.objectContaining({ volumeMl: 250, trialId: t.id, stepId: moved.id }),
    ]);
  });

  it('removes the event when the step is deleted, or its draw cleared, or the trial deleted', async () => {
    const b = await makeBath('delete', 1000);
    const t = await makeTrial();
    const [s1] = (await putSteps(t.id, [draw(b.id, 100), draw(b.id, 200)]).expect(200)).body.trial.steps;
    expect((await bath(b.id)).remainingMl).toBe(700);
    // The second step is deleted: only the first step's use remains.
    await putSteps(t.id, [draw(b.id, 100, s1.id)]).expect(200);
    let got = await bath(b.id);
    expect(uses(got).map((e) => e.volumeMl)).toEqual([100]);
    expect(got.remainingMl).toBe(900);
    // The draw cleared from the step.
    const s = (await dyer.get(`/api/trials/${t.id}`).expect(200)).body.trial.steps[0];
    await putSteps(t.id, [draw(null, null, s.id)]).expect(200);
    expect(uses(await bath(b.id))).toHaveLength(0);
    // A new draw, then the trial deleted: its use goes with it.
    await putSteps(t.id, [draw(b.id, 50)]).expect(200);
    expect((await bath(b.id)).remainingMl).toBe(950);
    await dyer.delete(`/api/trials/${t.id}`).set('Origin', ORIGIN).expect(204);
    got = await bath(b.id);
    expect(uses(got)).toHaveLength(0);
    expect(got.remainingMl).toBe(1000);
  });

  it('refuses an overdraw with the ledger’s own message beside the field, and writes nothing', async () => {
    const b = await makeBath('over', 500);
    const t = await makeTrial();
    const kept = (await putSteps(t.id, [draw(b.id, 300)]).expect(200)).body.trial.steps[0];
    const stepsBefore = await RecipeStep.count({ where: { trialId: t.id } });
    const eventsBefore = await BatchEvent.count({ where: { batchId: b.id } });
    // A second step asks for 250 mL of the 200 mL left.
    const res = await putSteps(t.id, [
      draw(b.id, 300, kept.id),
      { operation: 'rinse', ingredients: [] },
      draw(b.id, 250),
    ]).expect(409);
    expect(res.body.error.details.fields['steps.2.batchVolumeMl']).toEqual([
      'Only 200 mL are left; 250 mL cannot be drawn.',
    ]);
    expect(res.body.error.message).toContain(b.code);
    // Raising the kept step beyond the bath is refused too, beside that step.
    const raise = await putSteps(t.id, [draw(b.id, 600, kept.id)]).expect(409);
    expect(raise.body.error.details.fields['steps.0.batchVolumeMl']).toEqual([
      'Only 500 mL are left; 600 mL cannot be drawn.',
    ]);
    expect(await RecipeStep.count({ where: { trialId: t.id } })).toBe(stepsBefore);
    expect(await BatchEvent.count({ where: { batchId: b.id } })).toBe(eventsBefore);
    const after = (await dyer.get(`/api/trials/${t.id}`).expect(200)).body.trial.steps;
    expect(after.map((s: { id: number; batchVolumeMl: number }) => [s.id, s.batchVolumeMl])).toEqual([[kept.id, 300]]);
    expect((await bath(b.id)).remainingMl).toBe(200);
  });

  it('asks for the other half of a draw given alone, in people’s words', async () => {
    const b = await makeBath('half', 500);
    const t = await makeTrial();
    const noVolume = await putSteps(t.id, [draw(b.id, null)]).expect(400);
    expect(noVolume.body.error.details.fields['steps.0.batchVolumeMl']).toEqual([
      'Enter the volume drawn from the bath, in mL',
    ]);
    const noBath = await putSteps(t.id, [draw(null, 100)]).expect(400);
    expect(noBath.body.error.details.fields['steps.0.batchId']).toEqual(['Choose the bath this volume is drawn from']);
  });

  it('never overdraws when recipes draw from one bath at the same time', async () => {
    const b = await makeBath('race', 1000);
    const trials = await Promise.all(Array.from({ length: 6 }, () => makeTrial()));
    // Six steps of 300 mL from 1000 mL: three fit, the others are refused by the ledger.
    const results = await Promise.all(trials.map((t) => putSteps(t.id, [draw(b.id, 300)])));
    const statuses = results.map((r) => r.status).sort();
    expect(statuses).toEqual([200, 200, 200, 409, 409, 409]);
    const got = await bath(b.id);
    expect(uses(got)).toHaveLength(3);
    expect(got.remainingMl).toBe(100);
  });
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type TestAgent from 'supertest/lib/agent';
import { createApp } from '../../server/app.ts';
import { sequelize } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

// zod's own English, which must never reach a person through details.fields.
const RAW = /Invalid input|Invalid option|expected|received|Too big|Too small|Unrecognized key|Enter The/;

const app = createApp();
let dyer: TestAgent;
let admin: TestAgent;
beforeAll(async () => {
  dyer = await signedInAgent(app, 'dyer');
  admin = await signedInAgent(app, 'admin');
});
afterAll(() => sequelize.close());

const fieldsOf = (res: {
  status: number;
  body: { error: { code: string; details?: { fields?: Record<string, string[]> } } };
}) => {
  expect(res.status).toBe(400);
  expect(res.body.error.code).toBe('invalid_input');
  const fields = res.body.error.details?.fields ?? {};
  for (const m of Object.values(fields).flat()) expect(m).not.toMatch(RAW);
  return fields;
};

describe('400 answers say what is wrong in people’s words, field by field', () => {
  it('a new trial: the missing dry mass and a wrong weight and date', async () => {
    const empty = fieldsOf(await dyer.post('/api/trials').set('Origin', ORIGIN).send({}));
    expect(empty.dryMassG).toEqual(['Enter the dry fibre mass in g']);
    const wrong = fieldsOf(
      await dyer
        .post('/api/trials')
        .set('Origin', ORIGIN)
        .send({ dryMassG: 'heavy', gsm: 0, startedOn: 'March', status: 'done' }),
    );
    expect(wrong.dryMassG).toEqual(['Enter the dry fibre mass as a number in g']);
    expect(wrong.gsm).toEqual(['The fabric weight must be more than 0']);
    expect(wrong.startedOn).toEqual(['Enter a date such as 2024-03-12']);
    expect(wrong.status[0]).toMatch(/^Choose a status: planned, in-progress/);
  });

  it('a recipe: each step’s fields keyed by their path', async () => {
    const trial = (await dyer.post('/api/trials').set('Origin', ORIGIN).send({ dryMassG: 10 }).expect(201)).body.trial;
    const fields = fieldsOf(
      await dyer
        .put(`/api/trials/${trial.id}/steps`)
        .set('Origin', ORIGIN)
        .send({
          steps: [
            {
              operation: 'dye-bath',
              minutes: -5,
              temperatureC: null,
              ingredients: [{ kind: 'chemical', refId: 0, amount: null, basis: 'owf' }],
            },
          ],
        }),
    );
    expect(fields['steps.0.minutes']).toEqual(['The time must be 0 min or more']);
    expect(fields['steps.0.ingredients.0.refId']).toEqual(['Choose an ingredient']);
    expect(fields['steps.0.ingredients.0.amount']).toEqual(['Enter the amount']);
  });

  it('a bath: what is missing, and the uptake as the API takes it', async () => {
    const fields = fieldsOf(
      await dyer.post('/api/batches').set('Origin', ORIGIN).send({ uptakePerUse: 10, kind: 'soup' }),
    );
    expect(fields).toMatchObject({
      code: ['Enter the code'],
      name: ['Enter the name'],
      volumeMl: ['Enter the volume in mL'],
      madeOn: ['Enter the date it was made'],
    });
    expect(fields.uptakePerUse).toEqual(['Give the uptake per use as a fraction from 0 to 1 (0.1 = 10 %)']);
    expect(fields.kind[0]).toMatch(/^Choose a kind: mordant-bath/);
  });

  it('a series and an invitation', async () => {
    const series = fieldsOf(
      await dyer.post('/api/series').set('Origin', ORIGIN).send({ code: 'x', factors: [], deadVolumePct: 150 }),
    );
    expect(series).toMatchObject({
      code: ['Use at least 2 characters for the code'],
      title: ['Enter the title'],
      factors: ['Add at least one factor'],
      dryMassG: ['Enter the dry mass per cell in g'],
    });
    expect(series.deadVolumePct).toEqual(['The dead-volume allowance must be 100 % or less']);
    const invite = fieldsOf(
      await admin.post('/api/invitations').set('Origin', ORIGIN).send({ email: null, role: 'boss' }),
    );
    expect(invite.email).toEqual(['Enter the e-mail address']);
    expect(invite.role).toEqual(['Choose a role']);
  });

  it('a shade search with a bad hex or a radius out of range', async () => {
    const hex = fieldsOf(await dyer.get('/api/search/shade?hex=red'));
    expect(hex.hex).toEqual(['Give a colour as six hex digits, e.g. 9b2f2f']);
    const radius = fieldsOf(await dyer.get('/api/search/shade?hex=9b2f2f&maxDeltaE=99'));
    expect(radius.maxDeltaE).toEqual(['Use a radius of at most 30 ΔE00']);
  });
});

import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { sequelize } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import check from '../reference/spectra-check.json' with { type: 'json' };
import scales from '../reference/fastness-scales.json' with { type: 'json' };

const app = createApp();
afterAll(() => sequelize.close());
const post = (path: string, body: unknown) =>
  request(app)
    .post(path)
    .set('Origin', ORIGIN)
    .send(body as object);

// Check values: colour-science 0.4.6, ASTM E308 (tests/reference/spectra-check.json); L*a*b* within 1e-3
// (see tests/unit/spectral.test.ts for the tolerance).
const rose = check.spectra.find((s) => s.case === 'rose')!;
const roseA10 = check.checks.find((c) => c.case === 'rose' && c.illuminant === 'A' && c.observer === '10')!;

describe('POST /api/colour/spectrum', () => {
  it('gives XYZ (white Y = 100) and L*a*b* as colour-science does, from fractions or percentages', async () => {
    for (const values of [rose.values, rose.values.map((v) => v * 100)]) {
      const res = await post('/api/colour/spectrum', {
        spectrum: { startNm: 400, intervalNm: 10, values },
        illuminant: 'A',
        observer: '10',
      }).expect(200);
      expect(Math.abs(res.body.XYZ.Y / 100 - roseA10.XYZ[1])).toBeLessThan(1e-5);
      expect(Math.abs(res.body.lab.L - roseA10.lab[0])).toBeLessThan(1e-3);
      expect(Math.abs(res.body.lab.a - roseA10.lab[1])).toBeLessThan(1e-3);
      expect(Math.abs(res.body.lab.b - roseA10.lab[2])).toBeLessThan(1e-3);
      expect(res.body.white.Y).toBeCloseTo(100, 9);
    }
  });

  it.each([
    [
      'a start outside 360–400 nm',
      { startNm: 420, intervalNm: 10, values: rose.values },
      'spectrum.startNm',
      /360–400 nm/,
    ],
    [
      'a step that is not 1, 5, 10 or 20 nm',
      { startNm: 400, intervalNm: 7, values: rose.values },
      'spectrum.intervalNm',
      /1, 5, 10 or 20 nm/,
    ],
    [
      'too few values for the step',
      { startNm: 400, intervalNm: 10, values: rose.values.slice(0, 20) },
      'spectrum.values',
      /31 to 39 values; these 20 end at 590 nm/,
    ],
    [
      'a negative value',
      { startNm: 400, intervalNm: 10, values: [-0.1, ...rose.values.slice(1)] },
      'spectrum.values',
      /negative: -0.1 at 400 nm/,
    ],
    [
      'a value above 150 %',
      { startNm: 400, intervalNm: 10, values: [...rose.values.slice(0, 30), 400] },
      'spectrum.values',
      /0–150 %: 400 at 700 nm/,
    ],
    [
      'text for a value',
      { startNm: 400, intervalNm: 10, values: ['x', ...rose.values.slice(1)] },
      'spectrum.values.0',
      /must be a number/,
    ],
  ])('refuses %s with a message beside the field', async (_what, spectrum, field, message) => {
    const res = await post('/api/colour/spectrum', { spectrum, illuminant: 'D65', observer: '2' }).expect(400);
    expect(res.body.error.details.fields[field][0]).toMatch(message);
  });

  it('takes the unit when given: a black at 1 % is not a white at 1.0', async () => {
    const ones = { startNm: 400, intervalNm: 10, values: Array(31).fill(1) };
    const white = await post('/api/colour/spectrum', { spectrum: ones }).expect(200);
    const black = await post('/api/colour/spectrum', { spectrum: { ...ones, unit: 'percent' } }).expect(200);
    expect(white.body.XYZ.Y).toBeCloseTo(100, 9);
    expect(black.body.XYZ.Y).toBeCloseTo(1, 9);
  });

  it('never answers 5xx on malformed bodies', async () => {
    for (const body of [
      null,
      [],
      'x',
      { spectrum: null },
      { spectrum: { values: {} } },
      { spectrum: rose, illuminant: 'Z' },
    ])
      expect((await post('/api/colour/spectrum', body)).status).toBe(400);
  });
});

describe('POST /api/colour/metamerism', () => {
  it('gives ΔE00 under each illuminant, the worst, the index and words', async () => {
    const sample = { startNm: 400, intervalNm: 10, values: rose.values.map((v, i) => v * (1 + 0.1 * Math.sin(i / 3))) };
    const res = await post('/api/colour/metamerism', { reference: rose, sample, observer: '10' }).expect(200);
    expect(res.body.byIlluminant.map((r: { illuminant: string }) => r.illuminant)).toEqual([
      'D65',
      'D50',
      'A',
      'F2',
      'F11',
      'LED-B3',
    ]);
    const worst = Math.max(...res.body.byIlluminant.map((r: { deltaE00: number }) => r.deltaE00));
    expect(res.body.worst.deltaE00).toBe(worst);
    expect(res.body.index).toBeGreaterThan(0);
    expect(res.body.summary).toMatch(/daylight/);
  });
  it('answers a perfect black sample without an index rather than failing', async () => {
    const black = { startNm: 400, intervalNm: 10, values: Array(31).fill(0) };
    const res = await post('/api/colour/metamerism', { reference: rose, sample: black }).expect(200);
    expect(res.body.index).toBeNull();
    expect(res.body.byIlluminant[1].corrected).toBeNull();
    expect(res.body.worst.deltaE00).toBeGreaterThan(10);
  });
  it('refuses a bad sample spectrum beside its field', async () => {
    const res = await post('/api/colour/metamerism', { reference: rose, sample: { ...rose, startNm: 300 } }).expect(
      400,
    );
    expect(res.body.error.details.fields['sample.startNm'][0]).toMatch(/360–400 nm/);
  });
});

describe('POST /api/colour/grey-scale', () => {
  // ISO 105-A02 nominal differences (tests/reference/fastness-scales.json): a neutral pair 3.4 apart is grade 3 for change.
  it('grades a neutral pair at a nominal difference', async () => {
    const three = scales.find((s) => s.scale === 'grey scale for change in colour' && s.grade === '3')!;
    const res = await post('/api/colour/grey-scale', {
      reference: { L: 60, a: 0, b: 0 },
      sample: { L: 60 - three.dE_ab_nominal!, a: 0, b: 0 },
    }).expect(200);
    expect(res.body.change).toMatchObject({ step: '3', grade: 3 });
    expect(res.body.staining.step).toBe('4'); // 5 − 0.23 × 3.4 = 4.22
    expect(res.body.sources.change).toMatch(/ISO 105-A05.*memory/);
  });
  it('refuses a missing L*', async () => {
    const res = await post('/api/colour/grey-scale', {
      reference: { a: 0, b: 0 },
      sample: { L: 50, a: 0, b: 0 },
    }).expect(400);
    expect(res.body.error.details.fields['reference.L'][0]).toMatch(/L\*/);
  });
});

describe('fastness records with readings', () => {
  // ISO 105-A02/A03 nominal differences (tests/reference/fastness-scales.json): a neutral pair 3.4 apart is grade 3
  // for change in colour; the staining pair 4.3 apart (nominal grade 3 of the staining scale) grades near 3.
  it('stores the before/after readings and presents the computed grade beside the assessor’s', async () => {
    const dyer = await signedInAgent(app, 'dyer');
    const three = scales.find((s) => s.scale === 'grey scale for change in colour' && s.grade === '3')!;
    const created = await dyer.post('/api/trials').set('Origin', ORIGIN).send({ dryMassG: 10 }).expect(201);
    const id = created.body.trial.id;
    expect(created.body.trial.fastnessComputed).toEqual([]);
    const fastness = {
      washing: {
        change: '3-4',
        readings: {
          change: { before: { L: 60, a: 0, b: 0 }, after: { L: 60 - three.dE_ab_nominal!, a: 0, b: 0 } },
        },
      },
      rubbingDry: {
        staining: '4',
        readings: { staining: { before: { L: 95, a: 0, b: 0 }, after: { L: 95, a: 0, b: 0 } } },
      },
    };
    await dyer.patch(`/api/trials/${id}`).set('Origin', ORIGIN).send({ fastness }).expect(200);
    const { trial } = (await dyer.get(`/api/trials/${id}`).expect(200)).body;
    expect(trial.fastness.washing.readings.change.after.L).toBeCloseTo(60 - three.dE_ab_nominal!, 9);
    expect(trial.fastnessComputed).toHaveLength(2);
    expect(trial.fastnessComputed[0]).toMatchObject({
      test: 'washing',
      scale: 'change',
      assessor: '3-4',
      computed: { step: '3', grade: 3 },
    });
    expect(trial.fastnessComputed[0].source).toMatch(/ISO 105-A05/);
    // No staining at all: grade 5 (ISO 105-A04).
    expect(trial.fastnessComputed[1]).toMatchObject({ test: 'rubbingDry', scale: 'staining', assessor: '4' });
    expect(trial.fastnessComputed[1].computed.step).toBe('5');
    const bad = await dyer
      .patch(`/api/trials/${id}`)
      .set('Origin', ORIGIN)
      .send({
        fastness: { washing: { readings: { change: { before: { L: 60, a: 0 }, after: { L: 50, a: 0, b: 0 } } } } },
      })
      .expect(400);
    expect(Object.keys(bad.body.error.details.fields).join(' ')).toMatch(
      /fastness\.washing\.readings\.change\.before\.b/,
    );
  });
});

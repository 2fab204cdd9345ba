import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { sequelize } from '../../server/models/index.ts';
import { makeMeasurement, makePiece } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import check from '../reference/spectra-check.json' with { type: 'json' };

// A reading may carry its reflectance spectrum: its L*a*b* is computed for its own illuminant and
// observer (checked against colour-science 0.4.6, tests/reference/spectra-check.json, within 1e-3),
// comparisons use it under the target's conditions, and a spectral original gives the metamerism table.
const app = createApp();
let dyer: Awaited<ReturnType<typeof signedInAgent>>;
beforeAll(async () => {
  dyer = await signedInAgent(app, 'dyer');
});
afterAll(() => sequelize.close());

const rose = check.spectra.find((s) => s.case === 'rose')!;
const straw = check.spectra.find((s) => s.case === 'straw')!;
const at = (c: string, ill: string, obs: string) =>
  check.checks.find((x) => x.case === c && x.illuminant === ill && x.observer === obs)!;
const spectrum = (s: typeof rose) => ({ startNm: s.startNm, intervalNm: s.intervalNm, values: s.values });

async function trialAiming(
  targetSpectrum: { startNm: number; intervalNm: number; values: number[] } | null,
  lab = { L: 60, a: 31, b: 27 },
  illuminant = 'A',
) {
  const piece = await makePiece();
  const target = await makeMeasurement({
    pieceId: piece.id,
    L: lab.L,
    a: lab.a,
    b: lab.b,
    illuminant,
    observer: '10',
    spectrum: targetSpectrum,
  });
  const res = await dyer
    .post(`/api/pieces/${piece.id}/trials`)
    .set('Origin', ORIGIN)
    .send({ dryMassG: 20, targetMeasurementId: target.id })
    .expect(201);
  return res.body.trial.id as number;
}

describe('spectral readings of a trial', () => {
  it('stores the spectrum, as fractions, and L*a*b* computed for the reading’s own conditions', async () => {
    const id = await trialAiming(null);
    const res = await dyer
      .post(`/api/trials/${id}/measurements`)
      .set('Origin', ORIGIN)
      .send({
        spectrum: { ...spectrum(rose), values: rose.values.map((v) => v * 100) },
        illuminant: 'D50',
        observer: '2',
      })
      .expect(201);
    const m = res.body.measurement;
    const want = at('rose', 'D50', '2').lab;
    expect(Math.abs(m.L - want[0])).toBeLessThan(1e-3);
    expect(Math.abs(m.a - want[1])).toBeLessThan(1e-3);
    expect(Math.abs(m.b - want[2])).toBeLessThan(1e-3);
    expect(m.spectrum.values[0]).toBeCloseTo(rose.values[0], 12);
  });

  it('compares a spectral reading under the target’s conditions (A/10°), even when taken as D65/2°', async () => {
    const want = at('rose', 'A', '10').lab;
    const id = await trialAiming(null, { L: want[0], a: want[1], b: want[2] });
    await dyer
      .post(`/api/trials/${id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ spectrum: spectrum(rose), illuminant: 'D65', observer: '2' })
      .expect(201);
    const { colour } = (await dyer.get(`/api/trials/${id}`).expect(200)).body.trial;
    expect(colour.missing).toBeNull();
    expect(colour.conditions).toMatchObject({ illuminant: 'A', targetObserver: '10', resultObserver: '10' });
    expect(colour.result.label).toMatch(/spectrum computed for A\/10°/);
    expect(colour.difference.deltaE00).toBeLessThan(0.01);
  });

  it('gives the metamerism table when the original is a spectrum too', async () => {
    const id = await trialAiming(spectrum(rose));
    await dyer
      .post(`/api/trials/${id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ spectrum: spectrum(straw), illuminant: 'D65', observer: '10' })
      .expect(201);
    const { colour } = (await dyer.get(`/api/trials/${id}`).expect(200)).body.trial;
    const m = colour.metamerism;
    expect(m.byIlluminant).toHaveLength(6);
    expect(m.observer).toBe('10');
    expect(m.sample.spectrum.values).toHaveLength(31);
    expect(m.summary).toMatch(/daylight/);
    expect(m.worst.deltaE00).toBe(Math.max(...m.byIlluminant.map((r: { deltaE00: number }) => r.deltaE00)));
  });

  it('refuses a bad spectrum beside its field, and L*a*b* are then not asked for', async () => {
    const id = await trialAiming(null);
    const res = await dyer
      .post(`/api/trials/${id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ spectrum: { startNm: 400, intervalNm: 10, values: rose.values.slice(0, 10) } })
      .expect(400);
    expect(res.body.error.details.fields['spectrum.values'][0]).toMatch(/31 to 39 values/);
    expect(res.body.error.details.fields.L).toBeUndefined();
    const none = await dyer.post(`/api/trials/${id}/measurements`).set('Origin', ORIGIN).send({}).expect(400);
    expect(none.body.error.details.fields.L[0]).toMatch(/Enter L\*/);
  });

  // The CIE LED illuminant of CIE 015:2018 (LED-B3) is a viewing condition like the others: a reading may
  // be taken under it and a comparison made under it (check values: colour-science 0.4.6, spectra-check.json).
  it('takes LED-B3 as a reading’s conditions and compares under it', async () => {
    const want = at('rose', 'LED-B3', '10').lab;
    const id = await trialAiming(null, { L: want[0], a: want[1], b: want[2] }, 'LED-B3');
    const typed = await dyer
      .post(`/api/trials/${id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ spectrum: spectrum(rose), illuminant: 'LED-B3', observer: '10' })
      .expect(201);
    expect(typed.body.measurement.illuminant).toBe('LED-B3');
    expect(Math.abs(typed.body.measurement.L - want[0])).toBeLessThan(1e-3);
    const { colour } = (await dyer.get(`/api/trials/${id}`).expect(200)).body.trial;
    expect(colour.conditions).toMatchObject({ illuminant: 'LED-B3', targetObserver: '10' });
    expect(colour.difference.deltaE00).toBeLessThan(0.01);
    const csv = 'L,a,b,illuminant/observer\n50,10,5,LED-B3/10\n';
    const imported = await dyer
      .post(`/api/trials/${id}/measurements/import`)
      .set('Origin', ORIGIN)
      .set('Content-Type', 'text/csv')
      .send(csv)
      .expect(201);
    expect(imported.body.measurements[0]).toMatchObject({ illuminant: 'LED-B3', observer: '10' });
  });
});

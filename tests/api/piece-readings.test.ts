import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { AuditEvent, Trial, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { describeHistory } from '../../shared/history-words.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import check from '../reference/spectra-check.json' with { type: 'json' };

// Readings of the original itself (issue 17, point 2): a curator or researcher enters the piece's own spectrum,
// a dyer's trial aims at it, and with a spectral result the trial gives the metamerism table. L*a*b* from the
// spectrum checked against colour-science 0.4.6 (tests/reference/spectra-check.json) within 1e-3.
const app = createApp();
let researcher: Awaited<ReturnType<typeof signedInAgent>>;
let dyer: Awaited<ReturnType<typeof signedInAgent>>;
beforeAll(async () => {
  researcher = await signedInAgent(app, 'researcher');
  dyer = await signedInAgent(app, 'dyer');
});
afterAll(() => sequelize.close());

const rose = check.spectra.find((s) => s.case === 'rose')!;
const straw = check.spectra.find((s) => s.case === 'straw')!;
const at = (c: string, ill: string, obs: string) =>
  check.checks.find((x) => x.case === c && x.illuminant === ill && x.observer === obs)!;
const spectrum = (s: typeof rose) => ({ startNm: s.startNm, intervalNm: s.intervalNm, values: s.values });

describe('readings of the original', () => {
  it('takes a spectrum (in %) of the piece, computes L*a*b* for its conditions and writes the history', async () => {
    const piece = await makePiece();
    const res = await researcher
      .post(`/api/pieces/${piece.id}/measurements`)
      .set('Origin', ORIGIN)
      .send({
        spectrum: { ...spectrum(rose), values: rose.values.map((v) => v * 100) },
        illuminant: 'D65',
        observer: '10',
        label: 'rose ground',
      })
      .expect(201);
    const m = res.body.measurement;
    const want = at('rose', 'D65', '10').lab;
    expect(Math.abs(m.L - want[0])).toBeLessThan(1e-3);
    expect(Math.abs(m.a - want[1])).toBeLessThan(1e-3);
    expect(Math.abs(m.b - want[2])).toBeLessThan(1e-3);
    expect(m.label).toBe('rose ground');
    expect(m.spectrum.values[3]).toBeCloseTo(rose.values[3], 12);
    // Offered as a trial target.
    const listed = await dyer.get(`/api/pieces/${piece.id}/trials`).expect(200);
    expect(listed.body.targets.measurements.map((x: { id: number }) => x.id)).toContain(m.id);
    const event = await AuditEvent.findOne({
      where: { entity: 'piece', entityId: piece.id, action: 'reading-added' },
      rejectOnEmpty: true,
    });
    expect(describeHistory(event.get({ plain: true }) as never)).toBe(
      'reading of the original added ‘rose ground’ (spectrum)',
    );
  });

  it('gives the metamerism table once the dyer’s result is a spectrum too', async () => {
    const piece = await makePiece();
    const target = await researcher
      .post(`/api/pieces/${piece.id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ spectrum: spectrum(rose), label: 'rose ground' })
      .expect(201);
    const trial = await dyer
      .post(`/api/pieces/${piece.id}/trials`)
      .set('Origin', ORIGIN)
      .send({ dryMassG: 15, targetMeasurementId: target.body.measurement.id })
      .expect(201);
    const id = trial.body.trial.id;
    await dyer
      .post(`/api/trials/${id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ spectrum: spectrum(straw) })
      .expect(201);
    const { colour } = (await dyer.get(`/api/trials/${id}`).expect(200)).body.trial;
    expect(colour.metamerism.byIlluminant.map((r: { illuminant: string }) => r.illuminant)).toContain('LED-B3');
    expect(colour.metamerism.byIlluminant).toHaveLength(6);

    // Removing the reading takes it away as the trial's target too, in the same transaction.
    await researcher
      .delete(`/api/pieces/${piece.id}/measurements/${target.body.measurement.id}`)
      .set('Origin', ORIGIN)
      .expect(204);
    expect((await Trial.findByPk(id, { rejectOnEmpty: true })).targetMeasurementId).toBeNull();
    expect(await AuditEvent.count({ where: { entity: 'piece', entityId: piece.id, action: 'reading-removed' } })).toBe(
      1,
    );
  });

  it('refuses dyers, bad spectra beside their field, and readings of a trial through the piece', async () => {
    const piece = await makePiece();
    const body = { L: 40, a: 30, b: 20 };
    const no = await dyer.post(`/api/pieces/${piece.id}/measurements`).set('Origin', ORIGIN).send(body).expect(403);
    expect(no.body.error.message).toMatch(/curators and researchers/);
    const bad = await researcher
      .post(`/api/pieces/${piece.id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ spectrum: { startNm: 400, intervalNm: 10, values: rose.values.slice(0, 10) } })
      .expect(400);
    expect(bad.body.error.details.fields['spectrum.values'][0]).toMatch(/31 to 39 values/);
    const led = await researcher
      .post(`/api/pieces/${piece.id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ ...body, illuminant: 'LED-B3' })
      .expect(201);
    expect(led.body.measurement.illuminant).toBe('LED-B3');
    const wrong = await researcher
      .post(`/api/pieces/${piece.id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ ...body, illuminant: 'LED-X9' })
      .expect(400);
    expect(wrong.body.error.details.fields.illuminant).toBeDefined();
    const other = await makePiece();
    await researcher
      .delete(`/api/pieces/${other.id}/measurements/${led.body.measurement.id}`)
      .set('Origin', ORIGIN)
      .expect(404);
  });
});

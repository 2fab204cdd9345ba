import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import compounds from '../reference/mordant-compounds.json' with { type: 'json' };
import { createApp } from '../../server/app.ts';
import { AuditEvent, Chemical, sequelize } from '../../server/models/index.ts';
import { ORIGIN, signedInAgent, type DemoRole } from '../support/agents.ts';
import type { ChemicalView } from '../../shared/schemas/reference.ts';

const app = createApp();
const suffix = `${process.pid}-${Date.now()}`;
let made: Chemical;

beforeAll(async () => {
  made = await Chemical.create({
    name: `test chromate ${suffix}`,
    role: 'mordant',
    formula: 'K2Cr2O7',
    metal: 'Cr',
    status: 'historical-only',
    signalWord: 'Danger',
    hStatements: ['H350 May cause cancer.'],
    ppe: 'do not handle',
    caution: 'Historical only.',
    source: 'test row',
    hazardSource: 'test row',
  });
});
afterAll(async () => {
  if (made) await AuditEvent.destroy({ where: { entity: 'chemical', entityId: made.id } });
  await made?.destroy();
  await sequelize.close();
});

describe('GET /api/chemicals', () => {
  it('computes molar mass and metal fraction from the formula (IUPAC 2021, tests/reference/mordant-compounds.json)', async () => {
    const res = await request(app).get('/api/chemicals').query({ pageSize: 200 }).expect(200);
    expect(res.body).toMatchObject({ page: 1, pageSize: 200, total: expect.any(Number) });
    const items = res.body.items as ChemicalView[];
    let checked = 0;
    for (const ref of compounds) {
      const row = items.find((c) => c.formula === ref.formula);
      if (!row) continue;
      checked++;
      expect(Math.abs(row.molarMass! - ref.molar_mass_g_per_mol), ref.formula).toBeLessThanOrEqual(0.5e-3);
      if (row.metal && ref.metal_mass_fraction[row.metal as keyof typeof ref.metal_mass_fraction] !== undefined) {
        expect(Math.abs(row.metalMassFraction! - ref.metal_mass_fraction[row.metal as keyof typeof ref.metal_mass_fraction]!)).toBeLessThanOrEqual(0.5e-6);
      }
    }
    expect(checked).toBeGreaterThanOrEqual(10);
    const lead = items.find((c) => c.formula === 'Pb(CH3COO)2·3H2O')!;
    expect(lead).toMatchObject({ metal: 'Pb', status: 'historical-only', ghs: { signalWord: 'Danger' } });
    expect(lead.ghs.hStatements.length).toBeGreaterThan(0);
    expect(lead.ghs.source).toEqual(expect.any(String));
    expect(Object.keys(lead).sort()).toEqual(
      ['atomicWeightsSource', 'formula', 'ghs', 'id', 'metal', 'metalMassFraction', 'molarMass', 'name', 'role', 'source', 'status'].sort(),
    );
    const guar = items.find((c) => c.name === 'guar gum');
    if (guar) expect(guar).toMatchObject({ formula: null, molarMass: null, metalMassFraction: null });
  });

  it('serves one chemical by id, with the same computed fields', async () => {
    const res = await request(app).get(`/api/chemicals/${made.id}`).expect(200);
    // K2Cr2O7: 294.181 g/mol, Cr 0.353497 (tests/reference/mordant-compounds.json, IUPAC 2021).
    expect(res.body.molarMass).toBeCloseTo(294.181, 3);
    expect(res.body.metalMassFraction).toBeCloseTo(0.353497, 6);
    expect(res.body.ghs).toEqual({ signalWord: 'Danger', hStatements: ['H350 May cause cancer.'], ppe: 'do not handle', caution: 'Historical only.', source: 'test row' });
  });

  it('filters by role, status and text', async () => {
    const res = await request(app).get('/api/chemicals').query({ status: 'historical-only', q: suffix }).expect(200);
    expect(res.body.items.map((c: ChemicalView) => c.id)).toEqual([made.id]);
    const thick = await request(app).get('/api/chemicals').query({ role: 'thickener' }).expect(200);
    expect(thick.body.items.every((c: ChemicalView) => c.role === 'thickener')).toBe(true);
  });

  it('answers 404 for a missing chemical and 400 for a bad id or filter', async () => {
    const missing = await request(app).get('/api/chemicals/999999999').expect(404);
    expect(missing.body.error.code).toBe('not_found');
    const bad = await request(app).get('/api/chemicals/abc').expect(400);
    expect(bad.body.error.details.fields).toHaveProperty('id');
    await request(app).get('/api/chemicals').query({ status: 'banned' }).expect(400);
  });
});

describe('GET /api/dyestuffs', () => {
  it('lists dyestuffs with their C.I. generic names', async () => {
    const res = await request(app).get('/api/dyestuffs').expect(200);
    const madder = res.body.items.find((d: { name: string }) => d.name === 'madder');
    expect(madder).toMatchObject({ ciName: 'C.I. Natural Red 8', source: expect.any(String) });
    const one = await request(app).get(`/api/dyestuffs/${madder.id}`).expect(200);
    expect(one.body.name).toBe('madder');
  });
});

describe('reference role matrix', () => {
  // reference:read is open to every role and to signed-out visitors.
  const routes = ['/api/chemicals', '/api/dyestuffs'];
  it.each([null, 'admin', 'curator', 'researcher', 'dyer'] as Array<DemoRole | null>)('%s may read the reference', async (role) => {
    const agent = role ? await signedInAgent(app, role) : request.agent(app);
    for (const r of routes) await agent.get(r).expect(200);
    await agent.get(`/api/chemicals/${made.id}`).expect(200);
  });
});

describe('PATCH /api/chemicals/:id (admin keeps the reference)', () => {
  it('lets an admin change hazard data and the formula, recomputes the derived fields and audits the change', async () => {
    const admin = await signedInAgent(app, 'admin');
    const res = await admin
      .patch(`/api/chemicals/${made.id}`)
      .set('Origin', ORIGIN)
      .send({ formula: 'Pb(CH3COO)2·3H2O', metal: 'Pb', hStatements: ['H360Df May damage the unborn child.'] })
      .expect(200);
    // Pb(CH3COO)2·3H2O: 379.333 g/mol, Pb 0.546222 (tests/reference/mordant-compounds.json, IUPAC 2021).
    expect(res.body.molarMass).toBeCloseTo(379.333, 3);
    expect(res.body.metalMassFraction).toBeCloseTo(0.546222, 6);
    expect(res.body.ghs.hStatements).toEqual(['H360Df May damage the unborn child.']);
    const audit = await AuditEvent.findOne({ where: { entity: 'chemical', entityId: made.id }, order: [['id', 'DESC']] });
    expect(audit?.changes).toMatchObject({ formula: { from: 'K2Cr2O7', to: 'Pb(CH3COO)2·3H2O' }, metal: { from: 'Cr', to: 'Pb' } });
  });

  it('refuses a formula that does not parse, with the field named', async () => {
    const admin = await signedInAgent(app, 'admin');
    const res = await admin.patch(`/api/chemicals/${made.id}`).set('Origin', ORIGIN).send({ formula: 'KAl(SO4' }).expect(400);
    expect(res.body.error.details.fields).toHaveProperty('formula');
    await admin.patch(`/api/chemicals/${made.id}`).set('Origin', ORIGIN).send({}).expect(400);
  });

  it('answers 401 signed out, 403 for other roles, 403 without the Origin header, 404 for a missing row', async () => {
    await request(app).patch(`/api/chemicals/${made.id}`).set('Origin', ORIGIN).send({ status: 'permitted' }).expect(401);
    for (const role of ['curator', 'researcher', 'dyer'] as const) {
      const agent = await signedInAgent(app, role);
      await agent.patch(`/api/chemicals/${made.id}`).set('Origin', ORIGIN).send({ status: 'permitted' }).expect(403);
    }
    const admin = await signedInAgent(app, 'admin');
    await admin.patch(`/api/chemicals/${made.id}`).send({ status: 'permitted' }).expect(403);
    await admin.patch('/api/chemicals/999999999').set('Origin', ORIGIN).send({ status: 'permitted' }).expect(404);
    expect((await Chemical.findByPk(made.id))?.status).toBe('historical-only');
  });
});

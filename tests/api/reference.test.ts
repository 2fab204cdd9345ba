import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import compounds from '../reference/mordant-compounds.json' with { type: 'json' };
import seedChemicals from '../../server/seed/data/chemicals.json' with { type: 'json' };
import { createApp } from '../../server/app.ts';
import { Op } from 'sequelize';
import { AuditEvent, Chemical, Dyestuff, sequelize } from '../../server/models/index.ts';
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
  const added = await Chemical.findAll({ where: { name: { [Op.like]: `%${suffix}%` } } });
  await AuditEvent.destroy({ where: { entity: 'chemical', entityId: added.map((c) => c.id) } });
  await Chemical.destroy({ where: { id: added.map((c) => c.id) } });
  const addedDyes = await Dyestuff.findAll({ where: { name: { [Op.like]: `%${suffix}%` } } });
  await AuditEvent.destroy({ where: { entity: 'dyestuff', entityId: addedDyes.map((d) => d.id) } });
  await Dyestuff.destroy({ where: { id: addedDyes.map((d) => d.id) } });
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
        expect(
          Math.abs(
            row.metalMassFraction! - ref.metal_mass_fraction[row.metal as keyof typeof ref.metal_mass_fraction]!,
          ),
        ).toBeLessThanOrEqual(0.5e-6);
      }
    }
    expect(checked).toBeGreaterThanOrEqual(10);
    const lead = items.find((c) => c.formula === 'Pb(CH3COO)2·3H2O')!;
    expect(lead).toMatchObject({ metal: 'Pb', status: 'historical-only', ghs: { signalWord: 'Danger' } });
    expect(lead.ghs.hStatements.length).toBeGreaterThan(0);
    expect(lead.ghs.source).toEqual(expect.any(String));
    expect(Object.keys(lead).sort()).toEqual(
      [
        'atomicWeightsSource',
        'formula',
        'ghs',
        'id',
        'metal',
        'metalMassFraction',
        'molarMass',
        'name',
        'role',
        'source',
        'status',
      ].sort(),
    );
    const guar = items.find((c) => c.name === 'guar gum');
    if (guar) expect(guar).toMatchObject({ formula: null, molarMass: null, metalMassFraction: null });
  });

  it('serves one chemical by id, with the same computed fields', async () => {
    const res = await request(app).get(`/api/chemicals/${made.id}`).expect(200);
    // K2Cr2O7: 294.181 g/mol, Cr 0.353497 (tests/reference/mordant-compounds.json, IUPAC 2021).
    expect(res.body.molarMass).toBeCloseTo(294.181, 3);
    expect(res.body.metalMassFraction).toBeCloseTo(0.353497, 6);
    expect(res.body.ghs).toEqual({
      signalWord: 'Danger',
      hStatements: ['H350 May cause cancer.'],
      labelStatements: ['H350 May cause cancer.'],
      ppe: 'do not handle',
      caution: 'Historical only.',
      source: 'test row',
      basis: null,
    });
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
  it.each([null, 'admin', 'curator', 'researcher', 'dyer'] as Array<DemoRole | null>)(
    '%s may read the reference',
    async (role) => {
      const agent = role ? await signedInAgent(app, role) : request.agent(app);
      for (const r of routes) await agent.get(r).expect(200);
      await agent.get(`/api/chemicals/${made.id}`).expect(200);
    },
  );
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
    const audit = await AuditEvent.findOne({
      where: { entity: 'chemical', entityId: made.id },
      order: [['id', 'DESC']],
    });
    expect(audit?.changes).toMatchObject({
      formula: { from: 'K2Cr2O7', to: 'Pb(CH3COO)2·3H2O' },
      metal: { from: 'Cr', to: 'Pb' },
    });
  });

  it('refuses a formula that does not parse, with the field named', async () => {
    const admin = await signedInAgent(app, 'admin');
    const res = await admin
      .patch(`/api/chemicals/${made.id}`)
      .set('Origin', ORIGIN)
      .send({ formula: 'KAl(SO4' })
      .expect(400);
    expect(res.body.error.details.fields).toHaveProperty('formula');
    await admin.patch(`/api/chemicals/${made.id}`).set('Origin', ORIGIN).send({}).expect(400);
    const at = await admin
      .patch(`/api/chemicals/${made.id}`)
      .set('Origin', ORIGIN)
      .send({ formula: 'CaSO4.0.5H2O!' })
      .expect(400);
    expect(at.body.error.details.fields.formula[0]).toMatch(/^Unexpected "!" at position 13\./);
    // The row's metal (Pb after the edit above) must occur in a new formula.
    const metal = await admin
      .patch(`/api/chemicals/${made.id}`)
      .set('Origin', ORIGIN)
      .send({ formula: 'K2Cr2O7' })
      .expect(400);
    expect(metal.body.error.details.fields.formula).toEqual(['The formula has no Pb']);
    const taken = await admin
      .patch(`/api/chemicals/${made.id}`)
      .set('Origin', ORIGIN)
      .send({ name: 'potash alum' })
      .expect(409);
    expect(taken.body.error.details.fields.name).toEqual(['A chemical with this name already exists']);
  });

  it('answers 401 signed out, 403 for other roles, 403 without the Origin header, 404 for a missing row', async () => {
    await request(app)
      .patch(`/api/chemicals/${made.id}`)
      .set('Origin', ORIGIN)
      .send({ status: 'permitted' })
      .expect(401);
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

describe('POST /api/chemicals (admin adds to the reference)', () => {
  const body = (over: Record<string, unknown> = {}) => ({
    name: `test gypsum ${suffix}`,
    role: 'assistant',
    status: 'permitted',
    formula: 'CaSO4·½H2O',
    metal: '',
    source: 'test row',
    hazardBasis: 'supplier',
    hazardSource: 'test supplier SDS',
    ...over,
  });

  it('adds a chemical with a fractional hydrate, computes its molar mass and audits the addition', async () => {
    const admin = await signedInAgent(app, 'admin');
    const res = await admin.post('/api/chemicals').set('Origin', ORIGIN).send(body()).expect(201);
    // CaSO4·½H2O = 145.1415 g/mol from IUPAC 2021 abridged atomic weights (tests/reference/atomic-weights.json), summed by hand.
    expect(res.body).toMatchObject({
      name: `test gypsum ${suffix}`,
      formula: 'CaSO4·½H2O',
      metal: null,
      ghs: { signalWord: null, hStatements: [], basis: 'supplier', source: 'test supplier SDS' },
    });
    expect(res.body.molarMass).toBeCloseTo(145.1415, 4);
    const audit = await AuditEvent.findOne({ where: { entity: 'chemical', entityId: res.body.id, action: 'create' } });
    expect(audit?.changes).toMatchObject({
      name: { from: null, to: `test gypsum ${suffix}` },
      formula: { from: null, to: 'CaSO4·½H2O' },
    });
    // A decimal hydrate with a full stop as the hydrate dot: Al2(SO4)3·14.3H2O = 599.7465 g/mol (IUPAC 2021, by hand).
    const dec = await admin
      .post('/api/chemicals')
      .set('Origin', ORIGIN)
      .send(body({ name: `test alum cake ${suffix}`, formula: 'Al2(SO4)3.14.3H2O', metal: 'Al', role: 'mordant' }))
      .expect(201);
    expect(dec.body.molarMass).toBeCloseTo(599.7465, 4);
  });

  it('answers 409 with a clear message for a name already in the reference', async () => {
    const admin = await signedInAgent(app, 'admin');
    const res = await admin
      .post('/api/chemicals')
      .set('Origin', ORIGIN)
      .send(body({ name: 'potash alum' }))
      .expect(409);
    expect(res.body.error.message).toBe(
      'A chemical named "potash alum" is already in the reference; edit that one instead.',
    );
    expect(res.body.error.details.fields.name).toEqual(['A chemical with this name already exists']);
  });

  it('refuses a formula it cannot read with the position of the fault, and a metal the formula lacks', async () => {
    const admin = await signedInAgent(app, 'admin');
    const res = await admin
      .post('/api/chemicals')
      .set('Origin', ORIGIN)
      .send(body({ name: `test bad ${suffix}`, formula: 'CaSO4·x' }))
      .expect(400);
    expect(res.body.error.details.fields.formula[0]).toMatch(/^Unexpected "x" at position 7\./);
    const decimal = await admin
      .post('/api/chemicals')
      .set('Origin', ORIGIN)
      .send(body({ name: `test bad ${suffix}`, formula: 'Fe1.5O' }))
      .expect(400);
    expect(decimal.body.error.details.fields.formula[0]).toMatch(/at position 4/);
    const metal = await admin
      .post('/api/chemicals')
      .set('Origin', ORIGIN)
      .send(body({ name: `test bad ${suffix}`, metal: 'Pb' }))
      .expect(400);
    expect(metal.body.error.details.fields.metal).toEqual(['The formula has no Pb']);
    const missing = await admin.post('/api/chemicals').set('Origin', ORIGIN).send({}).expect(400);
    expect(Object.keys(missing.body.error.details.fields)).toEqual(
      expect.arrayContaining(['name', 'role', 'status', 'source']),
    );
    expect(await Chemical.count({ where: { name: `test bad ${suffix}` } })).toBe(0);
  });

  it('answers 401 signed out and 403 for other roles', async () => {
    await request(app)
      .post('/api/chemicals')
      .set('Origin', ORIGIN)
      .send(body({ name: `test denied ${suffix}` }))
      .expect(401);
    for (const role of ['curator', 'researcher', 'dyer'] as const) {
      const agent = await signedInAgent(app, role);
      await agent
        .post('/api/chemicals')
        .set('Origin', ORIGIN)
        .send(body({ name: `test denied ${suffix}` }))
        .expect(403);
    }
    expect(await Chemical.count({ where: { name: `test denied ${suffix}` } })).toBe(0);
  });
});

describe('POST /api/dyestuffs (admin adds to the reference)', () => {
  it('adds a dyestuff, answers 409 for a taken name and 400 without a source', async () => {
    const admin = await signedInAgent(app, 'admin');
    const res = await admin
      .post('/api/dyestuffs')
      .set('Origin', ORIGIN)
      .send({ name: `test dyer's broom ${suffix}`, ciName: '', dyeClass: 'flavonoid', source: 'test row' })
      .expect(201);
    expect(res.body).toMatchObject({
      name: `test dyer's broom ${suffix}`,
      ciName: null,
      dyeClass: 'flavonoid',
      colorants: null,
    });
    expect(await AuditEvent.count({ where: { entity: 'dyestuff', entityId: res.body.id, action: 'create' } })).toBe(1);
    const dup = await admin
      .post('/api/dyestuffs')
      .set('Origin', ORIGIN)
      .send({ name: 'madder', source: 'test row' })
      .expect(409);
    expect(dup.body.error.message).toBe('A dyestuff named "madder" is already in the reference.');
    const bad = await admin
      .post('/api/dyestuffs')
      .set('Origin', ORIGIN)
      .send({ name: `test nosource ${suffix}` })
      .expect(400);
    expect(bad.body.error.details.fields).toHaveProperty('source');
    for (const role of ['curator', 'researcher', 'dyer'] as const) {
      const agent = await signedInAgent(app, role);
      await agent
        .post('/api/dyestuffs')
        .set('Origin', ORIGIN)
        .send({ name: `test denied ${suffix}`, source: 'x' })
        .expect(403);
    }
  });
});

describe('hazard data with its provenance', () => {
  it('names the basis of every seeded chemical and shows H410 without H400 as a label does', async () => {
    const res = await request(app).get('/api/chemicals').query({ pageSize: 200 }).expect(200);
    const items = res.body.items as ChemicalView[];
    const seedNames = new Set((seedChemicals as Array<{ name: string }>).map((c) => c.name));
    const seeded = items.filter((c) => seedNames.has(c.name));
    expect(seeded.length).toBe(seedNames.size);
    for (const c of seeded) {
      expect(c.ghs.basis, c.name).toMatch(/^(harmonised|supplier|memory)$/);
      expect(c.ghs.source, c.name).toEqual(expect.any(String));
    }
    const lead = items.find((c) => c.formula === 'Pb(CH3COO)2·3H2O')!;
    // EU CLP Annex VI index 082-005-00-8 (lead di(acetate)), recalled from memory: tests/reference/ghs.json.
    expect(lead.ghs.basis).toBe('harmonised');
    expect(lead.ghs.source).toMatch(/Annex VI index 082-005-00-8/);
    const codes = (hs: string[]) => hs.map((h) => h.split(' ')[0]);
    expect(codes(lead.ghs.hStatements)).toEqual(['H360Df', 'H362', 'H373', 'H400', 'H410']);
    // CLP Article 27 / Annex VI Table 3 labelling (recalled from memory): H400 is not shown where H410 applies.
    expect(codes(lead.ghs.labelStatements)).toEqual(['H360Df', 'H362', 'H373', 'H410']);
    const copper = items.find((c) => c.formula === 'CuSO4·5H2O')!;
    expect(codes(copper.ghs.labelStatements)).not.toContain('H400');
    expect(codes(copper.ghs.hStatements)).toContain('H400');
    const alAcetate = items.find((c) => c.name === 'aluminium acetate (basic)')!;
    expect(alAcetate.ghs.basis).toBe('memory');
    expect(alAcetate.ghs.caution).toMatch(/boric acid/);
  });
});

import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { AuditEvent, Chemical, ColourMeasurement, Dyestuff, Trial, User } from '../../server/models/index.ts';
import { makeMeasurement, makePiece, makeUser } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { readPdf } from '../support/pdf.ts';
import { useTestMail, waitForMail } from '../support/mail.ts';

const app = createApp();
let curator: User;
let dyer: Awaited<ReturnType<typeof signedInAgent>>;
let otherDyer: Awaited<ReturnType<typeof signedInAgent>>;
const chem: Record<string, Chemical> = {};
let madder: Dyestuff;

type Compound = {
  name: string;
  formula: string;
  molar_mass_g_per_mol: number;
  metal_mass_fraction: Record<string, number>;
};
// IUPAC 2021 abridged atomic weights, computed with exact fractions (tests/reference/mordant-compounds.json).
const compounds = JSON.parse(
  readFileSync(new URL('../reference/mordant-compounds.json', import.meta.url), 'utf8'),
) as Compound[];
const compound = (formula: string) => compounds.find((c) => c.formula === formula)!;

useTestMail();
beforeAll(async () => {
  curator = (await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true }))!;
  dyer = await signedInAgent(app, 'dyer');
  const other = await makeUser({
    role: 'dyer',
    password: 'another-dyer-password',
    email: `dyer-${Date.now().toString(36)}@trials.test`,
  });
  otherDyer = await signedInAgent(app, { email: other.email, password: 'another-dyer-password' });
  for (const name of [
    'potash alum',
    'lead(II) acetate (sugar of lead)',
    'aluminium acetate (basic)',
    'guar gum',
    'calcium carbonate (chalk)',
    'sodium dithionite (hydrosulfite)',
    'acetic acid (vinegar, 5 %)',
    'tannic acid',
    'sodium carbonate (soda ash)',
  ]) {
    chem[name] = (await Chemical.findOne({ where: { name }, rejectOnEmpty: true }))!;
  }
  madder = (await Dyestuff.findOne({ where: { name: 'madder' }, rejectOnEmpty: true }))!;
});

const newPiece = () => makePiece({ createdById: curator.id, title: `Trials test piece ${Date.now().toString(36)}` });
const post = (agent: typeof dyer, url: string, body: unknown) =>
  agent
    .post(url)
    .set('Origin', ORIGIN)
    .send(body as object);

describe('who may see and change trials', () => {
  it('keeps trials from signed-out visitors (401)', async () => {
    const piece = await newPiece();
    await request(app).get('/api/trials').expect(401);
    await request(app).get(`/api/pieces/${piece.id}/trials`).expect(401);
    const anyTrial = await Trial.findOne();
    await request(app).get(`/api/trials/${anyTrial!.id}`).expect(401);
    await request(app).post('/api/trials').set('Origin', ORIGIN).send({ dryMassG: 10 }).expect(401);
  });

  it('lets curators read every trial but not record one (403)', async () => {
    const c = await signedInAgent(app, 'curator');
    const list = await c.get('/api/trials?pageSize=5').expect(200);
    expect(list.body).toMatchObject({ page: 1, pageSize: 5 });
    expect(list.body.total).toBeGreaterThanOrEqual(10);
    const one = await c.get(`/api/trials/${list.body.items[0].id}`).expect(200);
    expect(one.body.trial.abilities).toEqual({ 'trial:update': false, 'trial:delete': false });
    await post(c, '/api/trials', { dryMassG: 50 }).expect(403);
  });

  it("refuses a dyer who edits another dyer's trial (403) and lets the owner do it", async () => {
    const created = await post(dyer, '/api/trials', { dryMassG: 100, fibre: 'cotton' }).expect(201);
    const id = created.body.trial.id;
    await otherDyer.patch(`/api/trials/${id}`).set('Origin', ORIGIN).send({ notes: 'not mine' }).expect(403);
    await otherDyer.put(`/api/trials/${id}/steps`).set('Origin', ORIGIN).send({ steps: [] }).expect(403);
    await post(otherDyer, `/api/trials/${id}/substitutions`, {
      historicalPractice: 'x',
      modernPractice: 'y',
      reason: 'waste',
    }).expect(403);
    await post(otherDyer, `/api/trials/${id}/measurements`, { L: 50, a: 10, b: 10 }).expect(403);
    await otherDyer.delete(`/api/trials/${id}`).set('Origin', ORIGIN).expect(403);
    const mine = await dyer
      .patch(`/api/trials/${id}`)
      .set('Origin', ORIGIN)
      .send({ notes: 'mine', status: 'in-progress' })
      .expect(200);
    expect(mine.body.trial).toMatchObject({ notes: 'mine', status: 'in-progress' });
    await dyer.get(`/api/trials/99999999`).expect(404);
    await dyer.delete(`/api/trials/${id}`).set('Origin', ORIGIN).expect(204);
    await dyer.get(`/api/trials/${id}`).expect(404);
    expect(await AuditEvent.count({ where: { entity: 'trial', entityId: id, action: 'trial-removed' } })).toBe(1);
  });

  it('validates input with per-field details', async () => {
    const res = await post(dyer, '/api/trials', { dryMassG: -5, status: 'brewing' }).expect(400);
    expect(Object.keys(res.body.error.details.fields)).toEqual(expect.arrayContaining(['dryMassG', 'status']));
    const two = await post(dyer, '/api/trials', { dryMassG: 5, targetRegionId: 1, targetMeasurementId: 2 }).expect(400);
    expect(two.body.error.details.fields.target).toBeDefined();
    const badPiece = await post(dyer, '/api/trials', { dryMassG: 5, pieceId: 99999999 }).expect(400);
    expect(badPiece.body.error.details.fields.pieceId).toBeDefined();
  });
});

describe('trial codes', () => {
  it('assigns T-YYYY-NNN on the server, unique even when requests race', async () => {
    const year = new Date().getUTCFullYear();
    const results = await Promise.all(
      Array.from({ length: 5 }, () => post(dyer, '/api/trials', { dryMassG: 20, code: 'T-1999-999' })),
    );
    const codes = results.map((r) => r.body.trial.code as string);
    for (const r of results) expect(r.status).toBe(201);
    for (const c of codes) expect(c).toMatch(new RegExp(`^T-${year}-\\d{3,}$`));
    expect(new Set(codes).size).toBe(5);
    const numbers = codes.map((c) => Number(c.split('-')[2])).sort((a, b) => a - b);
    expect(numbers[4] - numbers[0]).toBe(4);
  });
});

describe('attaching a trial to a piece', () => {
  it('creates it under the piece and e-mails the curator who catalogued the piece a link', async () => {
    const piece = await newPiece();
    const res = await post(dyer, `/api/pieces/${piece.id}/trials`, {
      dryMassG: 250,
      fibre: 'cotton',
      kind: 'modern',
    }).expect(201);
    expect(res.body.trial.piece).toMatchObject({ id: piece.id, accessionNumber: piece.accessionNumber });
    expect(res.body.trial.dyer.name).toBe('Bryony Kettlewick');
    expect(res.body.notified).toBe(true);
    const message = await waitForMail('curator@demo.test');
    expect(message.subject).toContain(res.body.trial.code);
    expect(message.text).toContain(`/trials/${res.body.trial.id}`);
    const list = await dyer.get(`/api/pieces/${piece.id}/trials`).expect(200);
    expect(list.body.items.map((t: { id: number }) => t.id)).toEqual([res.body.trial.id]);
  });
});

describe('recipe steps', () => {
  it('stores the ordered recipe in one go and computes the worked example (BRIEF §4.1, common practice)', async () => {
    const t = (await post(dyer, '/api/trials', { dryMassG: 250 }).expect(201)).body.trial;
    const res = await dyer
      .put(`/api/trials/${t.id}/steps`)
      .set('Origin', ORIGIN)
      .send({
        steps: [
          {
            operation: 'mordant-bath',
            ingredients: [{ kind: 'chemical', refId: chem['potash alum'].id, amount: 15, basis: 'owf' }],
            liquorRatio: 30,
            temperatureC: 45,
            minutes: 60,
          },
          {
            operation: 'print-paste',
            paste: { volumeMl: 300, stockGPerL: 75 },
            ingredients: [
              { kind: 'chemical', refId: chem['aluminium acetate (basic)'].id, amount: 40, basis: 'g/L' },
              { kind: 'chemical', refId: chem['guar gum'].id, amount: 20, basis: 'g/L' },
            ],
          },
          {
            operation: 'dye-bath',
            ingredients: [{ kind: 'dyestuff', refId: madder.id, amount: 60, basis: 'owf' }],
            liquorRatio: 30,
            temperatureC: 70,
            minutes: 90,
            ph: 6.5,
          },
        ],
      })
      .expect(200);
    const [mordant, paste, dye] = res.body.trial.steps;
    expect(res.body.trial.steps.map((s: { position: number }) => s.position)).toEqual([1, 2, 3]);
    // 250 g cotton, alum 15 % owf at 1:30 → 37.5 g in 7.5 L = 5.0 g/L.
    expect(mordant.computed.volumeL).toBeCloseTo(7.5, 10);
    expect(mordant.computed.ingredients[0].grams).toBeCloseTo(37.5, 10);
    expect(mordant.computed.ingredients[0].gPerL).toBeCloseTo(5.0, 10);
    // Paste: 40 g/L × 0.3 L = 12 g; from a 75 g/L stock, V = 40 × 300 / 75 = 160 mL; guar 20 g/L × 0.3 L = 6 g.
    expect(paste.computed.paste.mordants[0]).toMatchObject({ grams: 12, stockMl: 160 });
    expect(paste.computed.paste.thickener.grams).toBeCloseTo(6, 10);
    expect(dye.ingredients[0].name).toBe('madder');
    expect(dye.computed.ingredients[0].grams).toBeCloseTo(150, 10);
    expect(res.body.warning).toBe(false);
  });

  it('refuses unknown ingredients with the path of the field', async () => {
    const t = (await post(dyer, '/api/trials', { dryMassG: 10 }).expect(201)).body.trial;
    const res = await dyer
      .put(`/api/trials/${t.id}/steps`)
      .set('Origin', ORIGIN)
      .send({
        steps: [{ operation: 'dye-bath', ingredients: [{ kind: 'chemical', refId: 99999999, amount: 1, basis: 'g' }] }],
      })
      .expect(400);
    expect(res.body.error.details.fields['steps.0.ingredients.0.refId']).toBeDefined();
  });

  it('refuses a historical-only chemical in a modern trial without a confirmation and a reason (422), stores them with who and when, and still warns', async () => {
    const lead = chem['lead(II) acetate (sugar of lead)'];
    const step = {
      operation: 'mordant-bath',
      ingredients: [{ kind: 'chemical', refId: lead.id, amount: 5, basis: 'owf' }],
      liquorRatio: 30,
    };
    const modern = (await post(dyer, '/api/trials', { dryMassG: 100, kind: 'modern' }).expect(201)).body.trial;
    const put = (body: unknown) =>
      dyer
        .put(`/api/trials/${modern.id}/steps`)
        .set('Origin', ORIGIN)
        .send(body as object);
    const bare = await put({ steps: [step] }).expect(422);
    expect(bare.body.error.details.fields['steps.0.historicalUseConfirmed'][0]).toMatch(/historical recipes only/);
    expect(bare.body.error.details.fields['steps.0.historicalUseReason'][0]).toMatch(/Say why/);
    const noReason = await put({
      steps: [{ ...step, historicalUseConfirmed: true, historicalUseReason: '   ' }],
    }).expect(422);
    expect(Object.keys(noReason.body.error.details.fields)).toEqual(['steps.0.historicalUseReason']);
    // Nothing was saved by the refused requests.
    expect((await dyer.get(`/api/trials/${modern.id}`)).body.trial.steps).toHaveLength(0);
    const bad = await put({ steps: [{ ...step, historicalUseConfirmed: 'yes' }] }).expect(400);
    expect(bad.body.error.details.fields['steps.0.historicalUseConfirmed']).toBeDefined();

    const reason = 'Documented reconstruction for the conservation study, under fume extraction';
    const m = await put({ steps: [{ ...step, historicalUseConfirmed: true, historicalUseReason: reason }] }).expect(
      200,
    );
    expect(m.body.warning).toBe(true);
    expect(m.body.warnings[0]).toMatchObject({
      code: 'historical-only-in-modern',
      chemicalId: lead.id,
      stepPosition: 1,
    });
    const use = m.body.trial.steps[0].historicalUse;
    expect(use).toMatchObject({ reason, confirmedBy: { name: 'Bryony Kettlewick' } });
    expect(Date.now() - Date.parse(use.confirmedAt)).toBeLessThan(60_000);
    expect(m.body.trial.steps[0].cautions[0].ghs.signalWord).toBe('Danger');
    expect(m.body.trial.steps[0].cautions[0].ghs.hStatements.length).toBeGreaterThan(0);
    const events = await AuditEvent.findAll({
      where: { entity: 'trial', entityId: modern.id, action: 'historical-use-confirmed' },
    });
    expect(events).toHaveLength(1);
    expect(events[0].changes).toMatchObject({ historicalUseReason: { to: reason }, chemicals: { to: [lead.name] } });
    // Saved again unchanged (the editor sends the step's id back): the first confirmation stands, not audited twice.
    const again = await put({
      steps: [{ ...step, id: m.body.trial.steps[0].id, historicalUseConfirmed: true, historicalUseReason: reason }],
    }).expect(200);
    expect(again.body.trial.steps[0].historicalUse.confirmedAt).toBe(use.confirmedAt);
    expect(
      await AuditEvent.count({ where: { entity: 'trial', entityId: modern.id, action: 'historical-use-confirmed' } }),
    ).toBe(1);

    const historical = (await post(dyer, '/api/trials', { dryMassG: 100, kind: 'historical' }).expect(201)).body.trial;
    const h = await dyer
      .put(`/api/trials/${historical.id}/steps`)
      .set('Origin', ORIGIN)
      .send({ steps: [step] })
      .expect(200);
    expect(h.body.warning).toBe(false);
    expect(h.body.trial.historicalRecord).toBe(true);
    expect(h.body.trial.steps[0].historicalUse).toBeNull();
    expect(h.body.trial.steps[0].cautions).toHaveLength(1);
  });

  it('warns beside a step that mixes a reducer with an acid (sulfur dioxide), naming the source', async () => {
    const t = (await post(dyer, '/api/trials', { dryMassG: 100, fibre: 'cotton' }).expect(201)).body.trial;
    const res = await dyer
      .put(`/api/trials/${t.id}/steps`)
      .set('Origin', ORIGIN)
      .send({
        steps: [
          {
            operation: 'vat',
            liquorRatio: 30,
            ingredients: [
              { kind: 'chemical', refId: chem['sodium dithionite (hydrosulfite)'].id, amount: 2, basis: 'g/L' },
              { kind: 'chemical', refId: chem['acetic acid (vinegar, 5 %)'].id, amount: 5, basis: 'owf' },
            ],
          },
        ],
      })
      .expect(200);
    const w = res.body.trial.steps[0].warnings.find((x: { code: string }) => x.code === 'incompatible-mix');
    expect(w).toMatchObject({ pair: 'reducer-acid' });
    expect(w.message).toMatch(/sulfur dioxide/);
    expect(w.source).toMatch(/EUH031/);
    expect(res.body.warning).toBe(true);
    expect(res.body.trial.checks.warnings).toEqual([
      expect.objectContaining({ code: 'incompatible-mix', stepPosition: 1 }),
    ]);
    // The sample card that stands beside the pot carries the same warning under its step.
    const pdf = await dyer
      .get(`/api/trials/${t.id}/card.pdf`)
      .buffer(true)
      .parse((r, cb) => {
        const c: Buffer[] = [];
        r.on('data', (x: Buffer) => c.push(x));
        r.on('end', () => cb(null, Buffer.concat(c)));
      })
      .expect(200);
    const text = (await readPdf(pdf.body)).text.replace(/\s+/g, ' ');
    expect(text).toMatch(/DANGER: Do not combine sodium dithionite \(hydrosulfite\) \(a reducer\) with acetic acid/);
  });
});

describe('fibre-aware mordant checks (common practice, recalled from memory: tests/reference/dye-facts.json)', () => {
  it('shows alum on cotton beside 12–20 % owf with g Al per kg fibre, and warns when there is no tannin or alkali step', async () => {
    const t = (await post(dyer, '/api/trials', { dryMassG: 200, fibre: 'cotton poplin' }).expect(201)).body.trial;
    const alum = {
      operation: 'mordant-bath',
      liquorRatio: 30,
      ingredients: [{ kind: 'chemical', refId: chem['potash alum'].id, amount: 15, basis: 'owf' }],
    };
    const res = await dyer
      .put(`/api/trials/${t.id}/steps`)
      .set('Origin', ORIGIN)
      .send({ steps: [alum] })
      .expect(200);
    const { checks } = res.body.trial;
    expect(checks.fibreClass).toBe('cellulose');
    expect(checks.mordant[0]).toMatchObject({
      stepPosition: 1,
      mordant: 'potash-alum',
      verdict: 'within',
      range: { low: 12, high: 20 },
    });
    expect(checks.mordant[0].marking).toMatch(/common practice, recalled from memory/);
    // 15 % owf = 150 g alum per kg × Al 0.056879 (tests/reference/mordant-compounds.json) = 8.53 g Al/kg.
    expect(checks.mordant[0].gAlPerKg).toBeCloseTo(150 * compound('KAl(SO4)2·12H2O').metal_mass_fraction.Al, 3);
    expect(checks.warnings).toEqual([
      expect.objectContaining({ code: 'cellulose-alum-without-fixing', stepPosition: 1 }),
    ]);
    // The mordant-practice warning is a guide beside the recipe, not a safety warning of the save.
    expect(res.body.warning).toBe(false);
    const tannin = {
      operation: 'tannin',
      liquorRatio: 30,
      ingredients: [{ kind: 'chemical', refId: chem['tannic acid'].id, amount: 8, basis: 'owf' }],
    };
    const fixed = await dyer
      .put(`/api/trials/${t.id}/steps`)
      .set('Origin', ORIGIN)
      .send({ steps: [tannin, alum] })
      .expect(200);
    expect(fixed.body.trial.checks.warnings).toEqual([]);
    expect(fixed.body.trial.checks.mordant.map((c: { mordant: string }) => c.mordant)).toEqual([
      'tannin',
      'potash-alum',
    ]);
  });
});

describe('dry mass, air-dry or oven-dry (ASTM D1909 regains, recalled from memory)', () => {
  it('stores the basis, works the recipe on the air-dry mass and refuses an unknown basis', async () => {
    const t = (await post(dyer, '/api/trials', { dryMassG: 100, fibre: 'wool', dryMassBasis: 'oven-dry' }).expect(201))
      .body.trial;
    expect(t.dryMassBasis).toBe('oven-dry');
    // 100 g oven-dry wool × (1 + 13.6 %) = 113.6 g air-dry; alum 10 % owf of it = 11.36 g.
    expect(t.mass).toMatchObject({ enteredG: 100, basis: 'oven-dry', regainPct: 13.6 });
    expect(t.mass.recipeMassG).toBeCloseTo(113.6, 10);
    expect(t.mass.source).toMatch(/ASTM D1909/);
    const res = await dyer
      .put(`/api/trials/${t.id}/steps`)
      .set('Origin', ORIGIN)
      .send({
        steps: [
          {
            operation: 'mordant-bath',
            liquorRatio: 30,
            ingredients: [{ kind: 'chemical', refId: chem['potash alum'].id, amount: 10, basis: 'owf' }],
          },
        ],
      })
      .expect(200);
    expect(res.body.trial.steps[0].computed.ingredients[0].grams).toBeCloseTo(11.36, 10);
    expect(res.body.trial.steps[0].computed.volumeL).toBeCloseTo(3.408, 10);
    const back = await dyer
      .patch(`/api/trials/${t.id}`)
      .set('Origin', ORIGIN)
      .send({ dryMassBasis: 'air-dry' })
      .expect(200);
    expect(back.body.trial.dryMassBasis).toBe('air-dry');
    expect(back.body.trial.steps[0].computed.ingredients[0].grams).toBeCloseTo(10, 10);
    expect((await post(dyer, '/api/trials', { dryMassG: 100 }).expect(201)).body.trial.dryMassBasis).toBe('air-dry');
    const bad = await post(dyer, '/api/trials', { dryMassG: 100, dryMassBasis: 'damp' }).expect(400);
    expect(bad.body.error.details.fields.dryMassBasis[0]).toMatch(/air-dry or oven-dry/);
    const badPatch = await dyer
      .patch(`/api/trials/${t.id}`)
      .set('Origin', ORIGIN)
      .send({ dryMassBasis: 'wet' })
      .expect(400);
    expect(badPatch.body.error.details.fields.dryMassBasis).toBeDefined();
  });
});

describe('substitutions and the metal load', () => {
  it('computes the lead avoided by aluminium acetate, per batch and per kg fibre (IUPAC 2021 weights)', async () => {
    const t = (await post(dyer, '/api/trials', { dryMassG: 250 }).expect(201)).body.trial;
    const res = await post(dyer, `/api/trials/${t.id}/substitutions`, {
      historicalChemicalId: chem['lead(II) acetate (sugar of lead)'].id,
      historicalAmountG: 18,
      modernChemicalId: chem['aluminium acetate (basic)'].id,
      modernAmountG: 12,
      modernPractice: 'aluminium acetate made from alum and calcium acetate',
      reason: 'toxicity',
    }).expect(201);
    const rows = Object.fromEntries(res.body.metalLoad.rows.map((r: { metal: string }) => [r.metal, r]));
    // Reference: tests/reference/mordant-compounds.json (Pb 0.546222 of Pb(CH3COO)2·3H2O; Al 0.166476 of Al(OH)(CH3COO)2), 6 decimals.
    const pbFraction = compound('Pb(CH3COO)2·3H2O').metal_mass_fraction.Pb;
    const alFraction = compound('Al(OH)(CH3COO)2').metal_mass_fraction.Al;
    expect(Math.abs(rows.Pb.beforeG - 18 * pbFraction)).toBeLessThan(18 * 0.5e-6);
    expect(rows.Pb.afterG).toBe(0);
    expect(Math.abs(rows.Pb.avoidedG - 18 * pbFraction)).toBeLessThan(18 * 0.5e-6);
    expect(Math.abs(rows.Pb.beforeGPerKgFibre - (18 * pbFraction * 1000) / 250)).toBeLessThan(1e-4);
    expect(Math.abs(rows.Al.afterG - 12 * alFraction)).toBeLessThan(12 * 0.5e-6);
    expect(rows.Al.beforeG).toBe(0);
    expect(rows.Pb.heavy).toBe(true);

    const subId = res.body.substitution.id;
    const upd = await dyer
      .put(`/api/trials/${t.id}/substitutions/${subId}`)
      .set('Origin', ORIGIN)
      .send({
        historicalChemicalId: chem['lead(II) acetate (sugar of lead)'].id,
        historicalAmountG: 9,
        modernChemicalId: chem['aluminium acetate (basic)'].id,
        modernAmountG: 6,
        reason: 'regulation',
      })
      .expect(200);
    expect(upd.body.substitution.reason).toBe('regulation');
    expect(upd.body.metalLoad.rows.find((r: { metal: string }) => r.metal === 'Pb').beforeG).toBeCloseTo(
      9 * pbFraction,
      5,
    );
    const bad = await post(dyer, `/api/trials/${t.id}/substitutions`, { reason: 'toxicity' }).expect(400);
    expect(bad.body.error.details.fields).toHaveProperty('historicalChemicalId');
    await dyer.delete(`/api/trials/${t.id}/substitutions/${subId}`).set('Origin', ORIGIN).expect(204);
    expect((await dyer.get(`/api/trials/${t.id}`)).body.trial.substitutions).toHaveLength(0);
    // The removal is in the trial's history, with what was removed.
    const removed = await AuditEvent.findOne({
      where: { entity: 'trial', entityId: t.id, action: 'substitution-removed' },
    });
    expect(removed?.changes).toMatchObject({
      substitution: { from: { reason: 'regulation', historicalAmountG: 9 }, to: null },
    });
  });
});

describe('measurements and the colour difference to the target', () => {
  it('compares the mean of the readings with an instrument measurement of the original', async () => {
    const piece = await newPiece();
    const target = await makeMeasurement({
      pieceId: piece.id,
      regionId: null,
      trialId: null,
      instrument: 'bench spectro',
      geometry: 'd:8°',
      specular: 'SCI',
      L: 50,
      a: 2.6772,
      b: -79.7751,
      label: 'ground blue',
      takenOn: null,
      createdById: null,
    });
    const t = (
      await post(dyer, `/api/pieces/${piece.id}/trials`, { dryMassG: 50, targetMeasurementId: target.id }).expect(201)
    ).body.trial;
    expect(t.colour.result).toBeNull();
    await post(dyer, `/api/trials/${t.id}/measurements`, {
      L: 50,
      a: 0,
      b: -82.7485,
      geometry: 'd:8°',
      specular: 'SCI',
    }).expect(201);
    const res = await dyer.get(`/api/trials/${t.id}`).expect(200);
    const { colour } = res.body.trial;
    expect(colour.target.source).toBe('instrument');
    expect(colour.result.source).toBe('instrument');
    expect(res.body.trial.measurements[0]).toMatchObject({ illuminant: 'D65', observer: '10' });
    // Sharma, Wu & Dalal (2005) Table 1 pair 1: ΔE00 = 2.0425.
    expect(colour.difference.deltaE00).toBeCloseTo(2.0425, 4);
    expect(colour.difference.verdict).toBe('near');
    // h_ab 271.9° → 270.0°: a blue whose hue angle shrinks moves towards green; its chroma grows by 2.9.
    expect(colour.difference.words).toEqual(['brighter', 'greener']);
  });

  it('refuses a target from another piece', async () => {
    const [p1, p2] = [await newPiece(), await newPiece()];
    const m = await makeMeasurement({
      pieceId: p2.id,
      regionId: null,
      trialId: null,
      instrument: null,
      geometry: null,
      specular: null,
      L: 40,
      a: 30,
      b: 10,
      label: null,
      takenOn: null,
      createdById: null,
    });
    const res = await post(dyer, `/api/pieces/${p1.id}/trials`, { dryMassG: 10, targetMeasurementId: m.id }).expect(
      400,
    );
    expect(res.body.error.details.fields.targetMeasurementId).toBeDefined();
  });

  it('imports a CSV of readings, or nothing when any line is bad, reporting each bad line', async () => {
    const t = (await post(dyer, '/api/trials', { dryMassG: 10 }).expect(201)).body.trial;
    const csv = (body: string) =>
      dyer
        .post(`/api/trials/${t.id}/measurements/import`)
        .set('Origin', ORIGIN)
        .set('Content-Type', 'text/csv')
        .send(body);
    const bad = await csv(
      'L,a,b,illuminant/observer,geometry\n41.2,38.5,20.1,D65/10,d:8°\n,12,3,D65/10,d:8°\n40.8,abc,19.7,D65/10,d/8\n39.9,37.2,19.0,D65/10,sideways\n',
    ).expect(422);
    expect(bad.body.error.details.lines.map((l: { line: number }) => l.line)).toEqual([3, 4, 5]);
    expect(bad.body.error.details.lines[1].errors.join(' ')).toMatch(/a\*/);
    expect(bad.body.error.details.lines[2].errors.join(' ')).toMatch(/geometry/);
    expect(await ColourMeasurement.count({ where: { trialId: t.id } })).toBe(0);
    const missingColumn = await csv('L,a\n40,10\n').expect(422);
    expect(missingColumn.body.error.details.lines[0]).toMatchObject({ line: 1 });

    const good = await csv(
      'L*,a*,b*,Illuminant/Observer,Geometry,SCI/SCE\n41.2,38.5,20.1,D65/10°,d:8°,SCI\n40.8,38.9,19.7,D50/2,45/0,SCE\n\n39.9,37.2,19.0,D65/10,d/8,SCI\n',
    ).expect(201);
    expect(good.body.imported).toBe(3);
    expect(good.body.measurements[1]).toMatchObject({
      illuminant: 'D50',
      observer: '2',
      geometry: '45°a:0°',
      specular: 'SCE',
    });
    expect(await ColourMeasurement.count({ where: { trialId: t.id } })).toBe(3);
  });
});

describe('the demo scenario', () => {
  it('shows T-2024-001 with its measured difference from the red ground and the lead it avoided', async () => {
    const list = await dyer.get('/api/trials?q=T-2024-001').expect(200);
    const summary = list.body.items.find((t: { code: string }) => t.code === 'T-2024-001');
    const { trial } = (await dyer.get(`/api/trials/${summary.id}`).expect(200)).body;
    expect(trial.colour.target).toMatchObject({ source: 'instrument', label: 'madder red ground' });
    expect(trial.colour.result.label).toMatch(/mean of 2/);
    expect(trial.colour.difference.deltaE00).toBeGreaterThan(0);
    // 18 g of Pb(CH3COO)2·3H2O × 0.546222 (tests/reference/mordant-compounds.json).
    const lead = trial.metalLoad.rows.find((r: { metal: string }) => r.metal === 'Pb');
    expect(lead.avoidedG).toBeCloseTo(18 * compound('Pb(CH3COO)2·3H2O').metal_mass_fraction.Pb, 4);
    expect(trial.fastness.washing).toMatchObject({ change: '4-5' });
    expect(trial.steps.find((s: { operation: string }) => s.operation === 'print-paste')).toMatchObject({
      batch: { code: 'MB-07' },
      batchVolumeMl: 300,
    });
  });

  it('shows the lime caution on the fructose-lime indigo vat of T-2024-005', async () => {
    const list = await dyer.get('/api/trials?q=T-2024-005').expect(200);
    const { trial } = (
      await dyer
        .get(`/api/trials/${list.body.items.find((t: { code: string }) => t.code === 'T-2024-005').id}`)
        .expect(200)
    ).body;
    const vat = trial.steps.find((s: { operation: string }) => s.operation === 'vat');
    expect(vat.cautions.map((c: { name: string }) => c.name)).toContain('calcium hydroxide (slaked lime)');
  });
});

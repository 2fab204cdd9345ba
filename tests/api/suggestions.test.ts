import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Chemical, Dyestuff, RecipeStep, sequelize, Trial } from '../../server/models/index.ts';
import { makeBatch, makeMeasurement, makePiece, makeRecipeStep, makeTrial } from '../../server/seed/factories.ts';
import { ksFromR, rFromKs } from '../../shared/compute/kubelka-munk.ts';
import { deltaE00 } from '../../shared/colour/difference.ts';
import { spectrumToLab, type Spectrum } from '../../shared/colour/spectral.ts';
import { createApp } from '../../server/app.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';

// GET /api/suggestions/recipes and "Try this" (POST /api/suggestions/recipes/trials). A ladder of madder on
// alum-mordanted cotton is made here, its readings computed by single-constant Kubelka–Munk from a dye made in the
// test (shared/compute/kubelka-munk.ts is checked on its own in tests/unit/kubelka-munk.test.ts).
const app = createApp();
afterAll(() => sequelize.close());

const fibre = `cotton ${Date.now().toString(36)}`; // this test's ladder only: the signature includes the fibre
const grid = { startNm: 400, intervalNm: 10, n: 31 };
const unitKs = Array.from({ length: grid.n }, (_x, k) => {
  const nm = grid.startNm + k * grid.intervalNm;
  return 0.3 * Math.exp(-(((nm - 520) / 50) ** 2)) + 0.03 * Math.exp(-(((nm - 420) / 30) ** 2)) + 0.01;
});
const uptake = (c: number) => (c * 30) / (c + 30);
const dyed = (pct: number): Spectrum => ({
  startNm: grid.startNm,
  intervalNm: grid.intervalNm,
  values: unitKs.map((k) => rFromKs(ksFromR(0.84) + uptake(pct) * k)),
});
const labOf = (s: Spectrum) => spectrumToLab(s, 'D65', '10').lab;

let madder: Dyestuff;
let alum: Chemical;
let ladderIds: number[] = [];
let banned: Trial;

async function finishedTrial(pct: number, chemical: Chemical, spectrum: Spectrum) {
  const trial = await makeTrial({ status: 'finished', kind: 'modern', fibre, dryMassG: 10 });
  await makeRecipeStep({
    trialId: trial.id,
    position: 1,
    operation: 'mordant-bath',
    liquorRatio: 20,
    temperatureC: 60,
    ingredients: [{ kind: 'chemical', refId: chemical.id, name: chemical.name, amount: 12, basis: 'owf' }],
  });
  await makeRecipeStep({
    trialId: trial.id,
    position: 2,
    operation: 'dye-bath',
    liquorRatio: 30,
    temperatureC: 80,
    ingredients: [{ kind: 'dyestuff', refId: madder.id, name: madder.name, amount: pct, basis: 'owf' }],
  });
  const lab = labOf(spectrum);
  await makeMeasurement({ trialId: trial.id, ...lab, spectrum, illuminant: 'D65', observer: '10' });
  return trial;
}

beforeAll(async () => {
  madder = (await Dyestuff.findOne({ where: { name: 'madder' } }))!;
  alum = (await Chemical.findOne({ where: { status: 'permitted', role: 'mordant' } }))!;
  const historical = (await Chemical.findOne({ where: { status: 'historical-only' } }))!;
  ladderIds = [];
  for (const pct of [5, 10, 20, 40]) ladderIds.push((await finishedTrial(pct, alum, dyed(pct))).id);
  // The exact colour asked for below, dyed over a historical-only mordant: never a basis for a suggestion.
  banned = await finishedTrial(15, historical, dyed(15));
});

describe('recipe suggestions', () => {
  it('interpolates the ladder to the strength that gives the target, with its expected error and a scaled recipe', async () => {
    const bath = await makeBatch({
      status: 'active',
      ingredients: [{ kind: 'chemical', refId: alum.id, name: alum.name, grams: 100 }],
    });
    const spent = await makeBatch({
      status: 'exhausted',
      ingredients: [{ kind: 'chemical', refId: alum.id, name: alum.name, grams: 100 }],
    });
    const agent = await signedInAgent(app, 'dyer');
    const target = labOf(dyed(15));
    const res = await agent
      .get('/api/suggestions/recipes')
      .query({ ...target, dryMassG: 50, limit: 20 })
      .expect(200);
    expect(res.body.target).toMatchObject({ illuminant: 'D65', observer: '10', label: 'the colour typed in' });
    const ladder = res.body.items.find(
      (i: { source: string; basis: { id: number }[] }) =>
        i.source === 'ladder' && i.basis.map((b) => b.id).join() === ladderIds.join(),
    );
    expect(ladder).toBeTruthy();
    expect(ladder.predicted.method).toBe('kubelka-munk');
    expect(ladder.predicted.extrapolated).toBe(false);
    expect(ladder.predicted.deltaE00).toBeLessThan(0.5);
    // Leave-one-out on the ladder's two inner rungs (10 and 20 % owf), uptake filling up: small but not nil.
    expect(ladder.expectedError.deltaE00).toBeGreaterThan(0);
    expect(ladder.expectedError.deltaE00).toBeLessThan(2);
    expect(ladder.confidence).toBe('high');
    const dye = ladder.recipe.steps[1].ingredients[0];
    expect(dye).toMatchObject({ refId: madder.id, basis: 'owf', interpolated: true });
    // The uptake curve is not linear, so the strength found is near, not at, 15 % (K/S is interpolated between 10 and 20).
    expect(dye.amount).toBeGreaterThan(13);
    expect(dye.amount).toBeLessThan(17);
    expect(dye.grams).toBeCloseTo((dye.amount / 100) * 50, 3);
    expect(ladder.recipe.steps[0].ingredients[0]).toMatchObject({
      refId: alum.id,
      amount: 12,
      grams: 6,
      interpolated: false,
    });
    expect(ladder.explanation).toMatch(/ladder of 4 trials/);
    // The mordant bath is offered from the active baths that hold its alum; a spent one is not.
    const offered = ladder.recipe.steps[0].baths.map((b: { id: number }) => b.id);
    expect(offered).toContain(bath.id);
    expect(offered).not.toContain(spent.id);
    expect(ladder.recipe.steps[1].baths).toEqual([]);
    expect(deltaE00(ladder.predicted.lab, target)).toBeCloseTo(ladder.predicted.deltaE00, 6);

    // Historical-only chemicals are never suggested, even when that trial matches the target exactly.
    for (const item of res.body.items) expect(item.basis.map((b: { id: number }) => b.id)).not.toContain(banned.id);
    // The nearest finished trials come as they were dyed.
    const nearest = res.body.items.find((i: { source: string }) => i.source === 'nearest-trial');
    expect(nearest.predicted.method).toBe('as-dyed');
  });

  it('flags a strength beyond the ladder as an extrapolation, with low confidence', async () => {
    const agent = await signedInAgent(app, 'researcher');
    const res = await agent
      .get('/api/suggestions/recipes')
      .query({ ...labOf(dyed(55)), limit: 20 })
      .expect(200);
    const ladder = res.body.items.find(
      (i: { source: string; basis: { id: number }[] }) =>
        i.source === 'ladder' && i.basis.map((b) => b.id).join() === ladderIds.join(),
    );
    expect(ladder.predicted.extrapolated).toBe(true);
    expect(ladder.confidence).toBe('low');
    expect(ladder.explanation).toMatch(/outside the ladder/);
  });

  it("takes a piece's reading as the target, under the reading's conditions", async () => {
    const piece = await makePiece();
    const reading = await makeMeasurement({
      pieceId: piece.id,
      ...labOf(dyed(15)),
      spectrum: dyed(15),
      label: 'ground red',
    });
    const agent = await signedInAgent(app, 'curator');
    const res = await agent.get('/api/suggestions/recipes').query({ measurementId: reading.id }).expect(200);
    expect(res.body.target.label).toBe('ground red');
    expect(res.body.items.length).toBeGreaterThan(0);
    await agent.get('/api/suggestions/recipes').query({ measurementId: 999_999_999 }).expect(404);
  });

  it('answers a missing or half-typed colour with messages beside the fields', async () => {
    const agent = await signedInAgent(app, 'dyer');
    const none = await agent.get('/api/suggestions/recipes').expect(400);
    expect(none.body.error.details.fields.target[0]).toMatch(/Give a colour/);
    const half = await agent.get('/api/suggestions/recipes').query({ L: 40 }).expect(400);
    expect(half.body.error.details.fields.a[0]).toMatch(/a\*/);
    const both = await agent.get('/api/suggestions/recipes').query({ L: 40, a: 1, b: 2, regionId: 3 }).expect(400);
    expect(both.body.error.details.fields.target[0]).toMatch(/one colour/);
    const bad = await agent.get('/api/suggestions/recipes').query({ L: 'dark', a: 1, b: 2 }).expect(400);
    expect(bad.body.error.details.fields.L[0]).toMatch(/number/);
  });

  it('"Try this" makes a planned trial with the recipe, the target and the evidence, in one go', async () => {
    const agent = await signedInAgent(app, 'dyer');
    const piece = await makePiece();
    const res = await agent
      .post('/api/suggestions/recipes/trials')
      .set('Origin', ORIGIN)
      .send({
        pieceId: piece.id,
        dryMassG: 25,
        fibre,
        steps: [
          {
            operation: 'mordant-bath',
            liquorRatio: 20,
            ingredients: [{ kind: 'chemical', refId: alum.id, amount: 12, basis: 'owf' }],
          },
          { operation: 'dye-bath', ingredients: [{ kind: 'dyestuff', refId: madder.id, amount: 14.6, basis: 'owf' }] },
        ],
        evidence: 'Ladder of 4 trials, madder 5–40 % owf; expected ΔE00 0.4.',
      })
      .expect(201);
    const trial = res.body.trial;
    expect(trial).toMatchObject({ status: 'planned', kind: 'modern', dryMassG: 25 });
    expect(trial.notes).toMatch(/^Suggested recipe\. Ladder of 4 trials/);
    const steps = await RecipeStep.findAll({ where: { trialId: trial.id }, order: [['position', 'ASC']] });
    expect(steps.map((s) => s.operation)).toEqual(['mordant-bath', 'dye-bath']);
    expect(steps[1].ingredients[0]).toMatchObject({ refId: madder.id, amount: 14.6, basis: 'owf' });

    // A bad step rolls the whole thing back: no trial without its recipe.
    const before = await Trial.count();
    const refused = await agent
      .post('/api/suggestions/recipes/trials')
      .set('Origin', ORIGIN)
      .send({
        dryMassG: 25,
        steps: [
          { operation: 'dye-bath', ingredients: [{ kind: 'dyestuff', refId: 999_999_999, amount: 5, basis: 'owf' }] },
        ],
        evidence: 'bad',
      })
      .expect(400);
    expect(refused.body.error.details.fields['steps.0.ingredients.0.refId']).toBeTruthy();
    expect(await Trial.count()).toBe(before);
  });
});

import { readFileSync } from 'node:fs';
import { beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import sharp from 'sharp';
import { parse } from 'csv-parse/sync';
import { differenceCmc } from 'culori';
import { createApp } from '../../server/app.ts';
import { User } from '../../server/models/index.ts';
import { makeMeasurement, makePiece } from '../../server/seed/factories.ts';
import { ingested } from '../support/photos.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg } from '../support/images.ts';
import { useTestMail } from '../support/mail.ts';
import { readPdf } from '../support/pdf.ts';

const app = createApp();
let curatorUser: User;
let dyer: Awaited<ReturnType<typeof signedInAgent>>;
let curator: Awaited<ReturnType<typeof signedInAgent>>;
let researcher: Awaited<ReturnType<typeof signedInAgent>>;

type Pair = {
  pair: number;
  L1: number;
  a1: number;
  b1: number;
  L2: number;
  a2: number;
  b2: number;
  dE00: number;
  decimals: number;
};
// Sharma, Wu & Dalal (2005), Color Res. Appl. 30(1):21–30, Table 1 (tests/reference/ciede2000-sharma2005.json).
const pairs = JSON.parse(
  readFileSync(new URL('../reference/ciede2000-sharma2005.json', import.meta.url), 'utf8'),
) as Pair[];
const pair = (n: number) => {
  const p = pairs.find((x) => x.pair === n)!;
  return {
    one: { L: p.L1, a: p.a1, b: p.b1 },
    two: { L: p.L2, a: p.a2, b: p.b2 },
    dE00: p.dE00,
    tolerance: 0.5 * 10 ** -p.decimals,
  };
};
const blue = pair(2); // 50/3.1571/−77.2803 against 50/0/−82.7485: ΔE00 2.8615
const red = pair(30); // 36.4612/47.858/18.3852 against 36.2715/50.5065/21.2231: ΔE00 1.4146

useTestMail();
beforeAll(async () => {
  curatorUser = (await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true }))!;
  dyer = await signedInAgent(app, 'dyer');
  curator = await signedInAgent(app, 'curator');
  researcher = await signedInAgent(app, 'researcher');
});

const post = (agent: typeof dyer, url: string, body: unknown) =>
  agent
    .post(url)
    .set('Origin', ORIGIN)
    .send(body as object);
const newPiece = () =>
  makePiece({ createdById: curatorUser.id, title: `Viewing conditions ${Date.now().toString(36)}` });
/** A reading of the original, on the piece itself; the label names the place on it. */
const originalReading = (
  pieceId: number,
  lab: { L: number; a: number; b: number },
  illuminant: string,
  observer: string,
  label: string,
  takenOn: string | null = null,
) =>
  makeMeasurement({
    pieceId,
    regionId: null,
    trialId: null,
    instrument: 'bench spectro',
    geometry: 'd:8°',
    specular: 'SCI',
    illuminant,
    observer,
    ...lab,
    label,
    takenOn,
    createdById: null,
  });
const trialAgainst = async (pieceId: number, targetMeasurementId: number) =>
  (await post(dyer, `/api/pieces/${pieceId}/trials`, { dryMassG: 20, targetMeasurementId }).expect(201)).body.trial as {
    id: number;
    code: string;
  };
const read = (trialId: number, body: object) =>
  post(dyer, `/api/trials/${trialId}/measurements`, { geometry: 'd:8°', specular: 'SCI', ...body }).expect(201);
const colourOf = async (trialId: number) => (await dyer.get(`/api/trials/${trialId}`).expect(200)).body.trial.colour;

describe("a trial's readings and the comparison with the original", () => {
  it('never averages readings taken under different illuminants', async () => {
    const piece = await newPiece();
    const target = await originalReading(piece.id, blue.one, 'D65', '10', 'ground blue');
    const t = await trialAgainst(piece.id, target.id);
    // Two D65/10° readings whose mean is pair 2's second colour, and one far-off reading under A.
    await read(t.id, { ...blue.two, a: 1, illuminant: 'D65', observer: '10' });
    await read(t.id, { ...blue.two, a: -1, illuminant: 'D65', observer: '10' });
    await read(t.id, { L: 60, a: 30, b: 10, illuminant: 'A', observer: '10' });
    const colour = await colourOf(t.id);
    expect(colour.result).toMatchObject({
      source: 'instrument',
      illuminant: 'D65',
      observer: '10',
      readings: 2,
      L: blue.two.L,
      b: blue.two.b,
    });
    expect(colour.result.a).toBeCloseTo(0, 12);
    expect(colour.result.label).toMatch(/mean of 2/);
    // The A reading is its own group, never in the mean.
    expect(colour.results).toEqual([
      expect.objectContaining({ illuminant: 'D65', observer: '10', readings: 2 }),
      expect.objectContaining({ illuminant: 'A', observer: '10', readings: 1, L: 60, a: 30, b: 10 }),
    ]);
    expect(Math.abs(colour.difference.deltaE00 - blue.dE00)).toBeLessThanOrEqual(blue.tolerance);
    expect(colour.conditions).toEqual({
      illuminant: 'D65',
      targetObserver: '10',
      resultObserver: '10',
      observersDiffer: false,
    });
    expect(colour.note).toBeNull();
    expect(colour.missing).toBeNull();
    // The original was not read under A, so there is no comparison under A.
    expect(colour.comparisons.map((c: { illuminant: string }) => c.illuminant)).toEqual(['D65']);
  });

  it("compares with the group under the original's illuminant, and also under every other illuminant both sides share", async () => {
    const piece = await newPiece();
    // The same place read under D65 and, later, under A; the trial aims at the A reading.
    await originalReading(piece.id, blue.one, 'D65', '10', 'ground red', '2024-05-01');
    const underA = await originalReading(piece.id, red.one, 'A', '10', 'ground red', '2024-05-02');
    const t = await trialAgainst(piece.id, underA.id);
    await read(t.id, { ...blue.two, illuminant: 'D65', observer: '10' });
    await read(t.id, { ...red.two, illuminant: 'A', observer: '10' });
    const colour = await colourOf(t.id);
    expect(colour.target).toMatchObject({ illuminant: 'A', observer: '10', source: 'instrument', ...red.one });
    expect(colour.result).toMatchObject({ illuminant: 'A', observer: '10', ...red.two });
    expect(Math.abs(colour.difference.deltaE00 - red.dE00)).toBeLessThanOrEqual(red.tolerance);
    // CMC(2:1) with the original as the standard, as culori 4.0.2 (an independent library) computes it.
    const std = { mode: 'lab65' as const, l: red.one.L, a: red.one.a, b: red.one.b };
    const smp = { mode: 'lab65' as const, l: red.two.L, a: red.two.a, b: red.two.b };
    expect(colour.difference.cmc21).toBeCloseTo(differenceCmc(2, 1)(std, smp), 6);
    // CIE 15 components add up to ΔE*ab in quadrature.
    const { dL, dC, dH, deltaEab } = colour.difference;
    expect(dL ** 2 + dC ** 2 + dH ** 2).toBeCloseTo(deltaEab ** 2, 9);
    expect(colour.conditions.illuminant).toBe('A');
    // Under D65 the original's D65 reading meets the swatch's D65 reading: pair 2 again.
    const [primary, d65] = colour.comparisons;
    expect(primary).toMatchObject({ illuminant: 'A', primary: true });
    expect(d65).toMatchObject({
      illuminant: 'D65',
      primary: false,
      observersDiffer: false,
      target: { illuminant: 'D65', ...blue.one },
      result: { illuminant: 'D65', ...blue.two },
    });
    expect(Math.abs(d65.difference.deltaE00 - blue.dE00)).toBeLessThanOrEqual(blue.tolerance);
  });

  it('makes the comparison when only the observers differ, and says so', async () => {
    const piece = await newPiece();
    const target = await originalReading(piece.id, blue.one, 'D65', '10', 'ground blue');
    const t = await trialAgainst(piece.id, target.id);
    await read(t.id, { ...blue.two, illuminant: 'D65', observer: '2' });
    const colour = await colourOf(t.id);
    expect(Math.abs(colour.difference.deltaE00 - blue.dE00)).toBeLessThanOrEqual(blue.tolerance);
    expect(colour.conditions).toEqual({
      illuminant: 'D65',
      targetObserver: '10',
      resultObserver: '2',
      observersDiffer: true,
    });
    expect(colour.note).toMatch(/Observers differ/);
    expect(colour.note).toMatch(/10° observer/);
    expect(colour.note).toMatch(/2° observer/);
  });

  it('prefers a reading under the same observer to one under another observer', async () => {
    const piece = await newPiece();
    const target = await originalReading(piece.id, blue.one, 'D65', '10', 'ground blue');
    const t = await trialAgainst(piece.id, target.id);
    await read(t.id, { L: 55, a: 5, b: -70, illuminant: 'D65', observer: '2' });
    await read(t.id, { ...blue.two, illuminant: 'D65', observer: '10' });
    const colour = await colourOf(t.id);
    expect(colour.result).toMatchObject({ observer: '10', ...blue.two });
    expect(colour.note).toBeNull();
  });

  it('gives no ΔE when no reading matches the original’s illuminant, and names the reading that is missing', async () => {
    const piece = await newPiece();
    const target = await originalReading(piece.id, red.one, 'A', '10', 'ground red');
    const t = await trialAgainst(piece.id, target.id);
    await read(t.id, { ...red.two, illuminant: 'D65', observer: '10' });
    const colour = await colourOf(t.id);
    expect(colour.difference).toBeNull();
    expect(colour.result).toBeNull();
    expect(colour.comparisons).toEqual([]);
    expect(colour.missing).toMatchObject({ illuminant: 'A', observer: '10' });
    expect(colour.missing.message).toMatch(
      /^No reading of the swatch under A\/10°: measure it under A to compare with the original's reading\./,
    );
    expect(colour.missing.message).toMatch(/readings under D65\/10° are not compared/);
    // The D65 reading is still there to see, under its own conditions.
    expect(colour.results).toEqual([expect.objectContaining({ illuminant: 'D65', observer: '10', readings: 1 })]);
    // The trial list carries the same answer.
    const list = await dyer.get(`/api/trials?q=${t.code}`).expect(200);
    expect(list.body.items[0].colour).toMatchObject({ difference: null, missing: { illuminant: 'A' } });

    // Measured under A (2° this time): compared, with the observer change said.
    await read(t.id, { ...red.two, illuminant: 'A', observer: '2' });
    const after = await colourOf(t.id);
    expect(after.missing).toBeNull();
    expect(Math.abs(after.difference.deltaE00 - red.dE00)).toBeLessThanOrEqual(red.tolerance);
    expect(after.conditions).toMatchObject({ illuminant: 'A', observersDiffer: true });
  });

  it('takes photo estimates as D65/2°: a swatch photo meets a D65 reading of the original, never one under A', async () => {
    const piece = await newPiece();
    const underA = await originalReading(piece.id, red.one, 'A', '10', 'ground red');
    const t = await trialAgainst(piece.id, underA.id);
    const swatch = await sharp({ create: { width: 240, height: 160, channels: 3, background: '#a33a2e' } })
      .png()
      .toBuffer();
    const up = await dyer
      .post(`/api/trials/${t.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', swatch, 'swatch.png')
      .expect(201);
    await ingested(up.body.photo.id);
    const colour = await colourOf(t.id);
    expect(colour.results).toEqual([
      expect.objectContaining({ source: 'image-estimate', illuminant: 'D65', observer: '2', readings: null }),
    ]);
    expect(colour.difference).toBeNull();
    expect(colour.missing.message).toMatch(/under A\/10°/);

    // An instrument target under D65/10° is compared with the D65/2° estimate, saying the observers differ.
    const d65 = await originalReading(piece.id, red.one, 'D65', '10', 'ground red, D65');
    const t2 = await trialAgainst(piece.id, d65.id);
    const up2 = await dyer
      .post(`/api/trials/${t2.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', swatch, 'swatch.png')
      .expect(201);
    await ingested(up2.body.photo.id);
    const c2 = await colourOf(t2.id);
    expect(c2.result).toMatchObject({ source: 'image-estimate', illuminant: 'D65', observer: '2' });
    expect(c2.difference.deltaE00).toBeGreaterThan(0);
    expect(c2.conditions).toMatchObject({
      illuminant: 'D65',
      targetObserver: '10',
      resultObserver: '2',
      observersDiffer: true,
    });
  });

  it('compares an image estimate of the original only with results under D65', async () => {
    const piece = await newPiece();
    const photo = (
      await curator
        .post(`/api/pieces/${piece.id}/photos`)
        .set('Origin', ORIGIN)
        .attach('photo', await clothJpeg({ seed: 7 }), 'original.jpg')
        .expect(201)
    ).body.photos[0];
    const region = (
      await curator
        .post(`/api/photos/${photo.id}/regions`)
        .set('Origin', ORIGIN)
        .send({ x: 80, y: 80, w: 100, h: 150, purpose: 'colour-area', label: 'madder red' })
        .expect(201)
    ).body.region;
    const t = (
      await post(dyer, `/api/pieces/${piece.id}/trials`, { dryMassG: 20, targetRegionId: region.id }).expect(201)
    ).body.trial;
    expect(t.colour.target).toMatchObject({ source: 'image-estimate', illuminant: 'D65', observer: '2' });
    await read(t.id, { L: 40, a: 40, b: 25, illuminant: 'F11', observer: '10' });
    const colour = await colourOf(t.id);
    expect(colour.difference).toBeNull();
    expect(colour.missing.message).toMatch(/No reading of the swatch under D65 and no swatch photo/);
    expect(colour.missing.message).toMatch(/F11\/10°/);
    await read(t.id, { L: 40, a: 40, b: 25, illuminant: 'D65', observer: '10' });
    const after = await colourOf(t.id);
    expect(after.result).toMatchObject({ illuminant: 'D65', observer: '10', readings: 1 });
    expect(after.conditions).toMatchObject({
      illuminant: 'D65',
      targetObserver: '2',
      resultObserver: '10',
      observersDiffer: true,
    });
  });
});

describe('exports and cards carry the viewing conditions', () => {
  it('writes each colour’s illuminant and observer, the signed components and the note into the trials CSV', async () => {
    const piece = await newPiece();
    const underA = await originalReading(piece.id, red.one, 'A', '10', 'ground red');
    const matched = await trialAgainst(piece.id, underA.id);
    await read(matched.id, { ...red.two, illuminant: 'A', observer: '2' });
    const unmatched = await trialAgainst(piece.id, underA.id);
    await read(unmatched.id, { ...red.two, illuminant: 'D65', observer: '10' });

    const res = await researcher.get('/api/export/trials.csv').buffer(true).expect(200);
    const rows: Record<string, string>[] = parse(res.text, { columns: true });
    const one = rows.find((r) => r.code === matched.code)!;
    expect(one).toMatchObject({
      targetSource: 'instrument',
      targetIlluminant: 'A',
      targetObserver: '10°',
      resultIlluminant: 'A',
      resultObserver: '2°',
      resultReadings: '1',
    });
    expect(Math.abs(Number(one.deltaE00) - red.dE00)).toBeLessThanOrEqual(0.005);
    // ΔL* of pair 30 by hand: 36.2715 − 36.4612 = −0.1897.
    expect(one.dL).toBe('-0.19');
    expect(one.colourNote).toMatch(/Observers differ/);
    const two = rows.find((r) => r.code === unmatched.code)!;
    expect(two).toMatchObject({ targetIlluminant: 'A', resultIlluminant: '', deltaE00: '', dL: '' });
    expect(two.colourNote).toMatch(/No reading of the swatch under A\/10°/);
  });

  it('prints the conditions and ΔL*, ΔC*ab, ΔH*ab on the sample card, or which reading is missing', async () => {
    const piece = await newPiece();
    const underA = await originalReading(piece.id, red.one, 'A', '10', 'ground red');
    const t = await trialAgainst(piece.id, underA.id);
    await read(t.id, { ...red.two, illuminant: 'A', observer: '10' });
    const pdfOf = async (id: number) =>
      readPdf(
        (
          await dyer
            .get(`/api/trials/${id}/card.pdf`)
            .buffer(true)
            .parse((r, cb) => {
              const chunks: Buffer[] = [];
              r.on('data', (c: Buffer) => chunks.push(c));
              r.on('end', () => cb(null, Buffer.concat(chunks)));
            })
            .expect(200)
        ).body as Buffer,
      );
    const card = await pdfOf(t.id);
    expect(card.text).toContain('instrument reading · A/10°');
    expect(card.text).toMatch(/ΔL\* −0\.19/);
    expect(card.text).toContain('ΔC*ab');
    expect(card.text).toContain('ΔH*ab');

    const none = await trialAgainst(piece.id, underA.id);
    await read(none.id, { ...red.two, illuminant: 'D50', observer: '2' });
    expect((await pdfOf(none.id)).text).toContain('no reading of the swatch under A');
  });
});

describe('POST /api/colour/difference with viewing conditions', () => {
  const difference = (reference: object, sample: object) =>
    request(app).post('/api/colour/difference').set('Origin', ORIGIN).send({ reference, sample });

  it('refuses colours under different illuminants (422), in plain words', async () => {
    const res = await difference(
      { ...blue.one, illuminant: 'D65', observer: '10' },
      { ...blue.two, illuminant: 'A', observer: '10' },
    ).expect(422);
    expect(res.body.error.message).toMatch(/different illuminants \(the reference under D65, the sample under A\)/);
    expect(res.body.error.details.fields['sample.illuminant']).toBeDefined();
  });

  it('compares under one illuminant, says when the observers differ, and gives the same figures as without conditions', async () => {
    const plain = await difference(blue.one, blue.two).expect(200);
    expect(plain.body.conditions).toEqual({
      illuminant: null,
      referenceObserver: null,
      sampleObserver: null,
      observersDiffer: false,
    });
    const same = await difference(
      { ...blue.one, illuminant: 'D50', observer: '2' },
      { ...blue.two, illuminant: 'D50', observer: '2' },
    ).expect(200);
    expect(Math.abs(same.body.deltaE00 - blue.dE00)).toBeLessThanOrEqual(blue.tolerance);
    expect(same.body.note).toBeNull();
    const mixed = await difference(
      { ...blue.one, illuminant: 'D65', observer: '10' },
      { ...blue.two, illuminant: 'D65', observer: '2' },
    ).expect(200);
    expect(mixed.body.deltaE00).toBe(plain.body.deltaE00);
    expect(mixed.body.conditions).toEqual({
      illuminant: 'D65',
      referenceObserver: '10',
      sampleObserver: '2',
      observersDiffer: true,
    });
    expect(mixed.body.note).toMatch(/Observers differ/);
  });

  it('refuses an unknown illuminant (400)', async () => {
    const res = await difference({ ...blue.one, illuminant: 'C' }, blue.two).expect(400);
    expect(Object.keys(res.body.error.details.fields)).toContain('reference.illuminant');
  });
});

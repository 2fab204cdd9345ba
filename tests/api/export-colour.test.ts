import request from 'supertest';
import { parse } from 'csv-parse/sync';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { PaletteColour, Photo, Piece, sequelize } from '../../server/models/index.ts';
import { makePiece, makeRegion, makeTrial } from '../../server/seed/factories.ts';
import { hexToLab } from '../../shared/search/lab.ts';
import { signedInAgent } from '../support/agents.ts';

const app = createApp();
afterAll(() => sequelize.close());

const rand = (n: number, chars = 'bcdfghjkmnpqrstvwxz') =>
  Array.from({ length: n }, () => chars[Math.floor(Math.random() * chars.length)]).join('');
const u = rand(10);
const sha = () => rand(64, '0123456789abcdef');
const rows = (text: string): Record<string, string>[] => parse(text, { columns: true });

// A colour far from the demo's and other tests' (a dark teal with a random twist), so the shade results are ours alone.
const TEAL = `#1${rand(1, '0123456789')}5a5${rand(1, '0123456789')}`;

async function photoWith(
  piece: Piece,
  colours: Array<{ hex: string; share: number; background?: boolean }>,
  regionLabel?: string,
) {
  const photo = await Photo.create({
    pieceId: piece.id,
    trialId: null,
    sha256: sha(),
    format: 'jpeg',
    bytes: 1,
    width: 100,
    height: 100,
    originalName: `${u}.jpg`,
    caption: null,
    capturedAt: null,
    exif: {},
    gps: null,
    derivatives: {},
    referencePatch: null,
    correction: null,
    createdById: null,
  });
  const region = regionLabel
    ? await makeRegion({
        photoId: photo.id,
        x: 0,
        y: 0,
        w: 10,
        h: 10,
        purpose: 'colour-area',
        label: regionLabel,
        createdById: null,
      })
    : null;
  await PaletteColour.bulkCreate(
    colours.map((c, i) => ({
      photoId: photo.id,
      regionId: region?.id ?? null,
      variant: 'raw' as const,
      rank: i + 1,
      ...hexToLab(c.hex),
      hex: c.hex,
      share: c.share,
      spread: 1,
      name: 'test',
      tradeName: null,
      background: c.background ?? false,
    })),
  );
  return photo;
}

let published: Piece, draft: Piece;
beforeAll(async () => {
  published = await makePiece({ status: 'published', title: `Teal sprig ${u}` });
  draft = await makePiece({ status: 'draft', title: `Teal study ${u}` });
  await photoWith(published, [
    { hex: TEAL, share: 0.75 },
    { hex: '#e8dcc0', share: 0.25 },
    { hex: '#f2f2f0', share: 0.3, background: true },
  ]);
  await photoWith(published, [{ hex: TEAL, share: 1 }], `ground ${u}`);
  await photoWith(draft, [{ hex: TEAL, share: 1 }]);
});

describe('trials CSV', () => {
  it('carries the fastness grades beside the colour columns; every role that reads trials may export it', async () => {
    const dyer = await signedInAgent(app, 'dyer');
    const me = (await dyer.get('/api/auth/me').expect(200)).body.user;
    const trial = await makeTrial({
      code: `T-1901-${rand(5, '0123456789')}`,
      pieceId: published.id,
      seriesId: null,
      cell: null,
      targetPaletteColourId: null,
      targetRegionId: null,
      targetMeasurementId: null,
      dyerId: me.id,
      fibre: 'wool',
      weave: null,
      gsm: null,
      dryMassG: 20,
      notes: null,
      startedOn: null,
      fastness: {
        light: { blueWool: '5', informal: true, testedOn: '2026-06-01' },
        washing: { change: '4-5', staining: '4', informal: false },
        rubbingDry: { staining: '4', informal: false },
        rubbingWet: { staining: '2-3', informal: false },
      },
    });
    for (const role of ['dyer', 'researcher', 'curator', 'admin'] as const) {
      const agent = role === 'dyer' ? dyer : await signedInAgent(app, role);
      const res = await agent.get('/api/export/trials.csv').buffer(true).expect(200);
      const row = rows(res.text).find((r) => r.code === trial.code)!;
      expect([
        role,
        row.lightBlueWool,
        row.washChangeGrey,
        row.washStainingGrey,
        row.rubDryStainingGrey,
        row.rubWetStainingGrey,
      ]).toEqual([role, '5', '4-5', '4', '4', '2-3']);
      expect(row.fastnessInformal).toBe('light');
      expect(row.fastnessTestedOn).toBe('light 2026-06-01');
      // The colour columns are still there, each colour with its source and viewing conditions.
      for (const col of [
        'targetSource',
        'targetIlluminant',
        'targetObserver',
        'resultSource',
        'deltaE00',
        'cmc21',
        'verdict',
      ])
        expect(row).toHaveProperty(col);
    }
    await request(app).get('/api/export/trials.csv').expect(401);
  });
});

describe('palettes CSV', () => {
  it('lists each palette colour with its photo, region, variant, L*a*b*, hex and share, as an image estimate under D65/2°', async () => {
    const res = await request(app).get(`/api/pieces/${published.id}/palettes.csv`).buffer(true).expect(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    const all = rows(res.text);
    expect(all).toHaveLength(4);
    const lab = hexToLab(TEAL);
    const whole = all.find((r) => r.region === 'whole photo' && r.hex === TEAL)!;
    expect(whole).toMatchObject({
      pieceAccessionNumber: published.accessionNumber,
      photoName: `${u}.jpg`,
      variant: 'raw',
      rank: '1',
      background: 'no',
      share: '0.7500',
      source: 'image-estimate',
      illuminant: 'D65',
      observer: '2°',
    });
    expect(Number(whole.L)).toBeCloseTo(lab.L, 2);
    expect(Number(whole.a)).toBeCloseTo(lab.a, 2);
    expect(Number(whole.b)).toBeCloseTo(lab.b, 2);
    expect(all.find((r) => r.background === 'yes')!.share).toBe('0.3000');
    expect(all.filter((r) => r.region === `ground ${u}`)).toHaveLength(1);
  });

  it('follows the pieces’ read rule: visitors get published pieces only', async () => {
    await request(app).get(`/api/pieces/${draft.id}/palettes.csv`).expect(404);
    const researcher = await signedInAgent(app, 'researcher');
    expect(
      rows((await researcher.get(`/api/pieces/${draft.id}/palettes.csv`).buffer(true).expect(200)).text),
    ).toHaveLength(1);

    const visitorAll = rows((await request(app).get('/api/export/palettes.csv').buffer(true).expect(200)).text);
    expect(visitorAll.some((r) => r.pieceAccessionNumber === published.accessionNumber)).toBe(true);
    expect(visitorAll.some((r) => r.pieceAccessionNumber === draft.accessionNumber)).toBe(false);
    const signedAll = rows((await researcher.get('/api/export/palettes.csv').buffer(true).expect(200)).text);
    expect(signedAll.some((r) => r.pieceAccessionNumber === draft.accessionNumber)).toBe(true);
  });
});

describe('shade-search CSV', () => {
  it('takes the shade search’s parameters and writes its results in the same order, with the same visibility', async () => {
    const query = { hex: TEAL.slice(1), maxDeltaE: '1' };
    const json = (await request(app).get('/api/search/shade').query(query).expect(200)).body;
    const csv = rows((await request(app).get('/api/export/shade.csv').query(query).buffer(true).expect(200)).text);
    expect(csv.map((r) => r.pieceAccessionNumber)).toEqual(
      json.items.map((i: { accessionNumber: string }) => i.accessionNumber),
    );
    expect(csv.map((r) => r.pieceAccessionNumber)).toContain(published.accessionNumber);
    expect(csv.map((r) => r.pieceAccessionNumber)).not.toContain(draft.accessionNumber);
    const ours = csv.find((r) => r.pieceAccessionNumber === published.accessionNumber)!;
    expect(ours).toMatchObject({
      hex: TEAL,
      source: 'image-estimate',
      illuminant: 'D65',
      observer: '2°',
      queryHex: TEAL,
      maxDeltaE: '1',
    });
    expect(Number(ours.deltaE00)).toBeLessThan(0.001);

    const curator = await signedInAgent(app, 'curator');
    const seen = rows((await curator.get('/api/export/shade.csv').query(query).buffer(true).expect(200)).text);
    expect(seen.map((r) => r.pieceAccessionNumber)).toContain(draft.accessionNumber);
    // One page when asked for one, as the JSON answers it.
    const page = rows(
      (
        await curator
          .get('/api/export/shade.csv')
          .query({ ...query, limit: '1', page: '2' })
          .buffer(true)
          .expect(200)
      ).text,
    );
    expect(page).toHaveLength(1);
    expect(page[0].rank).toBe('2');
    expect(page[0].pieceAccessionNumber).toBe(seen[1].pieceAccessionNumber);
  });

  it('refuses what the shade search refuses', async () => {
    const res = await request(app).get('/api/export/shade.csv').query({ hex: 'zzz' }).expect(400);
    expect(res.body.error.details.fields).toHaveProperty('hex');
    await request(app).get('/api/export/shade.csv').query({ hex: '9b2f2f', maxDeltaE: '31' }).expect(400);
  });
});

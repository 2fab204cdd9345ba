import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { AuditEvent, PaletteColour, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { deltaE00, type Lab } from '../../shared/colour/index.ts';
import { ingested } from '../support/photos.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { chartPhoto, TEXTILES } from '../support/chart-image.ts';

// McCamy, Marcus & Davidson (1976), adapted to D65 by Bradford (colour-science 0.4.6): tests/reference/.
const REF = JSON.parse(readFileSync(new URL('../reference/colour-rendition-chart-1976.json', import.meta.url), 'utf8'));
const PUBLISHED: Lab[] = REF.patches.map((p: { lab_D65_bradford: number[] }) => {
  const [L, a, b] = p.lab_D65_bradford;
  return { L, a, b };
});

const app = createApp();
let curator: Awaited<ReturnType<typeof signedInAgent>>;
let pieceId: number;
let photo: { id: number; width: number; height: number };
let corners: Array<{ x: number; y: number }>;

type Palette = { regionId: number | null; variant: string; colours: { lab: Lab; background: boolean }[] };

beforeAll(async () => {
  curator = await signedInAgent(app, 'curator');
  pieceId = (await makePiece({ title: 'Chartcloth sampler' })).id;
  const shot = await chartPhoto(PUBLISHED);
  corners = shot.scene.corners;
  const res = await curator
    .post(`/api/pieces/${pieceId}/photos`)
    .set('Origin', ORIGIN)
    .attach('photo', shot.buffer, 'chart.png')
    .expect(201);
  photo = res.body.photos[0];
  await ingested(photo.id);
}, 60_000);
afterAll(() => sequelize.close());

const put = (body: unknown, id = photo.id) =>
  curator
    .put(`/api/photos/${id}/chart`)
    .set('Origin', ORIGIN)
    .send(body as object);

describe('a colour chart in a photo', () => {
  it('refuses malformed marks with messages beside the fields, never a 5xx', async () => {
    const cases: Array<[unknown, string, RegExp]> = [
      [{}, 'corners', /four corner/i],
      [{ corners: corners.slice(0, 3), reference: 'published-1976' }, 'corners', /exactly four/i],
      [{ corners: [corners[0], corners[2], corners[1], corners[3]], reference: 'published-1976' }, 'corners', /convex/],
      [{ corners: [{ x: 'left', y: 3 }, ...corners.slice(1)], reference: 'published-1976' }, 'corners.0.x', /pixels/],
      [{ corners, reference: { measured: PUBLISHED.slice(0, 20) } }, 'reference.measured', /exactly 24/],
      [{ corners, reference: 'my-own' }, 'reference', /published 1976/],
      [
        { corners: [corners[0], corners[1], { x: 5000, y: 800 }, corners[3]], reference: 'published-1976' },
        'corners.2.x',
        /outside/i,
      ],
    ];
    for (const [body, field, message] of cases) {
      const res = await put(body);
      expect(res.status, JSON.stringify(body).slice(0, 80)).toBe(400);
      expect(
        res.body.error.details.fields[field]?.join(' ') ?? JSON.stringify(res.body.error.details.fields),
        field,
      ).toMatch(message);
    }
  });

  it('answers per-patch ΔE00 before and after, a grade, and a calibrated palette that stays true (point 7)', async () => {
    const res = await put({ corners, reference: 'published-1976' }).expect(200);
    const chart = res.body.chart;
    expect(chart.patches).toHaveLength(24);
    expect(chart.before.mean).toBeGreaterThan(5);
    expect(chart.after.mean).toBeLessThanOrEqual(1.5);
    expect(chart.patches[18].name).toMatch(/white/);
    expect(chart.grade.after).toBe('4 stars');
    expect(chart.tolerances.source).toMatch(/recalled from memory/);

    const palettes: Palette[] = res.body.palettes;
    const calibrated = palettes.find((p) => p.regionId === null && p.variant === 'calibrated')!;
    expect(calibrated).toBeTruthy();
    expect(palettes.some((p) => p.regionId === null && p.variant === 'raw')).toBe(true);
    for (const t of TEXTILES) {
      const best = Math.min(...calibrated.colours.map((c) => deltaE00(t.lab, c.lab)));
      expect(best, t.name).toBeLessThanOrEqual(2);
    }
    // The chart is left out of every palette: no vivid patch colour appears.
    for (const p of palettes)
      for (const patch of [13, 17, 18])
        expect(Math.min(...p.colours.map((c) => deltaE00(PUBLISHED[patch - 1], c.lab)))).toBeGreaterThan(5);

    const got = await curator.get(`/api/photos/${photo.id}`).expect(200);
    expect(got.body.photo.chart.after.mean).toBeCloseTo(chart.after.mean, 6);
    expect(got.body.photo.trustedVariant).toBe('calibrated');
    const audit = await AuditEvent.findOne({ where: { entity: 'piece', entityId: pieceId, action: 'chart-set' } });
    expect(audit).toBeTruthy();

    // Shade search indexes the calibrated colours (the most trustworthy variant): the madder is found by its truth,
    // and what it answers is the calibrated colour, not the raw one.
    const madder = TEXTILES[0].lab;
    const found = await curator
      .get('/api/search/shade')
      .query({ L: madder.L, a: madder.a, b: madder.b, maxDeltaE: 2, q: 'chartcloth' })
      .expect(200);
    const hit = found.body.items.find((i: { photoId: number }) => i.photoId === photo.id);
    expect(hit).toBeTruthy();
    const calibratedLabs = calibrated.colours.map((c) => c.lab);
    const nearest = Math.min(...calibratedLabs.map((l) => deltaE00(l, hit.colour.lab)));
    // (the index keeps single-precision L*a*b*, hence the small tolerance)
    expect(nearest).toBeLessThan(0.01);
  }, 60_000);

  it("takes the institution's own 24 measured values", async () => {
    const measured = PUBLISHED.map((l) => ({ L: l.L, a: l.a + 1, b: l.b }));
    const res = await put({ corners, reference: { measured } }).expect(200);
    expect(res.body.chart.reference).toBe('measured');
    expect(res.body.chart.patches[0].reference.a).toBeCloseTo(PUBLISHED[0].a + 1, 9);
  }, 60_000);

  it('a uniform photo gives no correction: 422 with a message, not a 5xx', async () => {
    const piece = await makePiece();
    const sharp = (await import('sharp')).default;
    const flat = await sharp({ create: { width: 400, height: 300, channels: 3, background: '#777777' } })
      .png()
      .toBuffer();
    const up = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', flat, 'flat.png')
      .expect(201);
    const res = await put(
      {
        corners: [
          { x: 10, y: 10 },
          { x: 300, y: 10 },
          { x: 300, y: 200 },
          { x: 10, y: 200 },
        ],
        reference: 'published-1976',
      },
      up.body.photos[0].id,
    );
    expect(res.status).toBe(422);
    expect(res.body.error.message).toMatch(/corners/);
  });

  it('a colour area added after the chart gets its own calibrated palette', async () => {
    await put({ corners, reference: 'published-1976' }).expect(200);
    const madder = TEXTILES[0];
    const res = await curator
      .post(`/api/photos/${photo.id}/regions`)
      .set('Origin', ORIGIN)
      .send({ ...madder.rect, purpose: 'colour-area', label: 'madder' })
      .expect(201);
    const own: Palette | undefined = res.body.palettes.find(
      (p: Palette) => p.regionId === res.body.region.id && p.variant === 'calibrated',
    );
    expect(own).toBeTruthy();
    expect(deltaE00(madder.lab, own!.colours[0].lab)).toBeLessThanOrEqual(2);

    // A trial aimed at that region compares against its calibrated colour, and says so.
    const dyer = await signedInAgent(app, 'dyer');
    const trial = (
      await dyer
        .post(`/api/pieces/${pieceId}/trials`)
        .set('Origin', ORIGIN)
        .send({ dryMassG: 20, targetRegionId: res.body.region.id })
        .expect(201)
    ).body.trial;
    const got = (await dyer.get(`/api/trials/${trial.id}`).expect(200)).body.trial;
    expect(got.colour.target.label).toMatch(/calibrated from the colour chart/);
    expect(deltaE00(madder.lab, got.colour.target)).toBeLessThanOrEqual(2);
  }, 60_000);

  it('DELETE removes the chart and its calibrated palettes; raw stays', async () => {
    const res = await curator.delete(`/api/photos/${photo.id}/chart`).set('Origin', ORIGIN).expect(200);
    expect(res.body.chart).toBeNull();
    expect(await PaletteColour.count({ where: { photoId: photo.id, variant: 'calibrated' } })).toBe(0);
    expect(await PaletteColour.count({ where: { photoId: photo.id, variant: 'raw' } })).toBeGreaterThan(0);
    const got = await curator.get(`/api/photos/${photo.id}`).expect(200);
    expect(got.body.photo.trustedVariant).toBe('raw');
  }, 60_000);

  it('admins set the tolerance levels, naming a source; others may only read them', async () => {
    const admin = await signedInAgent(app, 'admin');
    const bad = await admin
      .put('/api/photos/chart-tolerances')
      .set('Origin', ORIGIN)
      .send({ levels: [{ name: '', meanDeltaE00: -1 }], source: '' });
    expect(bad.status).toBe(400);
    expect(Object.keys(bad.body.error.details.fields)).toEqual(
      expect.arrayContaining(['levels.0.name', 'levels.0.meanDeltaE00', 'source']),
    );
    await curator
      .put('/api/photos/chart-tolerances')
      .set('Origin', ORIGIN)
      .send({ levels: [{ name: 'fine', meanDeltaE00: 3 }], source: 'house rule' })
      .expect(403);
    const got = await curator.get('/api/photos/chart-tolerances').expect(200);
    expect(got.body.levels.length).toBeGreaterThan(0);
  });
});

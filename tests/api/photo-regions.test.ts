import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import sharp from 'sharp';
import { createApp } from '../../server/app.ts';
import { AuditEvent, PaletteColour, Photo, Region, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { deletePhoto, setPaletteBackground } from '../../server/services/photos.ts';
import { deltaE00, hexToLab } from '../../shared/colour/index.ts';
import { ingested } from '../support/photos.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg, uploadedFiles } from '../support/images.ts';

const app = createApp();
let curator: Awaited<ReturnType<typeof signedInAgent>>;
let photo: {
  id: number;
  width: number;
  height: number;
  palette: { id: number; hex: string; share: number; background: boolean }[];
};
let pieceId: number;
beforeAll(async () => {
  curator = await signedInAgent(app, 'curator');
  pieceId = (await makePiece()).id;
  const res = await curator
    .post(`/api/pieces/${pieceId}/photos`)
    .set('Origin', ORIGIN)
    .attach('photo', await clothJpeg({ seed: 11 }), 'regions.jpg')
    .expect(201);
  await ingested(res.body.photos[0].id);
  photo = (await curator.get(`/api/photos/${res.body.photos[0].id}`).expect(200)).body.photo;
});
afterAll(() => sequelize.close());

type Palette = {
  regionId: number | null;
  variant: string;
  colours: { id: number; hex: string; share: number; background: boolean }[];
};
const shareSum = (p: Palette) => p.colours.filter((c) => !c.background).reduce((s, c) => s + c.share, 0);

describe('regions and the palette', () => {
  it('writes nothing and removes no file when a photo change does not commit', async () => {
    const row = await Photo.findByPk(photo.id, { rejectOnEmpty: true });
    const files = await uploadedFiles();
    const palette = async () =>
      (await PaletteColour.findAll({ where: { photoId: photo.id }, order: [['id', 'ASC']] })).map((c) => [
        c.id,
        c.share,
        c.background,
      ]);
    const before = await palette();
    const audits = await AuditEvent.count({ where: { entity: 'piece', entityId: pieceId } });
    const colour = await PaletteColour.findOne({
      where: { photoId: photo.id, regionId: null, variant: 'raw', background: false },
      order: [['rank', 'DESC']],
      rejectOnEmpty: true,
    });
    await expect(
      sequelize.transaction(async (transaction) => {
        await setPaletteBackground({ actor: null, transaction, input: { photo: row, colour, background: true } });
        await deletePhoto({ actor: null, transaction, input: { photo: row } });
        throw new Error('stopped mid-way');
      }),
    ).rejects.toThrow('stopped mid-way');
    expect(await Photo.findByPk(photo.id)).not.toBeNull();
    expect(await palette()).toEqual(before);
    expect(await uploadedFiles()).toEqual(files);
    expect(await AuditEvent.count({ where: { entity: 'piece', entityId: pieceId } })).toBe(audits);
  });

  it('adds a colour-area region as a Web Annotation rectangle and answers its own palette', async () => {
    // The red rectangle of the test image (tests/support/images.ts) is at x 60, y 60, 160 × 200 px, colour #9b2d2a.
    const res = await curator
      .post(`/api/photos/${photo.id}/regions`)
      .set('Origin', ORIGIN)
      .send({ x: 80, y: 80, w: 100, h: 150, purpose: 'colour-area', label: 'madder red' })
      .expect(201);
    expect(res.body.region).toMatchObject({
      purpose: 'colour-area',
      label: 'madder red',
      selector: { type: 'FragmentSelector', value: 'xywh=pixel:80,80,100,150' },
    });
    const own = (res.body.palettes as Palette[]).find((p) => p.regionId === res.body.region.id && p.variant === 'raw')!;
    expect(shareSum(own)).toBeCloseTo(1, 6);
    // JPEG at quality 92 with noise σ 1.5: the region's main colour should sit within ΔE00 2 of the painted one (own tolerance).
    expect(deltaE00(hexToLab('#9b2d2a'), hexToLab(own.colours[0].hex))).toBeLessThan(2);
    const list = await curator.get(`/api/photos/${photo.id}/regions`).expect(200);
    expect(list.body.items.map((r: { id: number }) => r.id)).toContain(res.body.region.id);
    const audit = await AuditEvent.findOne({ where: { entity: 'piece', entityId: pieceId, action: 'region-added' } });
    expect(audit).not.toBeNull();
  });

  it('refuses rectangles off the photo with per-field details, and unknown purposes', async () => {
    const off = await curator
      .post(`/api/photos/${photo.id}/regions`)
      .set('Origin', ORIGIN)
      .send({ x: 400, y: 0, w: 200, h: 10, purpose: 'motif' })
      .expect(400);
    expect(off.body.error.details.fields.w[0]).toMatch(/480 px/);
    const bad = await curator
      .post(`/api/photos/${photo.id}/regions`)
      .set('Origin', ORIGIN)
      .send({ x: 0, y: 0, w: 0, h: 10, purpose: 'halo' })
      .expect(400);
    expect(Object.keys(bad.body.error.details.fields)).toEqual(expect.arrayContaining(['w', 'purpose']));
  });

  it('changes and removes a region, each time answering re-extracted palettes', async () => {
    const made = (
      await curator
        .post(`/api/photos/${photo.id}/regions`)
        .set('Origin', ORIGIN)
        .send({ x: 280, y: 100, w: 100, h: 100, purpose: 'motif' })
        .expect(201)
    ).body;
    const changed = await curator
      .patch(`/api/photos/${photo.id}/regions/${made.region.id}`)
      .set('Origin', ORIGIN)
      .send({ label: 'blue oval' })
      .expect(200);
    expect(changed.body.region.label).toBe('blue oval');
    expect(changed.body.palettes.some((p: Palette) => p.regionId === made.region.id)).toBe(true);
    const removed = await curator
      .delete(`/api/photos/${photo.id}/regions/${made.region.id}`)
      .set('Origin', ORIGIN)
      .expect(200);
    expect(removed.body.palettes.some((p: Palette) => p.regionId === made.region.id)).toBe(false);
    expect(await Region.findByPk(made.region.id)).toBeNull();
    await curator.delete(`/api/photos/${photo.id}/regions/${made.region.id}`).set('Origin', ORIGIN).expect(404);
  });

  it('marks a reference patch: raw and corrected palettes are both kept; removing it leaves raw only', async () => {
    // The cream ground (#e9dfc8) at the top left stands in for the neutral patch.
    const set = await curator
      .put(`/api/photos/${photo.id}/reference-patch`)
      .set('Origin', ORIGIN)
      .send({ x: 5, y: 5, w: 40, h: 40 })
      .expect(200);
    const variants = new Set((set.body.palettes as Palette[]).filter((p) => p.regionId === null).map((p) => p.variant));
    expect(variants).toEqual(new Set(['raw', 'corrected']));
    expect((await Photo.findByPk(photo.id))!.correction).toMatchObject({ method: 'bradford', to: 'D65' });
    const cleared = await curator.delete(`/api/photos/${photo.id}/reference-patch`).set('Origin', ORIGIN).expect(200);
    expect((cleared.body.palettes as Palette[]).every((p) => p.variant === 'raw')).toBe(true);
  });

  it('toggles a palette colour as background and re-normalises the shares', async () => {
    const detail = (await curator.get(`/api/photos/${photo.id}`).expect(200)).body.photo;
    const whole = (detail.palettes as Palette[]).find((p) => p.regionId === null && p.variant === 'raw')!;
    const counted = whole.colours.filter((c) => !c.background);
    expect(counted.length).toBeGreaterThan(1);
    const target = counted[counted.length - 1];
    const res = await curator
      .patch(`/api/photos/${photo.id}/palette/${target.id}`)
      .set('Origin', ORIGIN)
      .send({ background: true })
      .expect(200);
    const after = (res.body.palettes as Palette[]).find((p) => p.regionId === null && p.variant === 'raw')!;
    expect(after.colours.find((c) => c.id === target.id)!.background).toBe(true);
    expect(shareSum(after)).toBeCloseTo(1, 6);
    const back = await curator
      .patch(`/api/photos/${photo.id}/palette/${target.id}`)
      .set('Origin', ORIGIN)
      .send({ background: false })
      .expect(200);
    const restored = (back.body.palettes as Palette[]).find((p) => p.regionId === null && p.variant === 'raw')!;
    for (const c of whole.colours) expect(restored.colours.find((x) => x.id === c.id)!.share).toBeCloseTo(c.share, 6);
  });

  it('saving, editing and deleting a colour area changes only its own palette: whole-photo rows keep their ids and values', async () => {
    const wholeRows = async () =>
      (await PaletteColour.findAll({ where: { photoId: photo.id, regionId: null }, order: [['id', 'ASC']] })).map(
        (c) => ({
          id: c.id,
          variant: c.variant,
          rank: c.rank,
          L: c.L,
          a: c.a,
          b: c.b,
          share: c.share,
          background: c.background,
        }),
      );
    const start = await wholeRows();
    expect(start.length).toBeGreaterThan(0);
    const made = (
      await curator
        .post(`/api/photos/${photo.id}/regions`)
        .set('Origin', ORIGIN)
        .send({ x: 300, y: 100, w: 80, h: 120, purpose: 'colour-area', label: 'blue' })
        .expect(201)
    ).body;
    expect(await wholeRows()).toEqual(start);
    const ownIds = async () =>
      (await PaletteColour.findAll({ where: { regionId: made.region.id } })).map((c) => c.id).sort();
    const before = await ownIds();
    expect(before.length).toBeGreaterThan(0);
    // Moving the rectangle within the same blue recomputes its palette over the same rows.
    await curator
      .patch(`/api/photos/${photo.id}/regions/${made.region.id}`)
      .set('Origin', ORIGIN)
      .send({ x: 310, y: 110 })
      .expect(200);
    expect(await ownIds()).toEqual(before);
    expect(await wholeRows()).toEqual(start);
    await curator.delete(`/api/photos/${photo.id}/regions/${made.region.id}`).set('Origin', ORIGIN).expect(200);
    expect(await ownIds()).toEqual([]);
    expect(await wholeRows()).toEqual(start);
  });

  it('an exclusion recomputes the whole photo over the same rows and keeps a background flag set by hand', async () => {
    const whole = async () =>
      PaletteColour.findAll({ where: { photoId: photo.id, regionId: null, variant: 'raw' }, order: [['rank', 'ASC']] });
    const start = await whole();
    const target = start.filter((c) => !c.background).at(-1)!;
    await curator
      .patch(`/api/photos/${photo.id}/palette/${target.id}`)
      .set('Origin', ORIGIN)
      .send({ background: true })
      .expect(200);
    // A small exclusion in the cream ground: the same colours, so the same rows, with shares changed a little.
    const res = await curator
      .post(`/api/photos/${photo.id}/regions`)
      .set('Origin', ORIGIN)
      .send({ x: 420, y: 10, w: 40, h: 40, purpose: 'exclusion' })
      .expect(201);
    const after = await whole();
    expect(after.map((c) => c.id).sort()).toEqual(start.map((c) => c.id).sort());
    const again = after.find((c) => c.id === target.id)!;
    expect([again.background, again.backgroundManual]).toEqual([true, true]);
    expect(after.filter((c) => !c.background).reduce((s, c) => s + c.share, 0)).toBeCloseTo(1, 6);
    await curator.delete(`/api/photos/${photo.id}/regions/${res.body.region.id}`).set('Origin', ORIGIN).expect(200);
    await curator
      .patch(`/api/photos/${photo.id}/palette/${target.id}`)
      .set('Origin', ORIGIN)
      .send({ background: false })
      .expect(200);
  });

  it('shows how the colours were read, and refuses a CMYK upload in plain words with nothing stored', async () => {
    const detail = (await curator.get(`/api/photos/${photo.id}`).expect(200)).body.photo;
    expect(detail.colour).toEqual({
      profile: null,
      assumedSrgb: true,
      bitDepth: 8,
      colourSpace: 'RGB',
      cmykConverted: false,
      conversion: 'none',
    });
    const filesBefore = await uploadedFiles();
    const cmyk = await sharp(await clothJpeg({ seed: 13 }))
      .toColourspace('cmyk')
      .withIccProfile('cmyk')
      .jpeg()
      .toBuffer();
    const res = await curator
      .post(`/api/pieces/${pieceId}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', cmyk, 'print.jpg')
      .expect(415);
    expect(res.body.error.code).toBe('cmyk_not_supported');
    expect(res.body.error.message).toMatch(/print\.jpg: .*CMYK.*Export it as RGB/);
    expect(await uploadedFiles()).toEqual(filesBefore);
  });

  it('keeps regions and palette changes to curators and admins', async () => {
    const body = { x: 1, y: 1, w: 10, h: 10, purpose: 'exclusion' };
    await request(app).post(`/api/photos/${photo.id}/regions`).set('Origin', ORIGIN).send(body).expect(401);
    for (const role of ['researcher', 'dyer'] as const) {
      const agent = await signedInAgent(app, role);
      await agent.post(`/api/photos/${photo.id}/regions`).set('Origin', ORIGIN).send(body).expect(403);
      await agent
        .put(`/api/photos/${photo.id}/reference-patch`)
        .set('Origin', ORIGIN)
        .send({ x: 1, y: 1, w: 5, h: 5 })
        .expect(403);
      await agent.patch(`/api/photos/${photo.id}`).set('Origin', ORIGIN).send({ caption: 'no' }).expect(403);
      await agent.delete(`/api/photos/${photo.id}`).set('Origin', ORIGIN).expect(403);
      await agent.get(`/api/photos/${photo.id}/regions`).expect(200);
    }
    // Visitors do not see photos of draft pieces at all.
    await request(app).get(`/api/photos/${photo.id}/regions`).expect(401);
  });

  it('edits a caption and view, then removes the photo with its rows and files', async () => {
    const own = (
      await curator
        .post(`/api/pieces/${pieceId}/photos`)
        .set('Origin', ORIGIN)
        .attach('photo', await clothJpeg({ seed: 12 }), 'gone.jpg')
        .expect(201)
    ).body.photos[0];
    await ingested(own.id);
    const patched = await curator
      .patch(`/api/photos/${own.id}`)
      .set('Origin', ORIGIN)
      .send({ caption: 'verso, raking light', view: 'raking' })
      .expect(200);
    expect(patched.body.photo).toMatchObject({ caption: 'verso, raking light', view: 'raking' });
    await curator.patch(`/api/photos/${own.id}`).set('Origin', ORIGIN).send({ view: 'sideways' }).expect(400);
    const filesBefore = await uploadedFiles();
    expect(filesBefore.some((f) => f.startsWith(`derivatives/${own.id}/`))).toBe(true);
    await curator.delete(`/api/photos/${own.id}`).set('Origin', ORIGIN).expect(204);
    expect(await Photo.findByPk(own.id)).toBeNull();
    expect(await PaletteColour.count({ where: { photoId: own.id } })).toBe(0);
    const filesAfter = await uploadedFiles();
    expect(filesAfter.some((f) => f.startsWith(`derivatives/${own.id}/`) || f.includes(own.sha256))).toBe(false);
    // Adding, editing and removing are in the piece's history, naming the photo.
    for (const action of ['photo-added', 'photo-updated', 'photo-removed']) {
      const rows = await AuditEvent.findAll({ where: { entity: 'piece', entityId: pieceId, action } });
      expect(rows.some((r) => JSON.stringify(r.changes).includes(String(own.id)))).toBe(true);
    }
  });
});

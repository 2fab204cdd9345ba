import { beforeAll, describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { createApp } from '../../server/app.ts';
import { mkdir, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { AuditEvent, Job, PaletteColour, Photo, Trial, User, sequelize } from '../../server/models/index.ts';
import { uploadsDir, tilesDir } from '../../server/media/paths.ts';
import { deleteTrial } from '../../server/services/trials/trials.ts';
import { makeMeasurement, makePiece } from '../../server/seed/factories.ts';
import { deltaE00, hexToLab } from '../../shared/colour/index.ts';
import { ingested } from '../support/photos.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg, uploadedFiles } from '../support/images.ts';
import { useTestMail } from '../support/mail.ts';

const app = createApp();
let dyer: Awaited<ReturnType<typeof signedInAgent>>;
let curator: Awaited<ReturnType<typeof signedInAgent>>;
useTestMail();
beforeAll(async () => {
  dyer = await signedInAgent(app, 'dyer');
  curator = await signedInAgent(app, 'curator');
});

/** A flat swatch of one colour, as a dyed sample photographed square on. */
const swatchPng = (hex: string) =>
  sharp({ create: { width: 240, height: 160, channels: 3, background: hex } })
    .png()
    .toBuffer();

describe('result swatches and which colour is used', () => {
  it('takes a swatch photo through the pipeline, then lets instrument readings outrank its estimate; a region reading outranks the region palette', async () => {
    const curatorUser = await User.findOne({ where: { email: 'curator@demo.test' }, rejectOnEmpty: true });
    const piece = await makePiece({ createdById: curatorUser.id });
    // The original: the red rectangle of tests/support/images.ts (x 60, y 60, 160 × 200 px, #9b2d2a) marked as a colour area.
    const photo = (
      await curator
        .post(`/api/pieces/${piece.id}/photos`)
        .set('Origin', ORIGIN)
        .attach('photo', await clothJpeg({ seed: 5 }), 'original.jpg')
        .expect(201)
    ).body.photos[0];
    const region = (
      await curator
        .post(`/api/photos/${photo.id}/regions`)
        .set('Origin', ORIGIN)
        .send({ x: 80, y: 80, w: 100, h: 150, purpose: 'colour-area', label: 'madder red' })
        .expect(201)
    ).body.region;

    const trial = (
      await dyer
        .post(`/api/pieces/${piece.id}/trials`)
        .set('Origin', ORIGIN)
        .send({ dryMassG: 20, targetRegionId: region.id })
        .expect(201)
    ).body.trial;
    expect(trial.colour.target).toMatchObject({ source: 'image-estimate' });
    expect(deltaE00(hexToLab('#9b2d2a'), trial.colour.target)).toBeLessThan(2);

    const up = await dyer
      .post(`/api/trials/${trial.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', await swatchPng('#a33a2e'), 'swatch.png')
      .expect(201);
    expect(up.body.photo.view).toBe('swatch');
    expect((await Photo.findByPk(up.body.photo.id))?.trialId).toBe(trial.id);
    // Stored at once; its ingest job reads the palette.
    expect(up.body.photo.ingest).toEqual({ stage: 'queued', error: null });
    await ingested(up.body.photo.id);
    const swatch = (await dyer.get(`/api/photos/${up.body.photo.id}`).expect(200)).body.photo;
    // A flat PNG: its leading palette colour is the painted one (sRGB → CIELAB, own tolerance ΔE00 < 1).
    expect(deltaE00(hexToLab('#a33a2e'), swatch.palette[0].lab)).toBeLessThan(1);

    const estimated = (await dyer.get(`/api/trials/${trial.id}`).expect(200)).body.trial;
    expect(estimated.colour.result.source).toBe('image-estimate');
    expect(estimated.colour.difference.deltaE00).toBeGreaterThan(0);
    expect(estimated.photos).toHaveLength(1);

    await dyer
      .post(`/api/trials/${trial.id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ L: 40, a: 40, b: 25 })
      .expect(201);
    await dyer
      .post(`/api/trials/${trial.id}/measurements`)
      .set('Origin', ORIGIN)
      .send({ L: 42, a: 42, b: 27 })
      .expect(201);
    await makeMeasurement({
      pieceId: null,
      regionId: region.id,
      trialId: null,
      instrument: 'bench spectrophotometer',
      geometry: 'd:8°',
      specular: 'SCI',
      L: 38,
      a: 41,
      b: 24,
      label: 'madder red, measured',
      takenOn: null,
      createdById: null,
    });
    const measured = (await dyer.get(`/api/trials/${trial.id}`).expect(200)).body.trial;
    expect(measured.colour.result).toMatchObject({
      source: 'instrument',
      L: 41,
      a: 41,
      b: 26,
      setAside: { source: 'image-estimate' },
    });
    expect(measured.colour.result.label).toMatch(/mean of 2/);
    expect(measured.colour.target).toMatchObject({
      source: 'instrument',
      L: 38,
      a: 41,
      b: 24,
      setAside: { source: 'image-estimate' },
    });
    expect(measured.colour.difference.deltaE00).toBeCloseTo(
      deltaE00({ L: 38, a: 41, b: 24 }, { L: 41, a: 41, b: 26 }),
      10,
    );
  });

  it('refuses a photo from someone who does not keep the trial, and a request without a file', async () => {
    const trial = (await dyer.post('/api/trials').set('Origin', ORIGIN).send({ dryMassG: 5 }).expect(201)).body.trial;
    await curator
      .post(`/api/trials/${trial.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', await swatchPng('#336699'), 's.png')
      .expect(403);
    const none = await dyer.post(`/api/trials/${trial.id}/photos`).set('Origin', ORIGIN).expect(400);
    expect(none.body.error.details.fields.photo).toBeDefined();
    await dyer
      .post(`/api/trials/${trial.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', Buffer.from('not an image at all'), 'x.png')
      .expect(415);
  });
});

describe('deleting a trial', () => {
  /** A swatch uploaded and processed (its ingest job run), so it has derivatives and a palette. */
  const uploadSwatch = async (trialId: number, hex: string) => {
    const id = (
      await dyer
        .post(`/api/trials/${trialId}/photos`)
        .set('Origin', ORIGIN)
        .attach('photo', await swatchPng(hex), 'swatch.png')
        .expect(201)
    ).body.photo.id as number;
    await ingested(id);
    return id;
  };
  /** A stand-in tile, as the tiling job would leave it. */
  const fakeTile = async (photoId: number) => {
    const file = path.join(uploadsDir(), tilesDir(photoId), 'iiif', 'info.json');
    await mkdir(path.dirname(file), { recursive: true });
    await writeFile(file, '{}');
  };
  const filesOf = (files: string[], photoId: number) =>
    files.filter((f) => f.startsWith(`derivatives/${photoId}/`) || f.startsWith(`tiles/${photoId}/`));

  it('removes its swatch photos with their palettes, files and tiles, and says so in its history', async () => {
    const filesBefore = await uploadedFiles();
    const trial = (await dyer.post('/api/trials').set('Origin', ORIGIN).send({ dryMassG: 10 }).expect(201)).body.trial;
    const photoId = await uploadSwatch(trial.id, '#5a7d3c');
    await fakeTile(photoId);
    expect(filesOf(await uploadedFiles(), photoId).length).toBeGreaterThan(1);
    expect(await AuditEvent.count({ where: { entity: 'trial', entityId: trial.id, action: 'photo-added' } })).toBe(1);
    const m = (
      await dyer
        .post(`/api/trials/${trial.id}/measurements`)
        .set('Origin', ORIGIN)
        .send({ L: 50, a: 10, b: 10 })
        .expect(201)
    ).body.measurement;
    await dyer.delete(`/api/trials/${trial.id}/measurements/${m.id}`).set('Origin', ORIGIN).expect(204);
    expect(
      await AuditEvent.count({ where: { entity: 'trial', entityId: trial.id, action: 'measurement-removed' } }),
    ).toBe(1);

    await dyer.delete(`/api/trials/${trial.id}`).set('Origin', ORIGIN).expect(204);
    expect(await Photo.findByPk(photoId)).toBeNull();
    expect(await PaletteColour.count({ where: { photoId } })).toBe(0);
    expect(await Job.count({ where: { subjectType: 'photo', subjectId: photoId, state: 'queued' } })).toBe(0);
    // Derivatives, tiles and the master (no other photo has the same bytes) are gone.
    expect(await uploadedFiles()).toEqual(filesBefore);
    expect(await AuditEvent.count({ where: { entity: 'trial', entityId: trial.id, action: 'trial-removed' } })).toBe(1);
  });

  it('leaves the trial, its photo and its files as they were when the transaction does not commit', async () => {
    const created = (await dyer.post('/api/trials').set('Origin', ORIGIN).send({ dryMassG: 10 }).expect(201)).body
      .trial;
    const photoId = await uploadSwatch(created.id, '#2f4f8a');
    const files = await uploadedFiles();
    const trial = await Trial.findByPk(created.id, { rejectOnEmpty: true });
    await expect(
      sequelize.transaction(async (transaction) => {
        await deleteTrial({ actor: null, transaction, input: { trial } });
        throw new Error('stopped mid-way');
      }),
    ).rejects.toThrow('stopped mid-way');
    expect(await Trial.findByPk(created.id)).not.toBeNull();
    expect(await Photo.findByPk(photoId)).not.toBeNull();
    expect(await PaletteColour.count({ where: { photoId } })).toBeGreaterThan(0);
    expect(await uploadedFiles()).toEqual(files);
    expect(await AuditEvent.count({ where: { entity: 'trial', entityId: created.id, action: 'trial-removed' } })).toBe(
      0,
    );
  });
});

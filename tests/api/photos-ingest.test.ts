import { Op } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { enqueueMissingIngest } from '../../server/jobs/handlers/ingest-photo.ts';
import { Job, PaletteColour, Photo, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { INGEST_STEPS } from '../../shared/schemas/ingest.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg } from '../support/images.ts';
import { ingested } from '../support/photos.ts';

// Ingest as a job (issue 18): the upload stores the master and answers at once; the ingest-photo job reads EXIF,
// makes previews and the palette and builds the tiles, the photo's stage following; a failure can be retried.
const app = createApp();
afterAll(() => sequelize.close());

async function upload(buffer: Buffer, name: string) {
  const curator = await signedInAgent(app, 'curator');
  const piece = await makePiece({ status: 'draft' });
  const res = await curator
    .post(`/api/pieces/${piece.id}/photos`)
    .set('Origin', ORIGIN)
    .attach('photo', buffer, name)
    .expect(201);
  return { curator, piece, photo: res.body.photos[0] };
}

describe('ingest as a job', () => {
  it('answers 201 at stage queued with one ingest job, then the job runs every step to done', async () => {
    const { curator, photo } = await upload(await clothJpeg({ seed: 21, gps: true }), 'queued.jpg');
    expect(photo.ingest).toEqual({ stage: 'queued', error: null });
    expect(photo.palette).toEqual([]);
    const jobs = await Job.findAll({ where: { type: 'ingest-photo', subjectType: 'photo', subjectId: photo.id } });
    expect(jobs.map((j) => j.state)).toEqual(['queued']);
    // Until its EXIF is read, nobody is offered the master of a photo that may carry GPS except those who may see it.
    const researcher = await signedInAgent(app, 'researcher');
    const early = (await researcher.get(`/api/photos/${photo.id}`).expect(200)).body.photo;
    expect(early.urls).not.toHaveProperty('master');
    await researcher.get(`/media/photos/${photo.id}/master`).expect(404);

    const [stored] = await ingested(photo.id);
    expect(stored.ingestStage).toBe('done');
    expect(stored.gps).toEqual({ latitude: 54.5, longitude: -2.25 });
    const done = (await curator.get(`/api/photos/${photo.id}`).expect(200)).body.photo;
    expect(done.ingest).toEqual({ stage: 'done', error: null });
    expect(done.palette.length).toBeGreaterThan(0);
    expect(done.colour).toMatchObject({ bitDepth: 8 });
    await curator.get(done.urls.display).expect(200);
    await curator.get(`/iiif/photos/${photo.id}/info.json`).expect(200);
    expect((await Job.findByPk(jobs[0].id))!.state).toBe('done');
    expect(INGEST_STEPS).toEqual(['reading', 'palette', 'tiles']);
  });

  it('POST /api/photos/:id/ingest/retry: 409 unless failed; a failed ingest is queued again with its reason cleared', async () => {
    const whole = await clothJpeg({ seed: 22 });
    const { curator, photo } = await upload(whole.subarray(0, 4000), 'cut.jpg');
    const refused = await curator.post(`/api/photos/${photo.id}/ingest/retry`).set('Origin', ORIGIN).expect(409);
    expect(refused.body.error.message).toMatch(/has not failed/);

    const [failed] = await ingested(photo.id);
    expect([failed.ingestStage, failed.ingestError]).toEqual([
      'failed',
      'The image is truncated or damaged and cannot be decoded.',
    ]);
    const shown = (await curator.get(`/api/photos/${photo.id}`).expect(200)).body.photo;
    expect(shown.ingest).toEqual({ stage: 'failed', error: failed.ingestError });

    // Who may edit the photo may retry it.
    for (const role of ['researcher', 'dyer'] as const)
      await (
        await signedInAgent(app, role)
      )
        .post(`/api/photos/${photo.id}/ingest/retry`)
        .set('Origin', ORIGIN)
        .expect(403);
    const res = await curator.post(`/api/photos/${photo.id}/ingest/retry`).set('Origin', ORIGIN).expect(200);
    expect(res.body).toEqual({ ingest: { stage: 'queued', error: null } });
    const jobs = await Job.findAll({ where: { type: 'ingest-photo', subjectType: 'photo', subjectId: photo.id } });
    expect(jobs.map((j) => [j.state, j.attempts])).toEqual([['queued', 0]]);
    // The same file fails the same way again, with the same reason.
    expect((await ingested(photo.id))[0].ingestStage).toBe('failed');
    expect(await PaletteColour.count({ where: { photoId: photo.id } })).toBe(0);
  });

  it('queues at start the ingest of photos still waiting without a job (photos from before ingest jobs), once', async () => {
    const piece = await makePiece({ status: 'draft' });
    const photo = await Photo.create({
      pieceId: piece.id,
      trialId: null,
      sha256: 'd'.repeat(64),
      format: 'jpeg',
      bytes: 1,
      width: 10,
      height: 10,
      originalName: null,
      caption: null,
      capturedAt: null,
      exif: {},
      gps: null,
      derivatives: {},
      referencePatch: null,
      correction: null,
      createdById: null,
    });
    const jobsOf = () => Job.count({ where: { type: 'ingest-photo', subjectType: 'photo', subjectId: photo.id } });
    expect(photo.ingestStage).toBe('queued');
    expect(await jobsOf()).toBe(0);
    await enqueueMissingIngest();
    expect(await jobsOf()).toBe(1);
    await enqueueMissingIngest();
    expect(await jobsOf()).toBe(1);
    // A bare row has no master: its job fails at once with the reason.
    const [failed] = await ingested(photo.id);
    expect(failed.ingestStage).toBe('failed');
    expect(failed.ingestError).toMatch(/no master file/);
  });

  it('the demo seed ends with every demo photo processed (previews, palette, tiles)', async () => {
    const demo = await Photo.findAll({ where: { originalName: { [Op.like]: 'demo-%.jpg' } } });
    expect(demo.length).toBeGreaterThan(0);
    expect(demo.filter((p) => p.ingestStage !== 'done').map((p) => p.id)).toEqual([]);
    expect(demo.every((p) => p.derivatives.display && p.colour)).toBe(true);
  });
});

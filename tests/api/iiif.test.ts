import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { rm } from 'node:fs/promises';
import sharp from 'sharp';
import { createApp } from '../../server/app.ts';
import { Job, Photo, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { ingested, makePhotoWithMaster } from '../support/photos.ts';

// The manifests name the host they were asked on: two public names stand in for a real deployment's.
const app = createApp({ allowedHosts: ['archive.example'] });
afterAll(() => sequelize.close());

let published: Awaited<ReturnType<typeof makePiece>>;
let draft: Awaited<ReturnType<typeof makePiece>>;
let photo: Photo;
let masterBuffer: Buffer;
let draftPhoto: Photo;

beforeAll(async () => {
  published = await makePiece({
    status: 'published',
    title: 'Trellis sample for tiling',
    description: 'Test piece with three bands.',
    creditLine: 'Test credit line',
    dateText: 'about 1780',
    dateEdtf: '1780~',
    techniques: ['block printing'],
    dyestuffs: [{ name: 'madder', evidence: 'identified' }],
    historicalMordants: [{ name: 'iron(II) acetate', evidence: 'attributed' }],
  });
  draft = await makePiece({ status: 'draft' });
  ({ photo, buffer: masterBuffer } = await makePhotoWithMaster(published.id, {
    width: 1500,
    height: 1000,
    regions: [{ x: 100, y: 120, w: 300, h: 200, label: 'pink ground' }],
  }));
  ({ photo: draftPhoto } = await makePhotoWithMaster(draft.id, { width: 600, height: 400 }));
}, 60_000);

describe('deep-zoom tiles (IIIF Image API 3, level 0)', () => {
  it('marks the photo done and records the job with progress 1', async () => {
    expect(photo.ingestStage).toBe('done');
    const job = await Job.findOne({ where: { subjectType: 'photo', subjectId: photo.id }, order: [['id', 'DESC']] });
    expect(job?.state).toBe('done');
    expect(job?.progress).toBe(1);
  });

  it('serves info.json with this server as id, and a tile that sharp decodes at the size the URL names', async () => {
    const res = await request(app)
      .get(`/iiif/photos/${photo.id}/info.json`)
      .set('Host', 'archive.example:8080')
      .expect(200);
    const info = JSON.parse(res.text);
    // Required properties per https://iiif.io/api/image/3.0/#51-image-information-request
    expect(info['@context']).toBe('http://iiif.io/api/image/3/context.json');
    expect(info.id).toBe(`http://archive.example:8080/iiif/photos/${photo.id}`);
    expect(info.type).toBe('ImageService3');
    expect(info.protocol).toBe('http://iiif.io/api/image');
    expect(info.profile).toBe('level0');
    expect([info.width, info.height]).toEqual([1500, 1000]);
    expect(info.tiles[0].width).toBe(512);
    expect(res.headers['access-control-allow-origin']).toBe('*');

    // Top-left tile at full resolution: region 0,0,512,512 → size 512,512 (Image API 3 §4.1/§4.2).
    const tile = await request(app)
      .get(`/iiif/photos/${photo.id}/0,0,512,512/512,512/0/default.jpg`)
      .buffer(true)
      .expect(200);
    expect(tile.headers['content-type']).toBe('image/jpeg');
    const meta = await sharp(tile.body).metadata();
    expect([meta.format, meta.width, meta.height]).toEqual(['jpeg', 512, 512]);
    // The right-hand edge tile at scale factor 2 covers 1024..1500 → 476 px wide, halved to 238.
    const edge = await request(app)
      .get(`/iiif/photos/${photo.id}/1024,0,476,1000/238,500/0/default.jpg`)
      .buffer(true)
      .expect(200);
    const edgeMeta = await sharp(edge.body).metadata();
    expect([edgeMeta.width, edgeMeta.height]).toEqual([238, 500]);
    // The band colours of the master survive: the tile's top-left pixel is the first band's colour (±JPEG error).
    const { data } = await sharp(tile.body).raw().toBuffer({ resolveWithObject: true });
    const { data: m } = await sharp(masterBuffer)
      .extract({ left: 0, top: 0, width: 1, height: 1 })
      .raw()
      .toBuffer({ resolveWithObject: true });
    for (let c = 0; c < 3; c++) expect(Math.abs(data[c] - m[c])).toBeLessThan(12);
  });

  it('refuses tile paths outside the level-0 set and path tricks', async () => {
    await request(app).get(`/iiif/photos/${photo.id}/../../../package.json`).expect(404);
    await request(app).get(`/iiif/photos/${photo.id}/full/max/0/default.jpg`).expect(404);
    await request(app).get(`/iiif/photos/${photo.id}/0,0,512,512/512,512/0/default.png`).expect(404);
  });

  it('does not serve tiles or info.json of a draft piece to visitors (404), but does to staff', async () => {
    expect(draftPhoto.ingestStage).toBe('done');
    await request(app).get(`/iiif/photos/${draftPhoto.id}/info.json`).expect(404);
    await request(app).get(`/iiif/photos/${draftPhoto.id}/0,0,512,400/512,400/0/default.jpg`).expect(404);
    const researcher = await signedInAgent(app, 'researcher');
    const res = await researcher.get(`/iiif/photos/${draftPhoto.id}/info.json`).expect(200);
    expect(res.headers['cache-control']).toMatch(/private/);
  });

  it('marks a photo whose master is missing as failed, and lets a curator retry its job', async () => {
    const { photo: lost, file } = await makePhotoWithMaster(published.id, { width: 300, height: 200, ingest: false });
    await rm(file);
    const job = (await Job.findOne({ where: { type: 'ingest-photo', subjectType: 'photo', subjectId: lost.id } }))!;
    await ingested(lost.id);
    await lost.reload();
    expect(lost.ingestStage).toBe('failed');
    const curator = await signedInAgent(app, 'curator');
    const list = await curator.get(`/api/jobs?photoId=${lost.id}`).expect(200);
    expect(list.body.items[0]).toMatchObject({ id: job.id, state: 'failed', abilities: { retry: true } });
    expect(list.body.items[0].error).toMatch(/master file .* is missing/);
    const researcher = await signedInAgent(app, 'researcher');
    await researcher.post(`/api/jobs/${job.id}/retry`).set('Origin', ORIGIN).expect(403);
    await request(app).get(`/api/jobs?photoId=${lost.id}`).expect(401);
    const retried = await curator.post(`/api/jobs/${job.id}/retry`).set('Origin', ORIGIN).expect(200);
    expect(retried.body.job).toMatchObject({ state: 'queued', attempts: 0 });
    await lost.reload();
    expect(lost.ingestStage).toBe('queued');
    await curator.post(`/api/jobs/${job.id}/retry`).set('Origin', ORIGIN).expect(409);
  });
});

describe('IIIF Presentation 3 manifest', () => {
  it('describes a published piece with one canvas per photo, a painting annotation with the tile service, and the regions', async () => {
    const res = await request(app)
      .get(`/iiif/${published.id}/manifest.json`)
      .set('Host', 'archive.example')
      .expect(200);
    expect(res.headers['content-type']).toMatch(/application\/ld\+json/);
    const m = JSON.parse(res.text);
    // Required structure per https://iiif.io/api/presentation/3.0/#b-example-manifest-response
    expect(m['@context']).toBe('http://iiif.io/api/presentation/3/context.json');
    expect(m.id).toBe(`http://archive.example/iiif/${published.id}/manifest.json`);
    expect(m.type).toBe('Manifest');
    expect(m.label).toEqual({ en: ['Trellis sample for tiling'] });
    expect(m.summary).toEqual({ en: ['Test piece with three bands.'] });
    const meta = Object.fromEntries(
      m.metadata.map((e: { label: { en: string[] }; value: { none: string[] } }) => [e.label.en[0], e.value.none[0]]),
    );
    expect(meta['Accession number']).toBe(published.accessionNumber);
    expect(meta.Date).toBe('about 1780');
    expect(meta.Techniques).toBe('block printing');
    expect(meta.Dyestuffs).toBe('madder (identified)');
    expect(meta.Mordants).toBe('iron(II) acetate (attributed)');
    expect(m.requiredStatement).toEqual({ label: { en: ['Credit line'] }, value: { none: ['Test credit line'] } });

    const canvas = m.items.find((c: { id: string }) => c.id.endsWith(`/canvas/${photo.id}`));
    expect(canvas).toMatchObject({ type: 'Canvas', width: 1500, height: 1000 });
    for (const c of m.items) expect(Number.isInteger(c.width) && Number.isInteger(c.height)).toBe(true);
    const page = canvas.items[0];
    expect(page.type).toBe('AnnotationPage');
    const paint = page.items[0];
    expect(paint).toMatchObject({ type: 'Annotation', motivation: 'painting', target: canvas.id });
    expect(paint.body.type).toBe('Image');
    expect(paint.body.service[0]).toEqual({
      id: `http://archive.example/iiif/photos/${photo.id}`,
      type: 'ImageService3',
      profile: 'level0',
    });
    // The body's own image file is fetchable from the tile set.
    await request(app).get(new URL(paint.body.id).pathname).expect(200);

    const regions = canvas.annotations[0];
    expect(regions.type).toBe('AnnotationPage');
    expect(regions.items[0]).toMatchObject({
      type: 'Annotation',
      target: `${canvas.id}#xywh=100,120,300,200`,
      body: { type: 'TextualBody', value: 'pink ground' },
    });
  });

  it('answers 404 to visitors for a draft piece, and shows it to signed-in staff', async () => {
    await request(app).get(`/iiif/${draft.id}/manifest.json`).expect(404);
    await request(app).get('/iiif/999999999/manifest.json').expect(404);
    const curator = await signedInAgent(app, 'curator');
    const res = await curator.get(`/iiif/${draft.id}/manifest.json`).expect(200);
    expect(JSON.parse(res.text).items).toHaveLength(1);
  });
});

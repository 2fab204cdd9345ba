import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import sharp from 'sharp';
import { createApp } from '../../server/app.ts';
import { mediaLimits } from '../../server/media/limits.ts';
import { Photo, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg, pngClaiming, uploadedFiles } from '../support/images.ts';
import { ingested } from '../support/photos.ts';

const app = createApp();
let pieceId: number;
let jpeg: Buffer;
beforeAll(async () => {
  pieceId = (await makePiece({ status: 'draft' })).id;
  jpeg = await clothJpeg({ gps: true });
});
afterAll(() => sequelize.close());

const shareSum = (palette: { share: number; background: boolean }[]) =>
  palette.filter((c) => !c.background).reduce((s, c) => s + c.share, 0);

describe('photo upload', () => {
  it('stores a photo and answers its size, fixity, EXIF, palette and URLs; GPS only for curators and admins', async () => {
    const curator = await signedInAgent(app, 'curator');
    const res = await curator
      .post(`/api/pieces/${pieceId}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', jpeg, 'recto.jpg')
      .expect(201);
    // The upload answers at once (stage queued); EXIF, previews and palette follow from the ingest job.
    expect(res.body.photos[0]).toMatchObject({ width: 480, height: 320, ingest: { stage: 'queued', error: null } });
    expect(res.body.photos[0].palette).toEqual([]);
    await ingested(res.body.photos[0].id);
    const photo = (await curator.get(`/api/photos/${res.body.photos[0].id}`).expect(200)).body.photo;
    expect(photo.ingest).toEqual({ stage: 'done', error: null });
    expect(photo).toMatchObject({
      width: 480,
      height: 320,
      urls: { thumb: `/media/photos/${photo.id}/thumb`, display: expect.any(String), master: expect.any(String) },
    });
    expect(photo.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(photo.exif).toMatchObject({ make: 'Weldfold', model: 'Copy Stand 2' });
    // Latitude 54° 30′ N, longitude 2° 15′ W as written into the test file above.
    expect(photo.gps).toEqual({ latitude: 54.5, longitude: -2.25 });
    expect(photo.palette.length).toBeGreaterThan(0);
    expect(shareSum(photo.palette)).toBeCloseTo(1, 6);
    expect(photo.palette[0]).toMatchObject({
      hex: expect.stringMatching(/^#[0-9a-f]{6}$/),
      lab: { L: expect.any(Number), a: expect.any(Number), b: expect.any(Number) },
      source: 'image-estimate',
      illuminant: 'D65',
      observer: '2',
    });

    const researcher = await signedInAgent(app, 'researcher');
    const seen = await researcher.get(`/api/pieces/${pieceId}`).expect(200);
    const asResearcher = seen.body.photos.find((p: { id: number }) => p.id === photo.id);
    expect(asResearcher).not.toHaveProperty('gps');
    expect(JSON.stringify(asResearcher)).not.toMatch(/latitude|GPS/i);
    const asAdmin = (await (await signedInAgent(app, 'admin')).get(`/api/photos/${photo.id}`).expect(200)).body.photo;
    expect(asAdmin.gps).toEqual({ latitude: 54.5, longitude: -2.25 });
  });

  it('serves media by role: drafts to signed-in users only, masters with GPS only to curators and admins', async () => {
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece({ status: 'draft' });
    const photo = (
      await curator
        .post(`/api/pieces/${piece.id}/photos`)
        .set('Origin', ORIGIN)
        .attach('photo', jpeg, 'a.jpg')
        .expect(201)
    ).body.photos[0];
    await ingested(photo.id);
    const thumb = await curator.get(photo.urls.thumb).buffer(true).expect(200);
    expect(thumb.headers['content-type']).toBe('image/webp');
    const meta = await sharp(thumb.body).metadata();
    expect(Math.max(meta.width!, meta.height!)).toBeLessThanOrEqual(320);
    expect(meta.exif).toBeUndefined();
    const master = await curator.get(photo.urls.master).buffer(true).expect(200);
    expect(Buffer.compare(master.body, jpeg)).toBe(0);

    await request(app).get(photo.urls.thumb).expect(404);
    await curator.patch(`/api/pieces/${piece.id}`).set('Origin', ORIGIN).send({ status: 'published' }).expect(200);
    await request(app).get(photo.urls.thumb).expect(200);
    await request(app).get(photo.urls.display).expect(200);
    // Masters are for signed-in users (and, carrying GPS, for curators and admins): nobody is given a link they cannot follow.
    await request(app).get(photo.urls.master).expect(401);
    expect((await request(app).get(`/api/pieces/${piece.id}`).expect(200)).body.photos[0].urls).not.toHaveProperty(
      'master',
    );
    const researcher = await signedInAgent(app, 'researcher');
    await researcher.get(photo.urls.master).expect(404);
    expect((await researcher.get(`/api/photos/${photo.id}`).expect(200)).body.photo.urls).not.toHaveProperty('master');
    expect((await curator.get(`/api/photos/${photo.id}`).expect(200)).body.photo.urls.master).toBe(photo.urls.master);
    await request(app).get(`/media/photos/${photo.id}/original`).expect(400);
  });

  it('lets only curators and admins upload', async () => {
    await request(app)
      .post(`/api/pieces/${pieceId}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', jpeg, 'x.jpg')
      .expect(401);
    for (const role of ['researcher', 'dyer'] as const) {
      await (
        await signedInAgent(app, role)
      )
        .post(`/api/pieces/${pieceId}/photos`)
        .set('Origin', ORIGIN)
        .attach('photo', jpeg, 'x.jpg')
        .expect(403);
    }
    await (
      await signedInAgent(app, 'curator')
    )
      .post('/api/pieces/999999999/photos')
      .set('Origin', ORIGIN)
      .attach('photo', jpeg, 'x.jpg')
      .expect(404);
  });
});

describe('refused uploads leave nothing behind', () => {
  const truncated = async () => (await clothJpeg({ seed: 99 })).subarray(0, 4000);
  const cases: [string, () => Promise<Buffer> | Buffer, string, number][] = [
    ['text renamed .jpg', () => Buffer.from('This is a letter, not a photograph.\n'.repeat(20)), 'letter.jpg', 415],
    [
      'a pixel bomb (PNG claiming 40 000 × 30 000 px, above 1 gigapixel)',
      () => pngClaiming(40_000, 30_000),
      'bomb.png',
      422,
    ],
    ['zero bytes', () => Buffer.alloc(0), 'empty.jpg', 422],
  ];
  it.each(cases)('%s', async (_name, make, filename, status) => {
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece();
    const before = await uploadedFiles();
    const res = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', await make(), filename)
      .expect(status);
    expect(res.body.error.message).toContain(filename);
    expect(await Photo.count({ where: { pieceId: piece.id } })).toBe(0);
    expect(await uploadedFiles()).toEqual(before);
  });

  it('stores a truncated JPEG (its header reads) and its ingest fails with the reason, leaving no previews', async () => {
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece();
    const res = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', await truncated(), 'cut.jpg')
      .expect(201);
    const [stored] = await ingested(res.body.photos[0].id);
    expect(stored.ingestStage).toBe('failed');
    const photo = (await curator.get(`/api/photos/${stored.id}`).expect(200)).body.photo;
    expect(photo.ingest).toEqual({
      stage: 'failed',
      error: 'The image is truncated or damaged and cannot be decoded.',
    });
    expect(photo.palette).toEqual([]);
    await curator.get(photo.urls.display).expect(404);
  });

  it('answers an unknown field name with a clear 400, and no file with 400', async () => {
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece();
    const res = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('image', jpeg, 'x.jpg')
      .expect(400);
    expect(res.body.error.message).toMatch(/"photo"/);
    await curator.post(`/api/pieces/${piece.id}/photos`).set('Origin', ORIGIN).field('note', 'nothing').expect(400);
    expect(await Photo.count({ where: { pieceId: piece.id } })).toBe(0);
  });

  it('answers a file over the size limit with 413 naming it (MEDIA_MAX_BYTES, lowered to 1 MB here)', async () => {
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece();
    const before = await uploadedFiles();
    const saved = mediaLimits.maxBytes;
    mediaLimits.maxBytes = 1024 * 1024;
    const big = Buffer.concat([jpeg, Buffer.alloc(1024 * 1024 + 1 - jpeg.length)]);
    let res;
    try {
      res = await curator.post(`/api/pieces/${piece.id}/photos`).set('Origin', ORIGIN).attach('photo', big, 'huge.jpg');
    } finally {
      mediaLimits.maxBytes = saved;
    }
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({ code: 'too_large', message: 'A file is larger than 1 MB.' });
    expect(await Photo.count({ where: { pieceId: piece.id } })).toBe(0);
    expect(await uploadedFiles()).toEqual(before);
  });

  it('accepts several files at once', async () => {
    const curator = await signedInAgent(app, 'curator');
    const piece = await makePiece();
    const res = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', await clothJpeg({ seed: 3 }), 'one.jpg')
      .attach('photo', await clothJpeg({ seed: 4 }), 'two.jpg')
      .expect(201);
    expect(res.body.photos).toHaveLength(2);
    expect(await Photo.count({ where: { pieceId: piece.id } })).toBe(2);
  });
});

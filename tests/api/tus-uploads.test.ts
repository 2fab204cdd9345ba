import { createHash } from 'node:crypto';
import { existsSync } from 'node:fs';
import { readFile } from 'node:fs/promises';
import path from 'node:path';
import request from 'supertest';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApp } from '../../server/app.ts';
import { photoFile } from '../../server/media/pipeline.ts';
import { Photo, sequelize } from '../../server/models/index.ts';
import { sweepExpiredUploads, tusDir, tusStore } from '../../server/routes/uploads/index.ts';
import { makePiece, makeUser } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { paintCloth } from '../../server/seed/cloth-image.ts';
import { ingested } from '../support/photos.ts';

// Resumable uploads (issue 18): the tus 1.0 protocol at /api/uploads, spoken here by hand (creation, HEAD for the
// offset, PATCH from it) as https://tus.io/protocols/resumable-upload describes it.
const app = createApp();
afterAll(() => sequelize.close());

const TUS = { 'Tus-Resumable': '1.0.0' };
const b64 = (s: string) => Buffer.from(s, 'utf8').toString('base64');
const metadata = (fields: Record<string, string | number>) =>
  Object.entries(fields)
    .map(([k, v]) => `${k} ${b64(String(v))}`)
    .join(',');
const sha256 = (b: Buffer) => createHash('sha256').update(b).digest('hex');

let curator: Awaited<ReturnType<typeof signedInAgent>>;
let pieceId: number;
let tiff: Buffer;
beforeAll(async () => {
  curator = await signedInAgent(app, 'curator');
  pieceId = (await makePiece({ status: 'draft' })).id;
  // A 16-bit TIFF of a printed cloth, large enough that half of it is a real partial upload.
  const cloth = paintCloth({
    width: 900,
    height: 600,
    ground: '#e6d9bf',
    shapes: [{ kind: 'rect', x: 120, y: 100, w: 300, h: 260, colour: '#8f2f2a' }],
    noise: 2,
    seed: Math.floor(Math.random() * 1e6),
  });
  tiff = await sharp(Buffer.from(cloth.data), { raw: { width: cloth.width, height: cloth.height, channels: 3 } })
    .toColourspace('rgb16')
    .tiff({ compression: 'none' })
    .toBuffer();
});

function create(agent: typeof curator, size: number, fields: Record<string, string | number>) {
  return agent
    .post('/api/uploads')
    .set('Origin', ORIGIN)
    .set(TUS)
    .set('Upload-Length', String(size))
    .set('Upload-Metadata', metadata(fields));
}
const patch = (agent: typeof curator, location: string, offset: number, chunk: Buffer) =>
  agent
    .patch(location)
    .set('Origin', ORIGIN)
    .set(TUS)
    .set('Upload-Offset', String(offset))
    .set('Content-Type', 'application/offset+octet-stream')
    .send(chunk);

describe('tus resumable uploads at /api/uploads', () => {
  it('takes half a file, stops, resumes from the offset HEAD gives, and stores the master byte for byte', async () => {
    const created = await create(curator, tiff.length, { pieceId, filename: 'Rouleau-№3.tif' }).expect(201);
    const location = created.headers.location as string;
    expect(location).toMatch(/^\/api\/uploads\/[0-9a-z]+$/);

    const half = Math.floor(tiff.length / 2);
    const first = await patch(curator, location, 0, tiff.subarray(0, half)).expect(204);
    expect(first.headers['upload-offset']).toBe(String(half));
    expect(first.headers['upload-expires']).toBeTruthy();
    // A new connection (as after a drop or a page reload) asks where the server stands, then sends the rest.
    const head = await curator.head(location).set(TUS).expect(200);
    expect(head.headers['upload-offset']).toBe(String(half));
    expect(head.headers['upload-length']).toBe(String(tiff.length));
    const last = await patch(curator, location, half, tiff.subarray(half)).expect(204);
    const photoId = Number(last.headers['photo-id']);
    expect(photoId).toBeGreaterThan(0);

    const photo = await Photo.findByPk(photoId, { rejectOnEmpty: true });
    expect([photo.pieceId, photo.originalName, photo.sha256, photo.bytes]).toEqual([
      pieceId,
      'Rouleau-№3.tif',
      sha256(tiff),
      tiff.length,
    ]);
    const [done] = await ingested(photoId);
    expect(done.ingestStage).toBe('done');
    expect(sha256(await readFile(photoFile(done, 'master')))).toBe(sha256(tiff));
    const shown = (await curator.get(`/api/photos/${photoId}`).expect(200)).body.photo;
    expect(shown.colour).toMatchObject({ bitDepth: 16 });
    expect(shown.palette.length).toBeGreaterThan(0);
    // The partial file and its metadata are gone.
    const id = path.basename(location);
    expect(existsSync(path.join(tusDir(), id))).toBe(false);
    expect(existsSync(path.join(tusDir(), `${id}.json`))).toBe(false);
  });

  it('refuses other users, other origins and targets the user may not add to', async () => {
    await request(app)
      .post('/api/uploads')
      .set('Origin', ORIGIN)
      .set(TUS)
      .set('Upload-Length', '10')
      .set('Upload-Metadata', metadata({ pieceId }))
      .expect(401);
    // Another site's page cannot start or continue an upload with the user's cookie.
    await curator
      .post('/api/uploads')
      .set('Origin', 'https://elsewhere.example')
      .set(TUS)
      .set('Upload-Length', '10')
      .set('Upload-Metadata', metadata({ pieceId }))
      .expect(403);
    const researcher = await signedInAgent(app, 'researcher');
    const refused = await create(researcher, 10, { pieceId }).expect(403);
    expect(JSON.parse(refused.text).error.message).toBeTruthy();
    const noTarget = await create(curator, 10, { filename: 'x.jpg' }).expect(400);
    expect(JSON.parse(noTarget.text).error.message).toMatch(/pieceId.*trialId/);

    const location = (await create(curator, tiff.length, { pieceId }).expect(201)).headers.location as string;
    await patch(curator, location, 0, tiff.subarray(0, 1000)).expect(204);
    const other = await makeUser({
      role: 'curator',
      email: `tus-${Date.now()}@example.test`,
      password: 'pass-phrase-9',
    });
    const stranger = await signedInAgent(app, { email: other.email, password: 'pass-phrase-9' });
    await stranger.head(location).set(TUS).expect(404);
    await patch(stranger, location, 1000, tiff.subarray(1000, 2000)).expect(404);
    await curator.patch(location).set(TUS).set('Upload-Offset', '1000').expect(403);
    expect((await curator.head(location).set(TUS).expect(200)).headers['upload-offset']).toBe('1000');
  });

  it('checks the finished file by content: a file that is not an image is refused in words and nothing is kept', async () => {
    const text = Buffer.from('A letter about the pattern book, not a photograph.\n'.repeat(40));
    const before = await Photo.count({ where: { pieceId } });
    const location = (await create(curator, text.length, { pieceId, filename: 'letter.jpg' }).expect(201)).headers
      .location as string;
    const res = await patch(curator, location, 0, text).expect(415);
    expect(JSON.parse(res.text).error.code).toBe('unsupported_type');
    expect(await Photo.count({ where: { pieceId } })).toBe(before);
    expect(existsSync(path.join(tusDir(), path.basename(location)))).toBe(false);
  });

  it('removes an abandoned partial upload once it has expired (the expiry shortened for this test)', async () => {
    const location = (await create(curator, tiff.length, { pieceId }).expect(201)).headers.location as string;
    await patch(curator, location, 0, tiff.subarray(0, 5000)).expect(204);
    const id = path.basename(location);
    expect(existsSync(path.join(tusDir(), id))).toBe(true);
    const saved = tusStore.expirationPeriodInMilliseconds;
    tusStore.expirationPeriodInMilliseconds = 1;
    try {
      await new Promise((r) => setTimeout(r, 20));
      expect(await sweepExpiredUploads()).toBeGreaterThanOrEqual(1);
    } finally {
      tusStore.expirationPeriodInMilliseconds = saved;
    }
    expect(existsSync(path.join(tusDir(), id))).toBe(false);
    expect(existsSync(path.join(tusDir(), `${id}.json`))).toBe(false);
    expect([404, 410]).toContain((await curator.head(location).set(TUS)).status);
  });
});

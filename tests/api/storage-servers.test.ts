import { createHash } from 'node:crypto';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { Readable } from 'node:stream';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { drain } from '../../server/jobs/worker.ts';
import { sequelize } from '../../server/models/index.ts';
import type { S3Storage } from '../../server/storage/s3.ts';
import { clothJpeg } from '../support/images.ts';
import { startTestS3, type S3Fake } from '../support/s3.ts';
import { freePort, startServerProcess, type ServerProcess } from '../support/server.ts';

// Issue 18, item 5: two app server processes with object storage (the s3rver fake) and NO shared disk (each its own
// UPLOADS_DIR) both serve a photo's derivatives and tiles uploaded through the other. The tiles are built by
// whichever server's worker claims the job.

const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');
const binary = (res: import('superagent').Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c)).on('end', () => cb(null, Buffer.concat(chunks)));
};
async function bytesOf(stream: Readable) {
  const chunks: Buffer[] = [];
  for await (const c of stream) chunks.push(c as Buffer);
  return Buffer.concat(chunks);
}
/** Every file under a folder, relative to it. */
async function filesUnder(dir: string) {
  const entries = await readdir(dir, { recursive: true, withFileTypes: true }).catch(() => []);
  return entries.filter((e) => e.isFile()).map((e) => path.relative(dir, path.join(e.parentPath, e.name)));
}

let s3: S3Fake;
let bucket: S3Storage;
let a: ServerProcess;
let b: ServerProcess;
const uploads: string[] = [];

beforeAll(async () => {
  // Ingest jobs other suites left queued belong to the shared test uploads folder: run them here first, so these
  // servers (which do not see that folder) do not claim them.
  await drain({ types: ['ingest-photo'] });
  s3 = await startTestS3();
  bucket = s3.driver();
  for (let i = 0; i < 2; i++) uploads.push(await mkdtemp(path.join(tmpdir(), `tinctoria-server-${i}-`)));
  const [portA, portB] = [await freePort(), await freePort()];
  [a, b] = await Promise.all([
    startServerProcess(portA, 90_000, { ...s3.env, UPLOADS_DIR: uploads[0] }, { waitForSearch: false }),
    startServerProcess(portB, 90_000, { ...s3.env, UPLOADS_DIR: uploads[1] }, { waitForSearch: false }),
  ]);
}, 180_000);

afterAll(async () => {
  await Promise.all([a?.stop(), b?.stop()]);
  await s3?.close();
  for (const dir of uploads) await rm(dir, { recursive: true, force: true });
  await sequelize.close();
});

async function curatorOn(server: ServerProcess) {
  const agent = request.agent(server.url);
  await agent
    .post('/api/auth/login')
    .set('Origin', server.url)
    .send({ email: 'curator@demo.test', password: 'tinctoria-demo' })
    .expect(200);
  return agent;
}

describe('two app servers, object storage, no shared disk', () => {
  it('each serves the derivatives and tiles of a photo uploaded through the other', async () => {
    for (const [from, to] of [
      [a, b],
      [b, a],
    ]) {
      const writer = await curatorOn(from);
      const reader = await curatorOn(to);
      const piece = await writer
        .post('/api/pieces')
        .set('Origin', from.url)
        .send({
          accessionNumber: `S3.${Date.now()}.${from.port}`,
          objectName: 'fragment',
          title: 'Two servers',
          dateEdtf: '1800',
        })
        .expect(201);
      const jpeg = await clothJpeg({ seed: 900_000 + from.port });
      // Sent as the upload box sends it: tus, half of the file, then (a new connection, as after a drop) HEAD for
      // the offset and the rest. The partial file lives on the receiving server; the finished master in the bucket.
      const tus = { 'Tus-Resumable': '1.0.0', Origin: from.url };
      const b64 = (v: string | number) => Buffer.from(String(v)).toString('base64');
      const created = await writer
        .post('/api/uploads')
        .set(tus)
        .set('Upload-Length', String(jpeg.length))
        .set('Upload-Metadata', `pieceId ${b64(piece.body.piece.id)},filename ${b64('cloth.jpg')}`)
        .expect(201);
      const location = created.headers.location as string;
      const half = jpeg.length >> 1;
      const sendFrom = (offset: number, chunk: Buffer) =>
        writer
          .patch(location)
          .set(tus)
          .set('Upload-Offset', String(offset))
          .set('Content-Type', 'application/offset+octet-stream')
          .send(chunk);
      await sendFrom(0, jpeg.subarray(0, half)).expect(204);
      const offset = Number((await writer.head(location).set(tus).expect(200)).headers['upload-offset']);
      expect(offset).toBe(half);
      const done = await sendFrom(offset, jpeg.subarray(offset)).expect(204);
      const id = Number(done.headers['photo-id']);
      expect(id).toBeGreaterThan(0);

      // The photo's ingest job (EXIF, previews, palette, tiles) runs on whichever server's worker takes it; the other
      // server then serves the derivatives byte for byte as stored, and the master.
      await expect
        .poll(async () => (await reader.get(`/api/photos/${id}`)).body.photo?.ingest?.stage ?? 'unknown', {
          timeout: 60_000,
        })
        .toBe('done');
      for (const kind of ['display', 'thumb'] as const) {
        const res = await reader.get(`/media/photos/${id}/${kind}`).buffer(true).parse(binary).expect(200);
        expect(sha(res.body)).toBe(sha(await bytesOf(await bucket.get(`derivatives/${id}/${kind}.webp`))));
      }
      const master = await reader.get(`/media/photos/${id}/master`).buffer(true).parse(binary).expect(200);
      expect(sha(master.body)).toBe(sha(jpeg));

      // Tiles: built by whichever server's worker takes the job; the other one serves them.
      await expect
        .poll(async () => (await reader.get(`/iiif/photos/${id}/info.json`)).status, { timeout: 60_000 })
        .toBe(200);
      const info = (await reader.get(`/iiif/photos/${id}/info.json`).expect(200)).body;
      expect(info.id).toBe(`${to.url}/iiif/photos/${id}`);
      const tiles: string[] = [];
      for await (const o of bucket.list(`tiles/${id}/iiif/`)) if (o.key.endsWith('default.jpg')) tiles.push(o.key);
      expect(tiles.length).toBeGreaterThan(0);
      for (const server of [reader, writer]) {
        const tile = await server
          .get(`/iiif/photos/${id}/${tiles[0].slice(`tiles/${id}/iiif/`.length)}`)
          .buffer(true)
          .parse(binary)
          .expect(200);
        expect(tile.headers['content-type']).toBe('image/jpeg');
        expect(sha(tile.body)).toBe(sha(await bytesOf(await bucket.get(tiles[0]))));
      }
    }
    // Neither server kept a master, derivative or tile on its own disk (only staging under tmp/, if anything).
    for (const dir of uploads) expect((await filesUnder(dir)).filter((f) => !f.startsWith('tmp'))).toEqual([]);
  }, 180_000);
});

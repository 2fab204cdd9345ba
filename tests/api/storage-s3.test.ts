import { createHash, randomBytes } from 'node:crypto';
import path from 'node:path';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import yauzl from 'yauzl';
import { createApp } from '../../server/app.ts';
import { Photo, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { drain } from '../../server/jobs/worker.ts';
import { masterPath } from '../../server/media/paths.ts';
import { reconcileOrphans, ORPHAN_AGE_MS } from '../../server/media/reconcile.ts';
import { LocalStorage, localUploadsRoot, useStorage, type StorageDriver } from '../../server/storage/index.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg } from '../support/images.ts';
import { ingested, makePhotoWithMaster } from '../support/photos.ts';
import { reportPdf } from '../support/report-pdf.ts';
import { startTestS3, type S3Fake } from '../support/s3.ts';

// Issue 18, item 4: with S3-compatible object storage (the s3rver fake) the whole flow works without the uploads
// folder: upload → master and derivatives in the bucket → tiles built from a downloaded copy and stored in the
// bucket → all served through the app with its authorisation; the masters ZIP streams from the bucket; the fixity
// check re-hashes the stored masters; the reconciler works from bucket listings.

const app = createApp();
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
function unzip(buf: Buffer): Promise<Map<string, Buffer>> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(buf, { lazyEntries: true }, (err, zip) => {
      if (err || !zip) return reject(err);
      const files = new Map<string, Buffer>();
      zip.on('entry', (entry: yauzl.Entry) => {
        zip.openReadStream(entry, (e, stream) => {
          if (e || !stream) return reject(e);
          void bytesOf(stream).then((b) => {
            files.set(entry.fileName, b);
            zip.readEntry();
          });
        });
      });
      zip.on('end', () => resolve(files));
      zip.readEntry();
    });
  });
}

let s3: S3Fake;
let bucket: StorageDriver;
let restore: () => void;
const disk = new LocalStorage(localUploadsRoot());

beforeAll(async () => {
  // Ingest jobs other suites left queued belong to the local folder: run them before switching.
  await drain({ types: ['ingest-photo'] });
  s3 = await startTestS3();
  bucket = s3.driver();
  restore = useStorage(bucket);
});
afterAll(async () => {
  restore?.();
  await s3?.close();
  await sequelize.close();
});

describe('object storage (S3): upload to tiles through the app', () => {
  it('stores the master and derivatives in the bucket, builds tiles there, and serves them all', async () => {
    const piece = await makePiece({ status: 'draft' });
    const curator = await signedInAgent(app, 'curator');
    const jpeg = await clothJpeg({ seed: 700_000 + Math.floor(Math.random() * 1e6) });
    const up = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', jpeg, 'cloth.jpg')
      .expect(201);
    const id = up.body.photos[0].id as number;
    // Its ingest job (EXIF, previews, palette, tiles) reads the master from the bucket and stores what it makes there.
    await ingested(id);
    const photo = await Photo.findByPk(id, { rejectOnEmpty: true });
    expect(photo.sha256).toBe(sha(jpeg));
    const master = masterPath(photo.sha256, 'jpg');
    // In the bucket, byte for byte; nothing stored in the uploads folder.
    expect(sha(await bytesOf(await bucket.get(master)))).toBe(sha(jpeg));
    expect(await bucket.exists(`derivatives/${id}/display.webp`)).toBe(true);
    expect(await bucket.exists(`derivatives/${id}/thumb.webp`)).toBe(true);
    expect(await disk.exists(master)).toBe(false);
    expect(await disk.exists(`derivatives/${id}/display.webp`)).toBe(false);
    // The temp master (sent to the bucket before the transaction) was moved into place: none is left under tmp/.
    const temps = async () => {
      const out: string[] = [];
      for await (const o of bucket.list('tmp/')) out.push(o.key);
      return out;
    };
    expect(await temps()).toEqual([]);
    // A file cut short passes the header check: stored in the bucket, its ingest fails with the reason (and can be
    // retried or the photo removed); no temp object stays behind, and no derivative was written.
    const cut = await clothJpeg({ seed: 800_000 + Math.floor(Math.random() * 1e6) });
    const half = cut.subarray(0, cut.length >> 1);
    const cutUp = await curator
      .post(`/api/pieces/${piece.id}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', half, 'cut.jpg')
      .expect(201);
    const cutId = cutUp.body.photos[0].id as number;
    const [failed] = await ingested(cutId);
    expect(failed.ingestStage).toBe('failed');
    expect(failed.ingestError).toBeTruthy();
    expect(await temps()).toEqual([]);
    expect(await bucket.exists(masterPath(sha(half), 'jpg'))).toBe(true);
    expect(await bucket.exists(`derivatives/${cutId}/display.webp`)).toBe(false);

    // Derivatives and the master come back through the app, behind its rules.
    const display = await curator.get(`/media/photos/${id}/display`).buffer(true).parse(binary).expect(200);
    expect(display.headers['content-type']).toBe('image/webp');
    expect(sha(display.body)).toBe(sha(await bytesOf(await bucket.get(`derivatives/${id}/display.webp`))));
    await request(app).get(`/media/photos/${id}/display`).expect(404); // a visitor, a draft piece
    const whole = await curator.get(`/media/photos/${id}/master`).buffer(true).parse(binary).expect(200);
    expect(sha(whole.body)).toBe(sha(jpeg));
    const part = await curator
      .get(`/media/photos/${id}/master`)
      .set('Range', 'bytes=100-199')
      .buffer(true)
      .parse(binary)
      .expect(206);
    expect(part.headers['content-range']).toBe(`bytes 100-199/${jpeg.length}`);
    expect(part.body.equals(jpeg.subarray(100, 200))).toBe(true);
    await curator.get(`/media/photos/${id}/master`).set('Range', `bytes=${jpeg.length}-`).expect(416);
    const since = display.headers['last-modified'];
    expect(since).toBeTruthy();
    await curator.get(`/media/photos/${id}/display`).set('If-Modified-Since', since).expect(304);

    // The tile job reads the master from the bucket and stores the tree there; the app serves it.
    expect((await Photo.findByPk(id))?.ingestStage).toBe('done');
    const tileKeys: string[] = [];
    for await (const o of bucket.list(`tiles/${id}/iiif/`)) tileKeys.push(o.key);
    expect(tileKeys).toContain(`tiles/${id}/iiif/info.json`);
    expect(await disk.exists(`tiles/${id}/iiif/info.json`)).toBe(false);
    const info = (await curator.get(`/iiif/photos/${id}/info.json`).expect(200)).body;
    expect(info).toMatchObject({ id: expect.stringMatching(new RegExp(`/iiif/photos/${id}$`)), width: 480 });
    const tileKey = tileKeys.find((k) => k.endsWith('default.jpg'))!;
    const tile = await curator
      .get(`/iiif/photos/${id}/${tileKey.slice(`tiles/${id}/iiif/`.length)}`)
      .buffer(true)
      .parse(binary)
      .expect(200);
    expect(tile.headers['content-type']).toBe('image/jpeg');
    expect(sha(tile.body)).toBe(sha(await bytesOf(await bucket.get(tileKey))));
    await request(app).get(`/iiif/photos/${id}/info.json`).expect(404);

    // Deleting the photo removes its derivatives and tiles from the bucket (and the master no other photo shares).
    await curator.delete(`/api/photos/${id}`).set('Origin', ORIGIN).expect(204);
    expect(await bucket.exists(`derivatives/${id}/display.webp`)).toBe(false);
    expect(await bucket.exists(`tiles/${id}/iiif/info.json`)).toBe(false);
    expect(await bucket.exists(master)).toBe(false);
  });
});

describe('object storage (S3): palettes recomputed from the master', () => {
  it('reads the master through a local copy kept by its SHA-256 when a colour area is added', async () => {
    const piece = await makePiece({ status: 'draft' });
    const { photo, key } = await makePhotoWithMaster(piece.id, { width: 300, height: 200 });
    const curator = await signedInAgent(app, 'curator');
    const res = await curator
      .post(`/api/photos/${photo.id}/regions`)
      .set('Origin', ORIGIN)
      .send({ x: 10, y: 10, w: 80, h: 150, purpose: 'colour-area', label: 'left band' })
      .expect(201);
    expect(res.body.palettes.some((c: { regionId: number | null }) => c.regionId === res.body.region.id)).toBe(true);
    const copy = await disk.stat(`tmp/cache-${path.posix.basename(key)}`);
    expect(copy?.bytes).toBe(Number(photo.bytes));
  });
});

describe('object storage (S3): analysis report PDFs', () => {
  it('keeps an attached report in the bucket under reports/ and serves it back to the team', async () => {
    const piece = await makePiece({ status: 'published' });
    const researcher = await signedInAgent(app, 'researcher');
    const created = await researcher
      .post(`/api/pieces/${piece.id}/analyses`)
      .set('Origin', ORIGIN)
      .send({
        method: 'HPLC-DAD',
        site: 'red ground',
        laboratory: 'Test bench',
        analyst: 'A. Tester',
        analysedOn: '2024-05-02',
        findings: [{ substance: 'alizarin', confidence: 'confirmed' }],
      })
      .expect(201);
    const id = created.body.analysis.id as number;
    const pdf = await reportPdf(`Report ${randomBytes(6).toString('hex')}`);
    await researcher
      .post(`/api/analyses/${id}/report`)
      .set('Origin', ORIGIN)
      .attach('report', pdf, 'r.pdf')
      .expect(201);
    const key = `reports/${sha(pdf).slice(0, 2)}/${sha(pdf)}.pdf`;
    expect(sha(await bytesOf(await bucket.get(key)))).toBe(sha(pdf));
    expect(await disk.exists(key)).toBe(false);
    const back = await researcher.get(`/api/analyses/${id}/report`).buffer(true).parse(binary).expect(200);
    expect(back.headers['content-type']).toBe('application/pdf');
    expect(sha(back.body)).toBe(sha(pdf));
  });
});

describe('object storage (S3): masters ZIP, fixity and the reconciler', () => {
  it('zips masters streamed from the bucket; the fixity check re-hashes them and finds rot and loss', async () => {
    const piece = await makePiece({ status: 'published' });
    const a = await makePhotoWithMaster(piece.id, { width: 300, height: 200 });
    const b = await makePhotoWithMaster(piece.id, { width: 200, height: 300 });
    const curator = await signedInAgent(app, 'curator');
    const zip = await curator.get(`/api/pieces/${piece.id}/masters.zip`).buffer(true).parse(binary).expect(200);
    const files = await unzip(zip.body);
    const manifest = files.get('manifest-sha256.txt')!.toString().trim().split('\n');
    expect(manifest).toHaveLength(2);
    for (const line of manifest) {
      const [hash, name] = line.split(/\s+/);
      expect(sha(files.get(name)!)).toBe(hash);
    }
    expect(new Set(manifest.map((l) => l.split(/\s+/)[0]))).toEqual(new Set([a.photo.sha256, b.photo.sha256]));

    // Rot in one stored master, another lost.
    const rotten = Buffer.from(a.buffer);
    rotten[rotten.length >> 1] ^= 0xff;
    await bucket.put(a.key, rotten);
    await bucket.delete(b.key);
    await drain({ types: ['fixity-check'] });
    const admin = await signedInAgent(app, 'admin');
    await admin.post('/api/admin/fixity').set('Origin', ORIGIN).expect(202);
    await drain({ types: ['fixity-check'] });
    const { report } = (await admin.get('/api/admin/fixity/latest').expect(200)).body;
    expect(report.mismatches).toContainEqual(
      expect.objectContaining({ sha256: a.photo.sha256, file: a.key, actual: sha(rotten), photoIds: [a.photo.id] }),
    );
    expect(report.missing).toContainEqual(expect.objectContaining({ sha256: b.photo.sha256, photoIds: [b.photo.id] }));
  });

  it('removes old orphans from bucket listings, keeps referenced and fresh ones, finishes a cut-short move', async () => {
    const orphan = masterPath(randomBytes(32).toString('hex'), 'jpg');
    await bucket.put(orphan, Buffer.from('left by a killed process'));
    const ghost = 2_000_000_000 + Math.floor(Math.random() * 100_000_000);
    await bucket.put(`derivatives/${ghost}/display.webp`, Buffer.from('a derivative of a rolled-back photo'));
    await bucket.put(`tiles/${ghost}/iiif/info.json`, Buffer.from('{}'));
    const kept = await makePhotoWithMaster(null, { width: 120, height: 90 });
    // As if the process died between the commit and the move: the master is still under tmp/.
    const cut = await makePhotoWithMaster(null, { width: 110, height: 80 });
    const temp = `tmp/master-${cut.photo.sha256}.jpg.${randomBytes(8).toString('hex')}.part`;
    await bucket.move(cut.key, temp);

    // Fresh: nothing of these is touched.
    const now = await reconcileOrphans();
    expect(now.some((o) => [orphan, temp, `derivatives/${ghost}`].includes(o.file))).toBe(false);
    expect(await bucket.exists(orphan)).toBe(true);

    // Over an hour later (the reconciler's clock moved on, as the bucket's timestamps cannot be set back).
    const later = await reconcileOrphans({ now: new Date(Date.now() + ORPHAN_AGE_MS + 60_000) });
    expect(later).toContainEqual({ file: orphan, kind: 'master', bytes: 24, modifiedAt: expect.any(String) });
    expect(later).toContainEqual(expect.objectContaining({ file: `derivatives/${ghost}`, kind: 'derivatives' }));
    expect(later).toContainEqual(expect.objectContaining({ file: `tiles/${ghost}`, kind: 'tiles' }));
    expect(await bucket.exists(orphan)).toBe(false);
    expect(await bucket.exists(`derivatives/${ghost}/display.webp`)).toBe(false);
    expect(await bucket.exists(kept.key)).toBe(true);
    expect(await bucket.exists(`derivatives/${kept.photo.id}/display.webp`)).toBe(true);
    expect(later.some((o) => o.file === temp)).toBe(false);
    expect(await bucket.exists(temp)).toBe(false);
    expect(sha(await bytesOf(await bucket.get(cut.key)))).toBe(cut.photo.sha256);
  });
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import { mkdir, utimes, writeFile } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import request from 'supertest';
import yauzl from 'yauzl';
import { parse } from 'csv-parse/sync';
import { createApp } from '../../server/app.ts';
import { Job, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { drain } from '../../server/jobs/worker.ts';
import { ingested } from '../support/photos.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg } from '../support/images.ts';
import { makePhotoWithMaster } from '../support/photos.ts';
import { masterPath, resolveInsideUploads } from '../../server/media/paths.ts';

const app = createApp();
afterAll(() => sequelize.close());

// yauzl (a separate ZIP reader) opens what yazl wrote.
function unzip(buf: Buffer): Promise<Map<string, Buffer>> {
  return new Promise((resolve, reject) => {
    yauzl.fromBuffer(buf, { lazyEntries: true }, (err, zip) => {
      if (err || !zip) return reject(err);
      const files = new Map<string, Buffer>();
      zip.on('entry', (entry: yauzl.Entry) => {
        zip.openReadStream(entry, (e, stream) => {
          if (e || !stream) return reject(e);
          const chunks: Buffer[] = [];
          stream
            .on('data', (c: Buffer) => chunks.push(c))
            .on('end', () => {
              files.set(entry.fileName, Buffer.concat(chunks));
              zip.readEntry();
            });
        });
      });
      zip.on('end', () => resolve(files));
      zip.readEntry();
    });
  });
}
const binary = (res: import('superagent').Response, cb: (err: Error | null, body: Buffer) => void) => {
  const chunks: Buffer[] = [];
  res.on('data', (c: Buffer) => chunks.push(c)).on('end', () => cb(null, Buffer.concat(chunks)));
};
const sha = (b: Buffer) => createHash('sha256').update(b).digest('hex');

let piece: Awaited<ReturnType<typeof makePiece>>;
let draft: Awaited<ReturnType<typeof makePiece>>;
let masters: Array<Awaited<ReturnType<typeof makePhotoWithMaster>>>;
beforeAll(async () => {
  piece = await makePiece({
    status: 'published',
    title: 'Export test',
    creditLine: 'Test gift',
    dateText: 'about 1800',
    dateEdtf: '1800~',
    heightMm: 300,
    widthMm: 200,
    techniques: ['resist'],
    dyestuffs: [{ name: 'indigo', evidence: 'identified' }],
  });
  draft = await makePiece({ status: 'draft' });
  masters = [
    await makePhotoWithMaster(piece.id, { width: 320, height: 240 }),
    await makePhotoWithMaster(piece.id, { width: 200, height: 300 }),
  ];
});

describe('exports', () => {
  it('zips the masters of a piece byte for byte with a SHA-256 manifest that checks out', async () => {
    const curator = await signedInAgent(app, 'curator');
    const res = await curator.get(`/api/pieces/${piece.id}/masters.zip`).buffer(true).parse(binary).expect(200);
    expect(res.headers['content-type']).toBe('application/zip');
    const files = await unzip(res.body);
    const manifest = files.get('manifest-sha256.txt')!.toString().trim().split('\n');
    expect(manifest).toHaveLength(2);
    for (const line of manifest) {
      const [digest, name] = line.split(/\s+/);
      // The digest is recomputed here with node:crypto over the unzipped bytes.
      expect(sha(files.get(name)!)).toBe(digest);
    }
    for (const m of masters) expect(manifest.some((l) => l.startsWith(m.photo.sha256))).toBe(true);
    const json = JSON.parse(files.get('manifest.json')!.toString());
    expect(json).toMatchObject({ accessionNumber: piece.accessionNumber, algorithm: 'SHA-256' });
  });

  it("leaves masters with GPS out of a researcher's ZIP and says so in the manifest; curators get them", async () => {
    const curator = await signedInAgent(app, 'curator');
    const withGps = await makePiece({ status: 'published' });
    const photo = (
      await curator
        .post(`/api/pieces/${withGps.id}/photos`)
        .set('Origin', ORIGIN)
        .attach('photo', await clothJpeg({ gps: true }), 'site.jpg')
        .expect(201)
    ).body.photos[0];
    await ingested(photo.id);
    const researcher = await signedInAgent(app, 'researcher');
    const zip = (agent: typeof curator) =>
      agent.get(`/api/pieces/${withGps.id}/masters.zip`).buffer(true).parse(binary).expect(200);
    const theirs = await unzip((await zip(researcher)).body);
    expect([...theirs.keys()].some((n) => n.startsWith('masters/'))).toBe(false);
    expect(theirs.get('manifest-sha256.txt')!.toString()).toBe('');
    const listed = JSON.parse(theirs.get('manifest.json')!.toString()).files;
    expect(listed).toEqual([
      expect.objectContaining({ photoId: photo.id, file: null, withheld: expect.stringMatching(/GPS/) }),
    ]);
    const ours = await unzip((await zip(curator)).body);
    expect([...ours.keys()].filter((n) => n.startsWith('masters/'))).toHaveLength(1);
  });

  it('gives a piece as Dublin Core terms in JSON-LD', async () => {
    const researcher = await signedInAgent(app, 'researcher');
    const res = await researcher.get(`/api/pieces/${piece.id}/dublin-core.jsonld`).expect(200);
    expect(res.headers['content-type']).toMatch(/application\/ld\+json/);
    const dc = JSON.parse(res.text);
    // Term IRIs from DCMI Metadata Terms.
    expect(dc['@context'].dcterms).toBe('http://purl.org/dc/terms/');
    expect(dc).toMatchObject({
      'dcterms:identifier': piece.accessionNumber,
      'dcterms:title': 'Export test',
      'dcterms:date': 'about 1800',
      'dcterms:created': { '@value': '1800~' },
      'dcterms:subject': ['resist'],
      'dcterms:rights': 'Test gift',
      'dcterms:extent': '300 × 200 mm (height × width)',
    });
    expect(dc['dcterms:medium']).toContain('indigo (identified)');
    expect(dc['dcterms:hasFormat']).toMatch(new RegExp(`/iiif/${piece.id}/manifest.json$`));
  });

  it('exports trials as CSV with a header and one row per trial', async () => {
    const researcher = await signedInAgent(app, 'researcher');
    const res = await researcher.get('/api/export/trials.csv').buffer(true).expect(200);
    const rows: Record<string, string>[] = parse(res.text, { columns: true });
    // T-2024-001 of the demo scenario: madder 60 % owf in place of the lead-based red liquor (BRIEF §6).
    const first = rows.find((r) => r.code === 'T-2024-001');
    expect(first).toBeDefined();
    expect(first!.dryMassG).toBe('250');
    // The demo weighs air-dry: the recipe's mass is the mass entered; cotton's regain is ASTM D1909's 8.5 % (recalled from memory).
    expect(first).toMatchObject({ dryMassBasis: 'air-dry', airDryMassG: '250.00', moistureRegainPct: '8.5' });
    expect(first!.recipe).toMatch(/madder 60 % owf/);
    expect(first!.substitutions).toMatch(/→/);
    expect(new Set(rows.map((r) => r.code)).size).toBe(rows.length);
  });

  it('lets researchers, curators and admins export pieces; dyers get 403 (trials: 200), visitors 401, unreadable pieces 404', async () => {
    for (const role of ['researcher', 'curator', 'admin'] as const) {
      const agent = await signedInAgent(app, role);
      await agent.get('/api/export/pieces.csv').expect(200);
    }
    const dyer = await signedInAgent(app, 'dyer');
    await dyer.get('/api/export/pieces.csv').expect(403);
    await dyer.get('/api/export/trials.csv').expect(200);
    await dyer.get(`/api/pieces/${piece.id}/masters.zip`).expect(403);
    await dyer.get(`/api/pieces/${piece.id}/dublin-core.jsonld`).expect(403);
    await request(app).get('/api/export/pieces.csv').expect(401);
    await request(app).get(`/api/pieces/${piece.id}/masters.zip`).expect(401);
    const researcher = await signedInAgent(app, 'researcher');
    await researcher.get('/api/pieces/999999999/dublin-core.jsonld').expect(404);
    await researcher.get(`/api/pieces/${draft.id}/dublin-core.jsonld`).expect(200);
  });
});

describe('fixity check', () => {
  it('reports a corrupted master and a missing one; only admins may run it', async () => {
    const { photo: bad, file } = await makePhotoWithMaster(piece.id, { width: 100, height: 100 });
    const { photo: gone, file: goneFile } = await makePhotoWithMaster(piece.id, { width: 90, height: 90 });
    // Flip bytes in the middle of the stored master: the bit rot a fixity check exists to catch.
    const { readFile, rm } = await import('node:fs/promises');
    const bytes = await readFile(file);
    bytes[Math.floor(bytes.length / 2)] ^= 0xff;
    await writeFile(file, bytes);
    await rm(goneFile);
    // A master no photo points at, written two hours ago (a process killed before its upload committed).
    const orphan = masterPath(randomBytes(32).toString('hex'), 'jpg');
    await mkdir(path.dirname(resolveInsideUploads(orphan)), { recursive: true });
    await writeFile(resolveInsideUploads(orphan), 'orphan');
    const twoHoursAgo = new Date(Date.now() - 2 * 3600_000);
    await utimes(resolveInsideUploads(orphan), twoHoursAgo, twoHoursAgo);

    for (const role of ['curator', 'researcher', 'dyer'] as const) {
      const agent = await signedInAgent(app, role);
      await agent.post('/api/admin/fixity').set('Origin', ORIGIN).expect(403);
      await agent.get('/api/admin/fixity/latest').expect(403);
    }
    await request(app).post('/api/admin/fixity').set('Origin', ORIGIN).expect(401);

    // Finish any check another suite left queued, so this one starts a fresh job.
    await drain({ types: ['fixity-check'] });
    const admin = await signedInAgent(app, 'admin');
    const started = await admin.post('/api/admin/fixity').set('Origin', ORIGIN).expect(202);
    expect(started.body.job).toMatchObject({ type: 'fixity-check', state: 'queued' });
    const again = await admin.post('/api/admin/fixity').set('Origin', ORIGIN).expect(200);
    expect(again.body.job.id).toBe(started.body.job.id);
    await drain({ types: ['fixity-check'] });

    const latest = await admin.get('/api/admin/fixity/latest').expect(200);
    expect(latest.body.job).toMatchObject({ id: started.body.job.id, state: 'done', progress: 1 });
    const report = latest.body.report;
    const mismatch = report.mismatches.find((m: { sha256: string }) => m.sha256 === bad.sha256);
    expect(mismatch).toMatchObject({ photoIds: [bad.id], actual: sha(bytes) });
    expect(mismatch.file).toMatch(/^masters\//);
    expect(report.missing.find((m: { sha256: string }) => m.sha256 === gone.sha256)).toMatchObject({
      photoIds: [gone.id],
      file: null,
    });
    // The intact masters of this suite pass.
    for (const m of masters) {
      expect(report.mismatches.some((x: { sha256: string }) => x.sha256 === m.photo.sha256)).toBe(false);
      expect(report.missing.some((x: { sha256: string }) => x.sha256 === m.photo.sha256)).toBe(false);
    }
    expect(report.ok).toBeGreaterThanOrEqual(2);
    // The orphan is removed and listed; the photos' masters are not.
    expect(report.orphans).toContainEqual(expect.objectContaining({ file: orphan, kind: 'master', bytes: 6 }));
    expect(report.orphans.some((o: { file: string }) => o.file.includes(bad.sha256))).toBe(false);
    await expect(utimes(resolveInsideUploads(orphan), new Date(), new Date())).rejects.toThrow();
    expect(await Job.count({ where: { type: 'fixity-check', state: 'queued' } })).toBe(0);
  });
});

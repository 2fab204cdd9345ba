import { execFile } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import sharp from 'sharp';
import { ROOT_DIR } from '../../server/env.ts';
import { Photo, sequelize } from '../../server/models/index.ts';
import { childEnv } from '../support/env.ts';
import { freePort, startServerProcess, type ServerProcess } from '../support/server.ts';

// Issue 16: an app server killed (SIGKILL) at any moment of an upload, then restarted, leaves no orphan: every
// master on disk belongs to a photo row, every photo row's master is on disk, and what a killed upload left in tmp/
// is swept by the reconciler once it is older than its age limit. Issue 18: the upload answers once the master is
// stored, and the photo's ingest job runs on the server's worker, so later kills land in the job: its lease runs
// out (2 s here) and the restarted server's worker takes it again, so every stored photo ends done. The servers use a private uploads folder, so the
// sweep cannot touch files of other test files running at the same time.
const run = promisify(execFile);
let uploads: string;
let server: ServerProcess | undefined;

afterAll(async () => {
  await server?.stop();
  await sequelize.close();
  if (uploads) await rm(uploads, { recursive: true, force: true });
});

async function files(dir: string): Promise<string[]> {
  const out: string[] = [];
  for (const e of await readdir(dir, { withFileTypes: true }).catch(() => [])) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...(await files(p)));
    else out.push(p);
  }
  return out;
}

/** A photo whose decoding and palette take a noticeable time: random noise, so every upload has its own SHA-256. */
async function noisyPng(seed: number) {
  const width = 2400;
  const height = 1600;
  const raw = Buffer.alloc(width * height * 3);
  let x = seed * 2654435761;
  for (let i = 0; i < raw.length; i++) {
    x = (x * 1103515245 + 12345) >>> 0;
    raw[i] = x >>> 24;
  }
  return sharp(raw, { raw: { width, height, channels: 3 } })
    .png({ compressionLevel: 1 })
    .toBuffer();
}

describe('killed mid-upload and restarted: nothing orphaned', () => {
  it('keeps masters and photo rows in step whenever the server dies, and sweeps what a dead upload left', async () => {
    uploads = await mkdtemp(path.join(tmpdir(), 'tinctoria-kill-'));
    const env = { UPLOADS_DIR: uploads, JOB_LEASE_MS: '2000' };
    const port = await freePort();
    server = await startServerProcess(port, 90_000, env);
    const sign = async () => {
      const agent = request.agent(server!.url);
      await agent
        .post('/api/auth/login')
        .set('Origin', server!.url)
        .send({ email: 'curator@demo.test', password: 'tinctoria-demo' })
        .expect(200);
      return agent;
    };
    let curator = await sign();
    const piece = await curator
      .post('/api/pieces')
      .set('Origin', server.url)
      .send({ accessionNumber: `KILL.${Date.now()}`, objectName: 'fragment', title: 'Killed upload', dateEdtf: '1800' })
      .expect(201);
    const pieceId = piece.body.piece.id as number;

    const sent: string[] = [];
    // Kill at several moments: while the body arrives, around the commit, while the ingest job reads, computes the
    // palette or builds the tiles; then one that ends.
    for (const [i, killAfterMs] of [150, 600, 1200, 2000, 3500, null].entries()) {
      const png = await noisyPng(i + 1);
      sent.push(createHash('sha256').update(png).digest('hex'));
      const upload = curator
        .post(`/api/pieces/${pieceId}/photos`)
        .set('Origin', server.url)
        .attach('photo', png, `noise-${i}.png`)
        .then(
          (r) => r.status,
          () => 'cut',
        );
      if (killAfterMs === null) {
        expect(await upload).toBe(201);
        continue;
      }
      await new Promise((r) => setTimeout(r, killAfterMs));
      server.child.kill('SIGKILL');
      await upload;
      await server.stop();
      server = await startServerProcess(port, 90_000, env);
      curator = await sign();
    }
    // Every stored photo is processed in the end, the interrupted ones after their lease ran out.
    for (;;) {
      const stages = (await Photo.findAll({ where: { pieceId }, attributes: ['ingestStage'], raw: true })).map(
        (p) => p.ingestStage,
      );
      expect(stages).not.toContain('failed');
      if (stages.every((s) => s === 'done')) break;
      await new Promise((r) => setTimeout(r, 250));
    }
    await server.stop();
    server = undefined;

    // Masters on disk and photo rows agree, for every upload sent.
    const onDisk = (await files(path.join(uploads, 'masters'))).map((f) => path.basename(f).split('.')[0]);
    const rows = await Photo.findAll({ where: { pieceId }, attributes: ['sha256'], raw: true });
    const inDb = rows.map((r) => r.sha256);
    expect(new Set(onDisk)).toEqual(new Set(inDb));
    expect(inDb).toContain(sent[sent.length - 1]);
    for (const sha of inDb) expect(sent).toContain(sha);

    // What the killed uploads left in tmp/ is gone once older than the age limit (here: the clock moved 2 h on).
    await run(process.execPath, ['--import', 'tsx', 'tests/support/reconcile-child.ts', '7200000'], {
      cwd: ROOT_DIR,
      env: childEnv(env),
    });
    const left = (await files(uploads)).filter(
      (f) =>
        !f.includes(`${path.sep}masters${path.sep}`) &&
        !f.includes(`${path.sep}derivatives${path.sep}`) &&
        !f.includes(`${path.sep}tiles${path.sep}`),
    );
    expect(left).toEqual([]);
    // Derivatives and tiles only for photos that exist (an upload killed before its commit wrote some: swept).
    const ids = new Set((await Photo.findAll({ attributes: ['id'], raw: true })).map((p) => String(p.id)));
    for (const dir of ['derivatives', 'tiles'])
      for (const name of await readdir(path.join(uploads, dir)).catch(() => [] as string[]))
        expect(ids).toContain(name);
    const mastersAfter = (await files(path.join(uploads, 'masters'))).map((f) => path.basename(f).split('.')[0]);
    expect(new Set(mastersAfter)).toEqual(new Set(inDb));
  }, 300_000);
});

import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent.js';
import { createApp } from '../../server/app.ts';
import { Job, Photo, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { enqueue } from '../../server/jobs/queue.ts';
import { ORIGIN, signedInAgent, type DemoRole } from '../support/agents.ts';

const app = createApp();
afterAll(() => sequelize.close());

type Who = 'visitor' | DemoRole;
const WHO: Who[] = ['visitor', 'admin', 'curator', 'researcher', 'dyer'];
const agents = {} as Record<Who, TestAgent | ReturnType<typeof request.agent>>;
let published: number;
let draft: number;
let draftPhoto: number;

beforeAll(async () => {
  agents.visitor = request.agent(app);
  for (const r of ['admin', 'curator', 'researcher', 'dyer'] as const) agents[r] = await signedInAgent(app, r);
  published = (await makePiece({ status: 'published' })).id;
  draft = (await makePiece({ status: 'draft' })).id;
  // A photo row is enough here: these routes read rows, not files.
  draftPhoto = (
    await Photo.create({
      pieceId: draft,
      trialId: null,
      sha256: 'f'.repeat(64),
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
    })
  ).id;
});

const csv = () => `accessionNumber,objectName,title\nROLE.${Date.now().toString(36)},panel,Role matrix\n`;

// Expected status per role for every route of this feature (404 = may not read, 403 = may not act, 401 = signed out).
const matrix: Array<{
  route: string;
  send: (a: TestAgent | ReturnType<typeof request.agent>) => Promise<{ status: number }>;
  expect: Record<Who, number>;
}> = [
  {
    route: 'GET /iiif/:published/manifest.json',
    send: (a) => a.get(`/iiif/${published}/manifest.json`),
    expect: { visitor: 200, admin: 200, curator: 200, researcher: 200, dyer: 200 },
  },
  {
    route: 'GET /iiif/:draft/manifest.json',
    send: (a) => a.get(`/iiif/${draft}/manifest.json`),
    expect: { visitor: 404, admin: 200, curator: 200, researcher: 200, dyer: 200 },
  },
  {
    route: 'GET /iiif/photos/:draftPhoto/annotations.json',
    send: (a) => a.get(`/iiif/photos/${draftPhoto}/annotations.json`),
    expect: { visitor: 404, admin: 200, curator: 200, researcher: 200, dyer: 200 },
  },
  {
    route: 'GET /iiif/photos/:draftPhoto/info.json (no tiles yet)',
    send: (a) => a.get(`/iiif/photos/${draftPhoto}/info.json`),
    expect: { visitor: 404, admin: 404, curator: 404, researcher: 404, dyer: 404 },
  },
  {
    route: 'GET /api/jobs?photoId',
    send: (a) => a.get(`/api/jobs?photoId=${draftPhoto}`),
    expect: { visitor: 401, admin: 200, curator: 200, researcher: 200, dyer: 200 },
  },
  {
    route: 'GET /api/jobs (all)',
    send: (a) => a.get('/api/jobs'),
    expect: { visitor: 401, admin: 200, curator: 403, researcher: 403, dyer: 403 },
  },
  {
    route: 'POST /api/jobs/:id/retry',
    send: async (a) => {
      const job = await enqueue({
        type: 'ingest-photo',
        payload: { photoId: draftPhoto },
        subject: { type: 'photo', id: draftPhoto },
      });
      await Job.update({ state: 'failed', error: 'test', attempts: 3 }, { where: { id: job.id } });
      const res = await a.post(`/api/jobs/${job.id}/retry`).set('Origin', ORIGIN);
      await Job.destroy({ where: { id: job.id } });
      return res;
    },
    expect: { visitor: 401, admin: 200, curator: 200, researcher: 403, dyer: 403 },
  },
  {
    route: 'GET /api/admin/fixity/latest',
    send: (a) => a.get('/api/admin/fixity/latest'),
    expect: { visitor: 401, admin: 200, curator: 403, researcher: 403, dyer: 403 },
  },
  {
    route: 'POST /api/import/pieces?dryRun=true',
    send: (a) =>
      a.post('/api/import/pieces?dryRun=true').set('Origin', ORIGIN).attach('file', Buffer.from(csv()), 'p.csv'),
    expect: { visitor: 401, admin: 200, curator: 200, researcher: 403, dyer: 403 },
  },
  {
    route: 'GET /api/export/pieces.csv',
    send: (a) => a.get('/api/export/pieces.csv'),
    expect: { visitor: 401, admin: 200, curator: 200, researcher: 200, dyer: 403 },
  },
  // Every role that may read trials may export them.
  {
    route: 'GET /api/export/trials.csv',
    send: (a) => a.get('/api/export/trials.csv'),
    expect: { visitor: 401, admin: 200, curator: 200, researcher: 200, dyer: 200 },
  },
  {
    route: 'GET /api/pieces/:id/dublin-core.jsonld',
    send: (a) => a.get(`/api/pieces/${published}/dublin-core.jsonld`),
    expect: { visitor: 401, admin: 200, curator: 200, researcher: 200, dyer: 403 },
  },
  {
    route: 'GET /api/pieces/:id/masters.zip',
    send: (a) => a.get(`/api/pieces/${published}/masters.zip`),
    expect: { visitor: 401, admin: 200, curator: 200, researcher: 200, dyer: 403 },
  },
];

describe('role × route matrix: deep zoom, IIIF, import, export, jobs, fixity', () => {
  it.each(matrix.map((m) => [m.route, m] as const))('%s', async (_route, m) => {
    const got = {} as Record<Who, number>;
    for (const who of WHO) got[who] = (await m.send(agents[who])).status;
    expect(got).toEqual(m.expect);
  });
});

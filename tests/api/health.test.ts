import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { sequelize } from '../../server/models/index.ts';

const app = createApp();
afterAll(() => sequelize.close());

describe('GET /api/health', () => {
  it('reports the real MariaDB as up, with the version, round trip, job backlog and search index state', async () => {
    const res = await request(app).get('/api/health').expect(200);
    expect(res.body).toEqual({
      ok: true,
      db: 'up',
      version: expect.stringMatching(/^\d+\.\d+\.\d+/),
      dbRoundTripMs: expect.any(Number),
      jobs: {
        queued: expect.any(Number),
        running: expect.any(Number),
        oldestQueuedAgeMs: res.body.jobs.oldestQueuedAgeMs,
      },
      search: {
        text: { loaded: expect.any(Boolean), sinceUpdateMs: res.body.search.text.sinceUpdateMs },
        shade: { loaded: expect.any(Boolean), sinceUpdateMs: res.body.search.shade.sinceUpdateMs },
        pendingChanges: expect.any(Number),
        logPosition: expect.any(Number),
        sinceSyncMs: res.body.search.sinceSyncMs,
        lastError: null,
      },
    });
    // null, or a number of milliseconds.
    for (const v of [
      res.body.jobs.oldestQueuedAgeMs,
      res.body.search.text.sinceUpdateMs,
      res.body.search.shade.sinceUpdateMs,
    ])
      expect(v === null || (typeof v === 'number' && v >= 0)).toBe(true);
    // Not loaded means never updated.
    expect(res.body.search.text.loaded).toBe(res.body.search.text.sinceUpdateMs !== null);
    expect(res.body.dbRoundTripMs).toBeGreaterThanOrEqual(0);
    const [rows] = await sequelize.query('SELECT VERSION() AS v');
    expect(String((rows as Array<{ v: string }>)[0].v)).toMatch(/MariaDB/);
  });

  it('counts queued jobs and the age of the oldest due one', async () => {
    const [[{ n }]] = (await sequelize.query("SELECT COUNT(*) AS n FROM jobs WHERE state = 'queued'")) as [
      Array<{ n: number }>,
      unknown,
    ];
    const runAfter = new Date(Date.now() - 60_000);
    // A job type no worker handles in this suite, due a minute ago; removed afterwards.
    const [id] = await sequelize.query(
      "INSERT INTO jobs (type, payload, state, runAfter, createdAt, updatedAt) VALUES ('health-probe', '{}', 'queued', ?, NOW(3), NOW(3))",
      { replacements: [runAfter] },
    );
    try {
      const res = await request(app).get('/api/health').expect(200);
      expect(res.body.jobs.queued).toBe(Number(n) + 1);
      expect(res.body.jobs.oldestQueuedAgeMs).toBeGreaterThanOrEqual(59_000);
    } finally {
      await sequelize.query('DELETE FROM jobs WHERE id = ?', { replacements: [id] });
    }
  });

  it('shows the search indexes loaded once the engine has loaded them', async () => {
    const { searchEngine } = await import('../../server/search/engine.ts');
    await searchEngine.ready();
    const res = await request(app).get('/api/health').expect(200);
    expect(res.body.search.text.loaded).toBe(true);
    expect(res.body.search.shade.loaded).toBe(true);
    expect(res.body.search.text.sinceUpdateMs).toBeGreaterThanOrEqual(0);
  });

  it('answers unknown API routes with a JSON 404 in the shared error shape, with the request id', async () => {
    const res = await request(app).get('/api/no-such-thing').expect(404);
    expect(res.body).toEqual({
      error: { code: 'not_found', message: expect.any(String), requestId: res.headers['x-request-id'] },
    });
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('answers malformed JSON with a 400 in the same shape', async () => {
    const res = await request(app)
      .post('/api/health')
      .set('Origin', 'http://127.0.0.1:3000')
      .set('Content-Type', 'application/json')
      .send('{oops');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
    expect(res.body.error.requestId).toBe(res.headers['x-request-id']);
  });
});

import { afterAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { sequelize } from '../../server/models/index.ts';

const app = createApp();
afterAll(() => sequelize.close());

describe('GET /api/health', () => {
  it('reports the real MariaDB as up, with the version', async () => {
    const res = await request(app).get('/api/health').expect(200);
    expect(res.body).toEqual({ ok: true, db: 'up', version: expect.stringMatching(/^\d+\.\d+\.\d+/) });
    const [rows] = await sequelize.query('SELECT VERSION() AS v');
    expect(String((rows as Array<{ v: string }>)[0].v)).toMatch(/MariaDB/);
  });

  it('answers unknown API routes with a JSON 404 in the shared error shape', async () => {
    const res = await request(app).get('/api/no-such-thing').expect(404);
    expect(res.body).toEqual({ error: { code: 'not_found', message: expect.any(String) } });
  });

  it('answers malformed JSON with a 400 in the same shape', async () => {
    const res = await request(app)
      .post('/api/health')
      .set('Origin', 'http://127.0.0.1:3000')
      .set('Content-Type', 'application/json')
      .send('{oops');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
  });
});

import net from 'node:net';
import { Writable } from 'node:stream';
import express from 'express';
import { pino } from 'pino';
import request from 'supertest';
import { ConnectionAcquireTimeoutError, DatabaseError } from 'sequelize';
import { afterAll, describe, expect, it } from 'vitest';
import { createSequelize } from '../../server/db/sequelize.ts';
import { errorHandler, isDatabaseUnavailable } from '../../server/http/errors.ts';
import { redactUrl, requestIdFrom, requestLogger } from '../../server/log/index.ts';
import { env } from '../../server/env.ts';
import { sequelize } from '../../server/models/index.ts';

afterAll(() => sequelize.close());

/** A small app with the real request logger and error handler, logging into `lines`. */
function probeApp(lines: Array<Record<string, unknown>>, fail?: () => Error) {
  const sink = new Writable({
    write(chunk, _enc, done) {
      for (const l of String(chunk).split('\n').filter(Boolean)) lines.push(JSON.parse(l));
      done();
    },
  });
  const app = express();
  app.use(requestLogger(pino({ level: 'info' }, sink)));
  app.use((req, _res, next) => {
    if (req.headers['x-test-user']) (req as { user?: unknown }).user = { id: Number(req.headers['x-test-user']) };
    next();
  });
  app.get('/ok', (_req, res) => {
    res.json({ fine: true });
  });
  app.get('/fail', () => {
    throw fail!();
  });
  app.use(errorHandler);
  return app;
}

describe('request ids and request logs', () => {
  it('keeps a short safe incoming X-Request-Id and replaces anything else', () => {
    expect(requestIdFrom('abc-123.x_y:z')).toBe('abc-123.x_y:z');
    for (const bad of ['has space', 'new\nline', 'x'.repeat(65), '', undefined, ['a', 'b']])
      expect(requestIdFrom(bad)).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/);
  });

  it('redacts secret query parameters', () => {
    expect(redactUrl('/api/auth/reset?token=s3cret&x=1')).toBe('/api/auth/reset?token=%5Bredacted%5D&x=1');
    expect(redactUrl('/api/pieces?q=indigo')).toBe('/api/pieces?q=indigo');
    expect(redactUrl('/api/pieces')).toBe('/api/pieces');
  });

  it('writes one JSON line per request with method, url, status, time, request id and user id', async () => {
    const lines: Array<Record<string, unknown>> = [];
    const app = probeApp(lines);
    const res = await request(app).get('/ok?token=abc').set('X-Request-Id', 'probe-1').set('X-Test-User', '7');
    expect(res.headers['x-request-id']).toBe('probe-1');
    await new Promise((r) => setTimeout(r, 20));
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatchObject({
      level: 30,
      req: { id: 'probe-1', method: 'GET', url: '/ok?token=%5Bredacted%5D' },
      res: { status: 200 },
      responseTime: expect.any(Number),
      userId: 7,
    });
    expect(JSON.stringify(lines[0])).not.toContain('abc');
  });

  it('puts a generated id in the header and the error body when the incoming one is unsafe', async () => {
    const app = probeApp([], () => new Error('boom'));
    const res = await request(app).get('/fail').set('X-Request-Id', 'bad id with spaces').expect(500);
    expect(res.headers['x-request-id']).not.toBe('bad id with spaces');
    expect(res.body.error).toEqual({
      code: 'internal',
      message: expect.any(String),
      requestId: res.headers['x-request-id'],
    });
  });
});

describe('database timeouts answer 503 database_unavailable', () => {
  const socketTimeout = Object.assign(new Error('socket timeout'), { code: 'ER_SOCKET_TIMEOUT', errno: 45026 });
  const cases: Array<[string, () => Error]> = [
    ['a pool acquire timeout', () => new ConnectionAcquireTimeoutError(new Error('Operation timeout'))],
    ['a query whose socket timed out', () => new DatabaseError(socketTimeout as never)],
  ];
  for (const [what, fail] of cases)
    it(`maps ${what}`, async () => {
      const res = await request(probeApp([], fail)).get('/fail').expect(503);
      expect(res.headers['retry-after']).toBe('5');
      expect(res.body.error).toMatchObject({ code: 'database_unavailable', requestId: res.headers['x-request-id'] });
    });

  it('leaves other database errors as 500', () => {
    const syntax = Object.assign(new Error('syntax'), { code: 'ER_PARSE_ERROR', errno: 1064 });
    expect(isDatabaseUnavailable(new DatabaseError(syntax as never))).toBe(false);
    expect(isDatabaseUnavailable(new Error('boom'))).toBe(false);
  });

  it('gives up on a database that accepts the connection but never answers, within the acquire timeout', async () => {
    // A TCP listener that never speaks: what a frozen (SIGSTOPped) MariaDB looks like to a new connection.
    const sockets: net.Socket[] = [];
    const silent = net.createServer((s) => sockets.push(s));
    await new Promise<void>((r) => silent.listen(0, '127.0.0.1', r));
    const { port } = silent.address() as net.AddressInfo;
    const db = createSequelize(`mariadb://u:p@127.0.0.1:${port}/frozen`);
    const t0 = Date.now();
    const err = await db.query('SELECT 1').catch((e: unknown) => e);
    const took = Date.now() - t0;
    for (const s of sockets) s.destroy();
    silent.close();
    await db.close().catch(() => {});
    expect(isDatabaseUnavailable(err)).toBe(true);
    expect(took).toBeLessThan(9_000);
  }, 20_000);

  it('abandons a query on a connection whose database froze mid-session (socket timeout)', async () => {
    // A TCP relay to the test MariaDB that can stop passing bytes: a SIGSTOPped server, seen from the pool.
    const target = new URL(env.DATABASE_URL);
    let frozen = false;
    const pairs: net.Socket[] = [];
    const relay = net.createServer((client) => {
      const upstream = net.connect(Number(target.port || 3306), target.hostname);
      pairs.push(client, upstream);
      client.on('data', (d) => frozen || upstream.write(d));
      upstream.on('data', (d) => frozen || client.write(d));
      client.on('error', () => upstream.destroy());
      upstream.on('error', () => client.destroy());
      client.on('close', () => upstream.destroy());
      upstream.on('close', () => client.destroy());
    });
    await new Promise<void>((r) => relay.listen(0, '127.0.0.1', r));
    const url = new URL(env.DATABASE_URL);
    url.hostname = '127.0.0.1';
    url.port = String((relay.address() as net.AddressInfo).port);
    const db = createSequelize(url.toString());
    try {
      await db.query('SELECT 1');
      frozen = true;
      const t0 = Date.now();
      const err = await db.query('SELECT 1').catch((e: unknown) => e);
      const took = Date.now() - t0;
      expect(isDatabaseUnavailable(err)).toBe(true);
      expect(took).toBeLessThan(env.DB_QUERY_TIMEOUT_MS + 3_000);
    } finally {
      for (const s of pairs) s.destroy();
      relay.close();
      await db.close().catch(() => {});
    }
  }, 30_000);
});

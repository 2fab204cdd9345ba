import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import { LOGIN_LIMITS } from '../../server/auth/rate-limit.ts';
import { allowedHostnames } from '../../server/http/host-check.ts';
import { DEV_ORIGINS, appOrigins } from '../../server/http/origin-check.ts';
import { sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { ORIGIN, signedInAgent } from '../support/agents.ts';
import { clothJpeg } from '../support/images.ts';

const app = createApp();
let pieceId: number;
let jpeg: Buffer;
beforeAll(async () => {
  pieceId = (await makePiece({ status: 'draft' })).id;
  jpeg = await clothJpeg({ gps: false });
});
afterAll(() => sequelize.close());

const refusal = (res: request.Response) => {
  expect(res.status).toBe(400);
  expect(res.body.error.code).toBe('invalid_input');
  expect(res.body.error.message).toMatch(/could not be read/);
};

describe('malformed multipart bodies answer 400, never 500', () => {
  it('refuses a body without a boundary, a truncated body and a control character in a part header', async () => {
    const curator = await signedInAgent(app, 'curator');
    const post = (type: string, body: string) =>
      curator.post(`/api/pieces/${pieceId}/photos`).set('Origin', ORIGIN).set('Content-Type', type).send(body);

    refusal(await post('multipart/form-data', 'whatever'));

    const truncated = ['--XyZ', 'Content-Disposition: form-data; name="photo"; filename="a.jpg"', '', 'abc'].join(
      '\r\n',
    );
    refusal(await post('multipart/form-data; boundary=XyZ', truncated));

    const badHeader = [
      '--XyZ',
      'Content-Disposition: form-data; name="photo"; filename="a.jpg"\u0001\u0000\u0007',
      'Content\u0000-Type: image/jpeg',
      '',
      'abc',
      '--XyZ--',
      '',
    ].join('\r\n');
    const res = await post('multipart/form-data; boundary=XyZ', badHeader);
    expect(res.status).toBeGreaterThanOrEqual(400);
    expect(res.status).toBeLessThan(500);
  });

  it('refuses a truncated body on the CSV import too', async () => {
    const admin = await signedInAgent(app, 'admin');
    const truncated = ['--XyZ', 'Content-Disposition: form-data; name="file"; filename="a.csv"', '', 'a,b'].join(
      '\r\n',
    );
    refusal(
      await admin
        .post('/api/import/pieces')
        .set('Origin', ORIGIN)
        .set('Content-Type', 'multipart/form-data; boundary=XyZ')
        .send(truncated),
    );
  });
});

describe('a malformed %-escape in a path parameter answers 400', () => {
  it.each(['%E0%A4%A', '%FF'])('%s on ids and tokens', async (bad) => {
    const admin = await signedInAgent(app, 'admin');
    for (const path of [`/api/pieces/${bad}`, `/api/team/${bad}`, `/api/chemicals/${bad}`]) {
      const res = await admin.get(path);
      expect(res.status, path).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
    }
    for (const path of [`/api/invitations/${bad}`, `/api/auth/password-reset/${bad}`]) {
      const res = await request(app).get(path);
      expect(res.status, path).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
    }
    const accepted = await request(app).post(`/api/invitations/${bad}/accept`).set('Origin', ORIGIN).send({});
    expect(accepted.status).toBe(400);
  });
});

describe('file names are kept exactly as sent', () => {
  it('stores a UTF-8 name as sent and serves it in Content-Disposition (RFC 6266 filename* with an ASCII fallback)', async () => {
    const name = 'Zürich-Œuvre-№5-茜.jpg';
    const curator = await signedInAgent(app, 'curator');
    const res = await curator
      .post(`/api/pieces/${pieceId}/photos`)
      .set('Origin', ORIGIN)
      .attach('photo', jpeg, name)
      .expect(201);
    const [photo] = res.body.photos;
    expect(photo.originalName).toBe(name);
    const master = await curator.get(photo.urls.master).buffer(true).expect(200);
    const header = master.headers['content-disposition'] as string;
    // RFC 5987 ext-value: UTF-8 percent-encoded; plus a plain ASCII filename="…" fallback.
    expect(header).toContain(
      `filename*=UTF-8''${encodeURIComponent(name).replace(/['()*]/g, (c) => `%${c.charCodeAt(0).toString(16).toUpperCase()}`)}`,
    );
    expect(header).toMatch(/^attachment; filename="[\x20-\x7e]+"; filename\*=/);
  });
});

describe('the Host header is checked (DNS rebinding)', () => {
  it('answers 400 to a foreign Host and serves the public and loopback names', async () => {
    const res = await request(app).get('/api/health').set('Host', 'rebind.attacker.example');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_host');
    await request(app).get('/api/health').set('Host', 'rebind.attacker.example:3000').expect(400);
    await request(app).get('/api/health').set('Host', new URL(ORIGIN).host).expect(200);
    await request(app).get('/api/health').set('Host', 'localhost:5173').expect(200);
  });

  it('allows only PUBLIC_URL and ALLOWED_HOSTS in production, loopback besides outside it', () => {
    const publicUrl = 'https://dyes.example.org';
    expect(allowedHostnames({ publicUrl, extra: ['app-2.internal'], production: true })).toEqual([
      'dyes.example.org',
      'app-2.internal',
    ]);
    expect(allowedHostnames({ publicUrl, extra: [], production: false })).toContain('localhost');
  });

  it('refuses the Vite dev origins in production', () => {
    expect(appOrigins('https://dyes.example.org', true)).toEqual(['https://dyes.example.org']);
    expect(appOrigins('https://dyes.example.org', false)).toEqual(['https://dyes.example.org', ...DEV_ORIGINS]);
  });
});

/** A sign-in sent from a loopback address of its own (Linux answers all of 127/8), so its per-IP counter is its own. */
function loginFrom(port: number, localAddress: string, forwardedFor: string) {
  const body = JSON.stringify({ email: `nobody-${forwardedFor}@nowhere.test`, password: 'guess' });
  return new Promise<number>((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port,
        localAddress,
        method: 'POST',
        path: '/api/auth/login',
        headers: {
          'Content-Type': 'application/json',
          'Content-Length': Buffer.byteLength(body),
          Origin: ORIGIN,
          'X-Forwarded-For': forwardedFor,
        },
      },
      (res) => {
        res.resume();
        res.on('end', () => resolve(res.statusCode ?? 0));
      },
    );
    req.on('error', reject);
    req.end(body);
  });
}

describe('trust proxy is off by default', () => {
  it('a spoofed X-Forwarded-For does not give a fresh sign-in allowance', async () => {
    const server = createApp().listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    const { port } = server.address() as AddressInfo;
    try {
      const client = '127.0.0.77';
      for (let i = 0; i < LOGIN_LIMITS.perIp; i++) expect(await loginFrom(port, client, `10.20.0.${i}`)).toBe(401);
      // A new forwarded address every time, yet the same client: refused.
      expect(await loginFrom(port, client, '10.20.1.1')).toBe(429);
    } finally {
      await new Promise((resolve) => server.close(resolve));
    }
  });
});

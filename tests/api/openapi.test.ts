import { Validator } from '@seriousme/openapi-schema-validator';
import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { createApp } from '../../server/app.ts';
import { contractCheck } from '../../server/http/contract.ts';
import { buildOpenApiDocument } from '../../server/openapi/document.ts';
import { defineRoutes } from '../../server/openapi/registry.ts';
import { registeredRoutes } from '../support/routes.ts';

const app = createApp();

describe('GET /api/openapi.json', () => {
  it('is a valid OpenAPI 3.1 document (checked with @seriousme/openapi-schema-validator)', async () => {
    const res = await request(app).get('/api/openapi.json').expect(200);
    expect(res.body.openapi).toBe('3.1.0');
    const validator = new Validator();
    const result = await validator.validate(res.body);
    expect(result.errors ?? [], JSON.stringify(result.errors, null, 1)?.slice(0, 4000)).toEqual([]);
    expect(result.valid).toBe(true);
  });

  it('describes itself', async () => {
    const res = await request(app).get('/api/openapi.json').expect(200);
    expect(res.body.paths['/api/openapi.json'].get).toMatchObject({
      'x-roles': 'anyone',
      responses: { 200: expect.any(Object), 404: expect.any(Object) },
    });
  });

  // Lists any route without a contract file entry (server/openapi/groups/), and any contract without a route.
  it('has a contract for every registered /api, /iiif and /media route, and none for a route that does not exist', () => {
    const doc = buildOpenApiDocument();
    const documented = Object.entries(doc.paths).flatMap(([p, ops]) =>
      Object.keys(ops).map((m) => `${m.toUpperCase()} ${p.replace(/\{(\w+)\}/g, ':$1')}`),
    );
    const registered = registeredRoutes(app, ['/api/', '/iiif/', '/media/']);
    expect(
      documented.filter((r) => !registered.includes(r)),
      'documented but not registered',
    ).toEqual([]);
    expect(
      registered.filter((r) => !documented.includes(r)),
      'registered routes without a contract',
    ).toEqual([]);
  });
});

describe('the document from contracts', () => {
  const thing = z.object({ id: z.number().int(), name: z.string(), seenAt: z.iso.datetime().nullable() });
  const group = defineRoutes('things', [
    {
      method: 'get',
      path: '/api/things',
      summary: 'List',
      roles: 'anyone',
      query: z.object({ page: z.coerce.number().int().min(1).default(1), q: z.string().optional() }),
      responses: { 200: z.object({ items: z.array(thing) }) },
    },
    {
      method: 'patch',
      path: '/api/things/:id',
      summary: 'Edit',
      roles: 'curator, admin',
      params: z.object({ id: z.coerce.number().int() }),
      body: z.object({ name: z.string() }),
      responses: { 200: thing },
    },
    {
      method: 'get',
      path: '/api/things/:id/label.pdf',
      summary: 'Label',
      roles: 'anyone',
      params: z.object({ id: z.coerce.number().int() }),
      responses: { 200: { contentType: 'application/pdf', description: 'A PDF label' } },
    },
    {
      method: 'delete',
      path: '/api/things/:id',
      summary: 'Delete',
      roles: 'admin',
      params: z.object({ id: z.coerce.number().int() }),
      responses: { 204: null },
    },
  ]);
  const doc = buildOpenApiDocument([group]);

  it('turns express paths into OpenAPI paths with their parameters, bodies and answers', async () => {
    expect(Object.keys(doc.paths).sort()).toEqual(['/api/things', '/api/things/{id}', '/api/things/{id}/label.pdf']);
    const list = doc.paths['/api/things'].get as Record<string, unknown>;
    expect(list.parameters).toEqual([
      expect.objectContaining({ name: 'page', in: 'query', required: false }),
      expect.objectContaining({ name: 'q', in: 'query', required: false }),
    ]);
    const edit = doc.paths['/api/things/{id}'].patch as {
      parameters: unknown[];
      requestBody: unknown;
      responses: Record<string, unknown>;
      'x-roles': string;
    };
    expect(edit['x-roles']).toBe('curator, admin');
    expect(edit.parameters).toEqual([expect.objectContaining({ name: 'id', in: 'path', required: true })]);
    expect(edit.requestBody).toMatchObject({
      required: true,
      content: { 'application/json': { schema: { type: 'object', required: ['name'] } } },
    });
    expect(Object.keys(edit.responses).sort()).toEqual(['200', '400', '401', '403', '404', '409', '422']);
    expect(edit.responses[400]).toMatchObject({
      content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
    });
    expect(
      (doc.paths['/api/things/{id}/label.pdf'].get as { responses: Record<string, unknown> }).responses[200],
    ).toMatchObject({ content: { 'application/pdf': expect.any(Object) } });
    expect((doc.paths['/api/things/{id}'].delete as { responses: Record<string, unknown> }).responses[204]).toEqual({
      description: 'No content',
    });
    const result = await new Validator().validate(JSON.parse(JSON.stringify(doc)));
    expect(result.valid, JSON.stringify(result.errors)).toBe(true);
  });
});

describe('contract check (tests only)', () => {
  const group = defineRoutes('things', [
    {
      method: 'get',
      path: '/api/things/:id',
      summary: 'One',
      roles: 'anyone',
      responses: { 200: z.object({ id: z.number(), at: z.iso.datetime() }) },
    },
    {
      method: 'get',
      path: '/api/things/:id/parts',
      summary: 'Parts',
      roles: 'anyone',
      responses: { 200: z.object({ parts: z.array(z.string()) }) },
    },
  ]);
  const mini = express();
  mini.use('/api', contractCheck([group]));
  const things = express.Router();
  things.get('/:id', (req, res) => {
    if (req.params.id === '1') res.json({ id: 1, at: new Date('2026-01-02T03:04:05Z') });
    else if (req.params.id === '2') res.json({ id: 'two', at: 'yesterday' });
    else if (req.params.id === '3') res.status(201).json({ id: 3, at: new Date() });
    else if (req.params.id === '6') res.type('json').send(JSON.stringify({ id: 6, at: '2026-01-02T03:04:05.000Z' }));
    else if (req.params.id === '7') res.type('json').send(JSON.stringify({ id: 'five' }));
    else res.status(404).json({ error: { code: 'not_found', message: 'Thing not found.' } });
  });
  things.get('/:id/free', (_req, res) => res.json({ anything: true }));
  const parts = express.Router({ mergeParams: true });
  parts.get('/', (_req, res) => res.json({ parts: [1, 2] }));
  things.use('/:id/parts', parts);
  mini.use('/api/things', things);

  it('lets an answer through that its schema describes (dates as serialised)', async () => {
    const res = await request(mini).get('/api/things/1').expect(200);
    expect(res.body).toEqual({ id: 1, at: '2026-01-02T03:04:05.000Z' });
  });
  it('answers 500 contract_violation with the issues when the body does not match', async () => {
    const res = await request(mini).get('/api/things/2').expect(500);
    expect(res.body.error.code).toBe('contract_violation');
    expect(res.body.error.details.route).toBe('GET /api/things/:id');
    expect(res.body.error.details.issues.map((i: { path: string[] }) => i.path.join('.')).sort()).toEqual(['at', 'id']);
  });
  it('checks JSON a route serialised itself (res.send with a JSON type), as the archive list sends its cached pages', async () => {
    expect((await request(mini).get('/api/things/6').expect(200)).body).toEqual({
      id: 6,
      at: '2026-01-02T03:04:05.000Z',
    });
    const res = await request(mini).get('/api/things/7').expect(500);
    expect(res.body.error.code).toBe('contract_violation');
  });
  it('finds the contract of a router mounted on a path with a parameter', async () => {
    const res = await request(mini).get('/api/things/7/parts').expect(500);
    expect(res.body.error.details.route).toBe('GET /api/things/:id/parts');
  });
  it('refuses a status the contract does not list', async () => {
    const res = await request(mini).get('/api/things/3').expect(500);
    expect(res.body.error.code).toBe('contract_violation');
  });
  it('checks refusals against the error shape and skips routes without a contract', async () => {
    await request(mini).get('/api/things/4').expect(404);
    await request(mini).get('/api/things/1/free').expect(200);
  });
});

describe('GET /api/docs/', () => {
  it('serves the API reference page with the locally served Swagger UI and our own initializer', async () => {
    const res = await request(app).get('/api/docs/').expect(200);
    expect(res.headers['content-type']).toMatch(/text\/html/);
    expect(res.text).toContain('<script src="/api/docs/swagger-ui-bundle.js"></script>');
    expect(res.text).toContain('<script src="/api/docs/tinctoria-docs.js"></script>');
    expect(res.text).not.toMatch(/<script>(?!<)|<script(?![^>]*src)[^>]*>/); // no inline script
    expect(res.text).not.toMatch(/https?:\/\//);
    expect(res.headers['content-security-policy']).toMatch(/script-src 'self'/);
    const init = await request(app).get('/api/docs/tinctoria-docs.js').expect(200);
    expect(init.text).toContain("url: '/api/openapi.json'");
    const bundle = await request(app).get('/api/docs/swagger-ui-bundle.js').expect(200);
    expect(bundle.headers['content-type']).toMatch(/javascript/);
    await request(app).get('/api/docs/swagger-ui.css').expect(200);
  });
});

import { describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.ts';
import type { Role } from '../../shared/roles.ts';
import { ORIGIN } from '../support/agents.ts';
import { useTestMail } from '../support/mail.ts';
import { registeredApiRoutes } from '../support/routes.ts';
import {
  WHO,
  routeMatrix,
  type ActorKey,
  type Expected,
  type MatrixRow,
  type Ownership,
  type Who,
} from '../support/route-matrix.ts';

const app = createApp();
useTestMail();

const rowRoutes = routeMatrix.map((r) => r.route);

describe('every /api route has a row in the matrix', () => {
  const registered = registeredApiRoutes(app);

  it('finds the registered routes', () => {
    expect(registered).toContain('POST /api/auth/login');
    expect(registered).toContain('PATCH /api/team/:id');
  });
  it('has a row for each registered route (add one in tests/support/route-matrix.ts)', () => {
    expect(registered.filter((r) => !rowRoutes.includes(r as MatrixRow['route']))).toEqual([]);
  });
  it('has no row for a route that does not exist, and none twice', () => {
    expect(rowRoutes.filter((r) => !registered.includes(r))).toEqual([]);
    expect(rowRoutes.filter((r, i) => rowRoutes.indexOf(r) !== i)).toEqual([]);
  });
  it.each(routeMatrix.map((r) => [r.route, r] as const))('%s names every actor', (_route, r) => {
    for (const who of WHO)
      expect(who in r.expect || (`${who}:own` in r.expect && `${who}:other` in r.expect), `${r.route}: ${who}`).toBe(
        true,
      );
  });
});

async function actor(who: Who) {
  const agent = request.agent(app);
  if (who === 'visitor') return { agent, user: null };
  const res = await agent
    .post('/api/auth/login')
    .set('Origin', ORIGIN)
    .send({ email: `${who}@demo.test`, password: 'tinctoria-demo' });
  if (res.status !== 200) throw new Error(`sign-in as ${who} failed: ${res.status}`);
  return { agent, user: res.body.user as { id: number; role: Role } };
}

const fill = (path: string, params: Record<string, string | number> = {}) =>
  path.replace(/:(\w+)/g, (_m, k: string) => {
    if (params[k] === undefined) throw new Error(`no fixture for :${k} in ${path}`);
    return encodeURIComponent(String(params[k]));
  });

const matches = (status: number, e: Expected) => (e === '2xx' ? status >= 200 && status < 300 : status === e);

describe.each(routeMatrix.map((r) => [r.route, r] as const))('%s', (_route, r) => {
  it.each(Object.entries(r.expect) as Array<[ActorKey, Expected]>)('as %s → %s', async (key, expected) => {
    const [who, ownership] = key.split(':') as [Who, Ownership | undefined];
    const { agent, user } = await actor(who);
    const fixture = (await r.setup?.({ who, ownership, user })) ?? {};
    const [method, path] = r.route.split(' ');
    let req = agent[method.toLowerCase() as 'get'](fill(path, fixture.params));
    if (method !== 'GET') req = req.set('Origin', ORIGIN);
    if (fixture.query) req = req.query(fixture.query);
    if (fixture.attach) for (const f of fixture.attach) req = req.attach(f.field, f.buffer, f.filename);
    const res = fixture.attach ? await req : await req.send((fixture.body ?? r.body) as object);
    expect(matches(res.status, expected), `${r.route} as ${key}: got ${res.status} ${JSON.stringify(res.body)}`).toBe(
      true,
    );
    // Refusals always carry the JSON error shape.
    if (res.status >= 400)
      expect(res.body.error).toMatchObject({ code: expect.any(String), message: expect.any(String) });
  });
});

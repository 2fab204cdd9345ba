import type { RequestHandler } from 'express';
import { z } from 'zod';
import { errorSchema } from '../../shared/schemas/common.ts';
import { groups as allGroups } from '../openapi/groups/index.ts';
import type { RouteContract, RouteGroup } from '../openapi/registry.ts';

/**
 * Tests only (wired in server/app.ts when NODE_ENV is 'test'): every JSON answer of an /api route
 * is parsed with the response schema its contract (server/openapi/groups/) gives for that status,
 * as it goes on the wire (after JSON serialisation). A mismatch answers 500 `contract_violation`
 * with the zod issues in `details`, so any API test that expects a 2xx fails loudly. Refusals
 * (4xx/5xx) are parsed with errorSchema. Routes without a contract are let through.
 */
export function contractCheck(groups: RouteGroup[] = allGroups): RequestHandler {
  const byRoute = new Map<string, RouteContract>();
  for (const g of groups) for (const r of g.routes) byRoute.set(`${r.method.toUpperCase()} ${r.path}`, r);
  // A router mounted on a path with a parameter (e.g. '/:id/photos') has the actual values in req.baseUrl:
  // then the request path is matched against the contracts' patterns, the most literal first.
  const patterns = [...byRoute.entries()]
    .map(([key, r]) => ({
      key,
      method: r.method.toUpperCase(),
      params: (r.path.match(/:\w+/g) ?? []).length,
      re: new RegExp(`^${r.path.replace(/[.]/g, '\\.').replace(/:\w+/g, '[^/]+')}/?$`),
    }))
    .sort((a, b) => a.params - b.params);
  const find = (method: string, key: string | undefined, path: string) => {
    if (key && byRoute.has(key)) return key;
    return patterns.find((p) => p.method === method && p.re.test(path))?.key;
  };

  return (req, res, next) => {
    const original = res.json.bind(res);
    const send = res.send.bind(res);
    // res.json serialises and calls res.send: while it runs, send passes its string through unchecked.
    let serialising = false;
    const json = (body: unknown) => {
      serialising = true;
      try {
        return original(body);
      } finally {
        serialising = false;
      }
    };
    // A route may send JSON it serialised itself (the archive list's cached pages): checked like res.json's.
    res.send = (body?: unknown) => {
      const type = String(res.get('Content-Type') ?? '');
      if (!serialising && typeof body === 'string' && type.includes('json')) return res.json(JSON.parse(body));
      return send(body);
    };
    res.json = (body: unknown) => {
      const wire: unknown = body === undefined ? undefined : JSON.parse(JSON.stringify(body));
      const status = res.statusCode;
      const routePath = typeof req.route?.path === 'string' ? req.route.path : undefined;
      const matched =
        routePath === undefined
          ? undefined
          : `${req.method} ${req.baseUrl}${routePath === '/' && req.baseUrl ? '' : routePath}`;
      const key = routePath === undefined ? undefined : find(req.method, matched, req.baseUrl + req.path);
      const contract = key ? byRoute.get(key) : undefined;
      const violation = (message: string, details: Record<string, unknown>) => {
        res.status(500);
        return json({
          error: {
            code: 'contract_violation',
            message,
            details: { route: key ?? `${req.method} ${req.originalUrl}`, status, ...details },
          },
        });
      };

      if (status >= 400) {
        const parsed = errorSchema.safeParse(wire);
        return parsed.success
          ? json(body)
          : violation(`A ${status} refusal does not have the error shape.`, { issues: parsed.error.issues });
      }
      if (!contract) return json(body);
      const expected = contract.responses[status as keyof RouteContract['responses']];
      if (expected === undefined)
        return violation(`${key} answered ${status}, which its contract does not list.`, {
          listed: Object.keys(contract.responses),
        });
      if (!(expected instanceof z.ZodType))
        return violation(
          `${key} answered JSON with ${status}, which its contract lists as ${expected === null ? 'no content' : expected.contentType}.`,
          {},
        );
      const parsed = expected.safeParse(wire);
      return parsed.success
        ? json(body)
        : violation(`${key} answered ${status} with a body its contract does not describe.`, {
            issues: parsed.error.issues,
          });
    };
    next();
  };
}

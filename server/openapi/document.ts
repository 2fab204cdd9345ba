import { z } from 'zod';
import { errorSchema } from '../../shared/schemas/common.ts';
import { SESSION_COOKIE } from '../auth/session.ts';
import { APP_VERSION } from '../version.ts';
import { groups as allGroups } from './groups/index.ts';
import type { NonJson, RouteContract, RouteGroup } from './registry.ts';

/**
 * The OpenAPI 3.1 document of the /api routes, built from the contracts in ./groups/ (served at
 * GET /api/openapi.json, rendered at /api/docs/). OpenAPI 3.1 schemas are JSON Schema 2020-12,
 * zod 4's default target for `z.toJSONSchema`; requests are described as they are accepted
 * (io: 'input', e.g. a query's page as given), answers as they are sent (io: 'output').
 */

type Json = Record<string, unknown>;

const ERROR_STATUSES: Record<number, string> = {
  400: 'The input is not valid; `details.fields` names each field in error.',
  401: 'Sign in to continue.',
  403: 'The role does not allow this.',
  404: 'Not found (or not visible to this role).',
  409: 'Conflicts with the current state of a record.',
  422: 'Understood but cannot be done.',
};

const SUCCESS_WORDS: Record<number, string> = {
  200: 'OK',
  201: 'Created',
  202: 'Accepted',
  204: 'No content',
  302: 'Redirect',
  303: 'See other',
};

const isNonJson = (r: unknown): r is NonJson =>
  typeof r === 'object' && r !== null && 'contentType' in r && !(r instanceof z.ZodType);

/** Express `/api/pieces/:id` → OpenAPI `/api/pieces/{id}`. */
export const openApiPath = (expressPath: string) => expressPath.replace(/:(\w+)/g, '{$1}');

export function buildOpenApiDocument(groups: RouteGroup[] = allGroups) {
  const components: Record<string, Json> = { Error: toSchema(errorSchema, 'output', 'Error', {}) };

  /** A zod schema as JSON Schema; its $defs (recursive or named parts) move to components so $refs resolve in the document. */
  function toSchema(
    schema: z.ZodType,
    io: 'input' | 'output',
    prefix: string,
    into: Record<string, Json> = components,
  ): Json {
    const js = z.toJSONSchema(schema, { io, unrepresentable: 'any' }) as Json;
    delete js.$schema;
    const defs = js.$defs as Record<string, Json> | undefined;
    delete js.$defs;
    // A schema named in shared/schemas (`.meta({ id: 'TrialDetail' })`) becomes one shared component;
    // zod's own names for repeated parts (`__schema0`) are kept apart per operation.
    const names = new Map<string, string>();
    for (const name of Object.keys(defs ?? {}))
      if (!name.startsWith('__')) names.set(name, io === 'input' ? `${name}Input` : name);
    const rename = (name: string) => names.get(name) ?? `${prefix}_${name}`.replace(/[^A-Za-z0-9._-]/g, '_');
    const rewrite = (node: unknown): unknown => {
      if (Array.isArray(node)) return node.map(rewrite);
      if (node && typeof node === 'object') {
        const out: Json = {};
        for (const [k, v] of Object.entries(node)) {
          out[k] =
            k === '$ref' && typeof v === 'string' && v.startsWith('#/$defs/')
              ? `#/components/schemas/${rename(v.slice('#/$defs/'.length))}`
              : rewrite(v);
        }
        return out;
      }
      return node;
    };
    for (const [name, def] of Object.entries(defs ?? {})) {
      const key = rename(name);
      const out = rewrite(def) as Json;
      if (names.has(name) && key in into && JSON.stringify(into[key]) !== JSON.stringify(out))
        throw new Error(`two different schemas are named ${key} in shared/schemas`);
      into[key] = out;
    }
    return rewrite(js) as Json;
  }

  const opId = (r: RouteContract) =>
    r.method +
    r.path
      .replace(/^\/api/, '')
      .split(/[/.-]/)
      .filter(Boolean)
      .map((s) => (s.startsWith(':') ? `By${s[1].toUpperCase()}${s.slice(2)}` : s[0].toUpperCase() + s.slice(1)))
      .join('');

  function parameters(schema: z.ZodType | undefined, where: 'path' | 'query', prefix: string) {
    if (!schema) return [];
    const js = toSchema(schema, 'input', prefix);
    const props = (js.properties ?? {}) as Record<string, Json>;
    const required = new Set((js.required ?? []) as string[]);
    return Object.entries(props).map(([name, s]) => ({
      name,
      in: where,
      required: where === 'path' || required.has(name),
      ...(typeof s.description === 'string' ? { description: s.description } : {}),
      schema: s,
    }));
  }

  function response(status: number, r: z.ZodType | NonJson | null, prefix: string): Json {
    if (r === null) return { description: SUCCESS_WORDS[status] ?? 'No content' };
    if (isNonJson(r)) {
      if (status >= 300 && status < 400)
        return { description: r.description, headers: { Location: { schema: { type: 'string' } } } };
      return {
        description: r.description,
        content: { [r.contentType]: { schema: { type: 'string', contentMediaType: r.contentType } } },
      };
    }
    return {
      description: SUCCESS_WORDS[status] ?? 'Answer',
      content: { 'application/json': { schema: toSchema(r, 'output', prefix) } },
    };
  }

  const paths: Record<string, Record<string, Json>> = {};
  const seen = new Set<string>();
  for (const group of groups) {
    for (const r of group.routes) {
      const key = `${r.method.toUpperCase()} ${r.path}`;
      if (seen.has(key)) throw new Error(`two contracts for ${key}`);
      seen.add(key);
      const id = opId(r);
      const op: Json = {
        operationId: id,
        tags: [group.group],
        summary: r.summary,
        description: `Roles: ${r.roles}.`,
        'x-roles': r.roles,
      };
      const params = [...parameters(r.params, 'path', `${id}_params`), ...parameters(r.query, 'query', `${id}_query`)];
      if (params.length) op.parameters = params;
      if (r.body)
        op.requestBody = {
          required: true,
          content: { 'application/json': { schema: toSchema(r.body, 'input', `${id}_body`) } },
        };
      const responses: Json = {};
      for (const [status, res] of Object.entries(r.responses))
        responses[status] = response(Number(status), res as z.ZodType | NonJson | null, `${id}_${status}`);
      for (const [status, description] of Object.entries(ERROR_STATUSES)) {
        responses[status] = {
          description,
          content: { 'application/json': { schema: { $ref: '#/components/schemas/Error' } } },
        };
      }
      op.responses = responses;
      (paths[openApiPath(r.path)] ??= {})[r.method] = op;
    }
  }

  return {
    openapi: '3.1.0',
    info: {
      title: 'Tinctoria API',
      version: APP_VERSION,
      description:
        "The JSON API of Tinctoria. Every refusal answers `{ error: { code, message, details? } }`. Sign-in is a session cookie (POST /api/auth/login); writes from a browser must come from the app's own origin.",
    },
    tags: groups.map((g) => ({ name: g.group })),
    paths,
    components: {
      schemas: components,
      securitySchemes: { session: { type: 'apiKey', in: 'cookie', name: SESSION_COOKIE } },
    },
  };
}

export type OpenApiDocument = ReturnType<typeof buildOpenApiDocument>;

let cached: OpenApiDocument | undefined;
/** Built once per process: the contracts do not change while it runs. */
export const openApiDocument = () => (cached ??= buildOpenApiDocument());

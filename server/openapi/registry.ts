import type { z } from 'zod';

/**
 * The wire contract of one /api route: its request schemas and, per status, its response schema,
 * all from shared/schemas. One file per route group in ./groups/ declares its routes with
 * `defineRoutes`; ./groups/index.ts lists the groups. The OpenAPI document (/api/openapi.json) is
 * built from these, and in tests every JSON answer is parsed with its schema (server/http/contract.ts).
 */
export type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** A response that is not JSON: a file download or a redirect. */
export type NonJson = { contentType: string; description: string };

export type RouteContract = {
  method: Method;
  /** Express-style path as mounted, e.g. '/api/pieces/:id'. */
  path: string;
  summary: string;
  /** Who may call it, in words that match the policy table, e.g. 'curator, admin'; 'anyone' when public. */
  roles: string;
  params?: z.ZodObject;
  query?: z.ZodType;
  body?: z.ZodType;
  /** Success answers by status; refusals use errorSchema (shared/schemas/common.ts) and need not be listed. */
  responses: Partial<Record<200 | 201 | 202 | 204 | 302 | 303, z.ZodType | NonJson | null>>;
};

export const defineRoutes = (group: string, routes: RouteContract[]) => ({ group, routes });
export type RouteGroup = ReturnType<typeof defineRoutes>;

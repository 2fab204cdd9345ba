import type { RouteGroup } from '../registry.ts';
import openapi from './openapi.ts';

// One import per route group, in the order of server/routes/index.ts.
export const groups: RouteGroup[] = [
  openapi,
];

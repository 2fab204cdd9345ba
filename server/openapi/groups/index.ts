import type { RouteGroup } from '../registry.ts';
import openapi from './openapi.ts';
import reference from './reference.ts';
import vocabularies from './vocabularies.ts';
import trials from './trials.ts';
import batches from './batches.ts';
import series from './series.ts';

// One import per route group, in the order of server/routes/index.ts.
export const groups: RouteGroup[] = [
  openapi,
  reference,
  vocabularies,
  trials,
  batches,
  series,
];

import type { Chemical } from '../models/index.ts';

/** A chemical needs a caution when it carries a GHS signal word or H statements, or is not simply permitted. */
export const isHazardous = (c: Chemical) =>
  c.signalWord != null || (c.hStatements?.length ?? 0) > 0 || c.status !== 'permitted';

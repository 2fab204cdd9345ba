import { z } from 'zod';
import '../messages.ts';

/**
 * Shapes every route shares: one numeric id parameter, one paging query and one paged envelope,
 * and the error body (server/http/errors.ts). Response schemas of each group live beside its
 * request schemas in shared/schemas/<group>.ts and are built from these.
 */

export const id = z.coerce.number().int().positive('Give a numeric id');
export const idParams = z.object({ id });

/** The paging query every list takes: page from 1, page size up to 100 (50 unless the list says otherwise). */
export const pageQuery = (defaultSize = 50, max = 100) =>
  z.object({
    page: z.coerce.number().int().min(1).default(1),
    pageSize: z.coerce.number().int().min(1).max(max).default(defaultSize),
  });

/** The envelope of every paged list. */
export const paged = <T extends z.ZodType>(item: T) =>
  z.object({
    items: z.array(item),
    total: z.number().int().min(0),
    page: z.number().int().min(1),
    pageSize: z.number().int().min(1),
  });
export type Paged<T> = { items: T[]; total: number; page: number; pageSize: number };

/** Build the envelope from a page of rows (one place, so every list answers alike). */
export const toPaged = <T>(items: T[], total: number, page: number, pageSize: number): Paged<T> => ({
  items,
  total,
  page,
  pageSize,
});

/** Every refusal: `{ error: { code, message, details?, requestId? } }`; a 400 carries `details.fields` keyed by dotted path. */
export const errorSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    details: z.record(z.string(), z.unknown()).optional(),
    /** The request's id (also the X-Request-Id response header), to find its line in the server log. */
    requestId: z.string().optional(),
  }),
});

import { z } from 'zod';
import '../messages.ts';
import { searchFiltersSchema, shadeQuerySchema } from './search.ts';

// Saved searches (issue 19): a name and the /search page's query string (words, facets, shade), which the page keeps
// in its URL; opening one goes to /search?<query>. The keys are the search's own (searchFiltersSchema, so a facet
// added there can be saved too) and the shade's; paging is left out.
const SHADE_KEYS = ['hex', 'L', 'a', 'b', 'maxDeltaE'] as const;
export const SAVED_SEARCH_KEYS: readonly string[] = [...Object.keys(searchFiltersSchema.shape), ...SHADE_KEYS];
export const SAVED_SEARCHES_MAX = 100;

/** The query string in a stable form (known keys only, in the order given, without "?" or paging). */
export function tidySearchQuery(raw: string): string {
  const from = new URLSearchParams(raw.trim().replace(/^\?/, ''));
  const to = new URLSearchParams();
  for (const [k, v] of from) if (SAVED_SEARCH_KEYS.includes(k) && v.trim() !== '') to.append(k, v.trim());
  return to.toString();
}

function paramsOf(query: string): Record<string, string | string[]> {
  const u = new URLSearchParams(query);
  const out: Record<string, string | string[]> = {};
  for (const k of new Set(u.keys())) out[k] = u.getAll(k).length > 1 ? u.getAll(k) : (u.get(k) ?? '');
  return out;
}

const searchQueryText = z
  .string({ error: 'Give the search to save' })
  .max(2000, 'This search is too long to save (at most 2000 characters)')
  .transform(tidySearchQuery)
  .superRefine((q, ctx) => {
    if (!q) {
      ctx.addIssue({ code: 'custom', message: 'Choose words, a facet or a shade before saving the search' });
      return;
    }
    const params = paramsOf(q);
    const hasShade = SHADE_KEYS.some((k) => k in params);
    const r = (hasShade ? shadeQuerySchema : searchFiltersSchema).safeParse(params);
    if (!r.success)
      ctx.addIssue({ code: 'custom', message: `This search cannot be saved: ${r.error.issues[0]?.message}` });
  });

export const savedSearchCreateSchema = z
  .object({
    name: z
      .string({ error: 'Name the search' })
      .trim()
      .min(1, 'Name the search, e.g. madder reds on cotton')
      .max(120, 'Use at most 120 characters'),
    query: searchQueryText,
  })
  .strict();
export type SavedSearchCreateInput = z.infer<typeof savedSearchCreateSchema>;

// ---- Responses (server/presenters/saved-search.ts) ----
export const savedSearchSchema = z.object({
  id: z.number(),
  name: z.string(),
  query: z.string(),
  /** Where the search opens: /search?<query>. */
  href: z.string(),
  createdAt: z.iso.datetime(),
});
export type SavedSearchOut = z.infer<typeof savedSearchSchema>;
export const savedSearchResponse = z.object({ savedSearch: savedSearchSchema });
export const savedSearchListResponse = z.object({ items: z.array(savedSearchSchema) });
export type SavedSearchListResponse = z.infer<typeof savedSearchListResponse>;

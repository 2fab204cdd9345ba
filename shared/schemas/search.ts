import { z } from 'zod';
import '../messages.ts';
import { HEX_RE } from '../search/lab.ts';
import { IMAGE_ESTIMATE_CONDITIONS } from '../colour/conditions.ts';
import { paged } from './common.ts';

// A facet parameter may be repeated (?dyestuff=madder&dyestuff=weld).
const many = z
  .union([z.string(), z.array(z.string())])
  .transform((v) => (Array.isArray(v) ? v : [v]).map((s) => s.trim()).filter(Boolean))
  .pipe(z.array(z.string().max(160, 'Use at most 160 characters')).max(10, 'Choose at most 10 values'))
  .optional();
const int = (min: number, max: number, msg: string) =>
  z.coerce.number<string>({ error: msg }).int(msg).min(min, msg).max(max, msg);

export const searchFiltersSchema = z.object({
  q: z.string().trim().max(200, 'Use at most 200 characters').optional(),
  dyestuff: many,
  mordant: many,
  historicalMordant: many,
  modernMordant: many,
  fibre: many,
  technique: many,
  place: many,
  // The methods of the analyses behind a piece's identified dyestuffs and mordants (issue 19), e.g. HPLC-DAD.
  identifiedBy: many,
  status: z
    .union([z.enum(['draft', 'published']), z.array(z.enum(['draft', 'published']))])
    .transform((v) => (Array.isArray(v) ? v : [v]))
    .optional(),
  century: z
    .union([z.string(), z.array(z.string())])
    .transform((v) => (Array.isArray(v) ? v : [v]))
    .pipe(z.array(int(1, 21, 'Give a century from 1 to 21 (18 = 1700–1799)')).max(10))
    .optional(),
});

export const searchQuerySchema = searchFiltersSchema.extend({
  page: int(1, 10_000, 'Give a page number of 1 or more').default(1),
  pageSize: int(1, 100, 'Give a page size from 1 to 100').default(20),
});
export type SearchQuery = z.infer<typeof searchQuerySchema>;
export type SearchFilters = z.infer<typeof searchFiltersSchema>;

const labNum = (min: number, max: number, name: string) =>
  z.coerce
    .number({ error: `Give ${name} as a number` })
    .min(min, `${name} runs from ${min} to ${max}`)
    .max(max, `${name} runs from ${min} to ${max}`)
    .optional();

export const MAX_RADIUS = 30;

export const shadeQuerySchema = searchFiltersSchema
  .extend({
    hex: z.string().trim().regex(HEX_RE, 'Give a colour as six hex digits, e.g. 9b2f2f').optional(),
    L: labNum(0, 100, 'L*'),
    a: labNum(-160, 160, 'a*'),
    b: labNum(-160, 160, 'b*'),
    maxDeltaE: z.coerce
      .number({ error: 'Give the radius as a number' })
      .gt(0, 'The radius must be above 0')
      .max(MAX_RADIUS, `Use a radius of at most ${MAX_RADIUS} ΔE00`)
      .default(5),
    limit: int(1, 200, 'Give a limit from 1 to 200').default(50),
    page: int(1, 10_000, 'Give a page number of 1 or more').default(1),
  })
  .superRefine((v, ctx) => {
    const lab = [v.L, v.a, v.b].filter((x) => x !== undefined).length;
    if (v.hex && lab)
      ctx.addIssue({ code: 'custom', path: ['hex'], message: 'Give either a hex colour or L*, a*, b*, not both' });
    else if (!v.hex && lab === 0)
      ctx.addIssue({ code: 'custom', path: ['hex'], message: 'Give a colour: hex, or L*, a* and b*' });
    else if (!v.hex && lab < 3)
      for (const k of ['L', 'a', 'b'] as const)
        if (v[k] === undefined) ctx.addIssue({ code: 'custom', path: [k], message: `Give ${k}* too` });
  });
export type ShadeQuery = z.infer<typeof shadeQuerySchema>;

// ---- Responses (server/search/service.ts returns these types; tsc checks the service against them) ----

export const FACET_NAMES = [
  'dyestuff',
  'historicalMordant',
  'modernMordant',
  'fibre',
  'technique',
  'century',
  'place',
  'status',
  'identifiedBy',
] as const;
export type FacetName = (typeof FACET_NAMES)[number];
const facetRows = z.array(z.object({ value: z.string(), label: z.string(), count: z.number() }));
/** Every facet, each with its values (value as filtered by, label as shown) and how many pieces carry them. */
export const facetCountsSchema = z.object(
  Object.fromEntries(FACET_NAMES.map((f) => [f, facetRows])) as Record<FacetName, typeof facetRows>,
);
export type FacetCounts = z.infer<typeof facetCountsSchema>;

/** A matched stretch of a field: `marks` are [start, end) character offsets into `text`. */
export const searchHighlightSchema = z.object({
  field: z.string(),
  text: z.string(),
  marks: z.array(z.tuple([z.number(), z.number()])),
});
export type SearchHighlight = z.infer<typeof searchHighlightSchema>;

export const searchItemSchema = z.object({
  id: z.number(),
  accessionNumber: z.string(),
  title: z.string(),
  objectName: z.string(),
  place: z.string(),
  dateText: z.string(),
  status: z.enum(['draft', 'published']),
  dyestuffs: z.array(z.string()),
  photoId: z.number().nullable(),
  /** Relevance of a text query; null when none was given. */
  score: z.number().nullable(),
  highlights: z.array(searchHighlightSchema),
  /** Codes of the trials through which the piece matched. */
  viaTrials: z.array(z.string()),
});
export type SearchItem = z.infer<typeof searchItemSchema>;
export const searchResponse = paged(searchItemSchema).extend({ facets: facetCountsSchema });
export type SearchResponse = z.infer<typeof searchResponse>;

const lab = z.object({ L: z.number(), a: z.number(), b: z.number() });
export const shadeItemSchema = z.object({
  pieceId: z.number(),
  accessionNumber: z.string(),
  title: z.string(),
  photoId: z.number(),
  /** A palette colour: an image estimate, CIELAB D65/2° (IMAGE_ESTIMATE_CONDITIONS). */
  colour: z.object({
    hex: z.string(),
    lab,
    share: z.number(),
    source: z.literal('image-estimate'),
    illuminant: z.literal(IMAGE_ESTIMATE_CONDITIONS.illuminant),
    observer: z.literal(IMAGE_ESTIMATE_CONDITIONS.observer),
  }),
  deltaE00: z.number(),
});
export type ShadeItem = z.infer<typeof shadeItemSchema>;
/** `pageSize` is the shade query's `limit`; `query` echoes the colour searched for and the radius. */
export const shadeResponse = paged(shadeItemSchema).extend({
  facets: facetCountsSchema,
  query: lab.extend({ hex: z.string(), maxDeltaE: z.number() }),
});
export type ShadeResponse = z.infer<typeof shadeResponse>;

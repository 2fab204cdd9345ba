import { z } from 'zod';
import { ACCESSION_MAX, ACCESSION_MESSAGE, ACCESSION_PATTERN, tidyAccession } from '../accession.ts';
import '../messages.ts';
import { dateIssues, YEAR_MAX, YEAR_MIN, type DateFields } from '../edtf.ts';
import { paged, pageQuery } from './common.ts';
import { photoSchema } from './photo.ts';
import { lightDoseSchema } from './records.ts';
import { curatorialFields, curatorialOut } from './curatorial.ts';

export { ACCESSION_PATTERN } from '../accession.ts';

export const EVIDENCE = ['attributed', 'identified'] as const;
export const PIECE_STATUSES = ['draft', 'published'] as const;

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters`);
const optionalText = (max: number) =>
  z
    .union([text(max), z.null()])
    .optional()
    .transform((v) => (v === '' ? null : v));
const mm = z
  .number({ error: 'Enter a number of millimetres' })
  .positive('Must be more than 0 mm')
  .max(100_000, 'Must be at most 100 000 mm')
  .multipleOf(0.1, 'Use at most one decimal place')
  .nullable()
  .optional();
const year = z
  .number({ error: 'Enter a year' })
  .int('Enter a whole year')
  .min(YEAR_MIN, `Use a year from ${YEAR_MIN}`)
  .max(YEAR_MAX, `Use a year up to ${YEAR_MAX}`)
  .nullable()
  .optional();

/** "identified" stands on a recorded analysis of this piece (issue 19): the entry carries its analysisId. */
export const IDENTIFIED_NEEDS_ANALYSIS = 'Choose the analysis that identified it (record the analysis first)';
export const evidencedTerm = z
  .object({
    name: text(120).min(1, 'Enter a name'),
    evidence: z.enum(EVIDENCE, { error: 'Choose attributed or identified' }),
    analysisId: z.number({ error: 'Choose an analysis' }).int().positive().nullable().optional(),
  })
  .superRefine((t, ctx) => {
    if (t.evidence === 'identified' && t.analysisId == null)
      ctx.addIssue({ code: 'custom', path: ['analysisId'], message: IDENTIFIED_NEEDS_ANALYSIS });
  })
  // An attributed entry points at no analysis.
  .transform((t) => ({ ...t, analysisId: t.evidence === 'identified' ? (t.analysisId ?? null) : null }));
export type EvidencedTermInput = z.infer<typeof evidencedTerm>;

const termList = (what: string) =>
  z
    .array(text(120).min(1, `Enter a ${what}`))
    .max(20)
    .refine((a) => new Set(a).size === a.length, `Each ${what} only once`);
const evidencedList = z
  .array(evidencedTerm)
  .max(20)
  .refine((a) => new Set(a.map((t) => t.name)).size === a.length, 'Each name only once');

const pieceFields = {
  accessionNumber: z
    .string()
    .transform(tidyAccession)
    .pipe(
      z
        .string()
        .min(1, 'Enter the accession number')
        .max(ACCESSION_MAX, `Use at most ${ACCESSION_MAX} characters`)
        .regex(ACCESSION_PATTERN, ACCESSION_MESSAGE),
    ),
  objectName: text(120).min(1, 'Enter the object name, e.g. panel'),
  title: text(255).min(1, 'Enter a title'),
  dateText: optionalText(120),
  dateEdtf: optionalText(60),
  earliestYear: year,
  latestYear: year,
  place: optionalText(160),
  fibres: termList('fibre').optional(),
  weave: optionalText(80),
  threadCount: optionalText(60),
  heightMm: mm,
  widthMm: mm,
  repeatMm: mm,
  techniques: termList('technique').optional(),
  dyestuffs: evidencedList.optional(),
  historicalMordants: evidencedList.optional(),
  description: optionalText(10_000),
  provenance: optionalText(10_000),
  condition: optionalText(10_000),
  creditLine: optionalText(255),
  status: z.enum(PIECE_STATUSES).optional(),
  ...curatorialFields,
};

export { dateIssues };

const withDateRules = <T extends z.ZodType<DateFields>>(schema: T) =>
  schema.superRefine((p, ctx) => {
    for (const i of dateIssues(p)) ctx.addIssue({ code: 'custom', path: [i.path], message: i.message });
  });

export const pieceCreateSchema = withDateRules(z.object(pieceFields).strict());
export const pieceUpdateSchema = withDateRules(z.object(pieceFields).partial().strict());
export type PieceCreateInput = z.infer<typeof pieceCreateSchema>;
export type PieceUpdateInput = z.infer<typeof pieceUpdateSchema>;

export const PIECE_SORTS = [
  'accessionNumber',
  'title',
  'objectName',
  'earliestYear',
  'updatedAt',
  'createdAt',
] as const;
// The archive's pages hold 25 pieces unless asked otherwise.
export const pieceListQuery = pageQuery(25).extend({
  sort: z.enum(PIECE_SORTS).default('accessionNumber'),
  dir: z.enum(['asc', 'desc']).default('asc'),
  status: z.enum(PIECE_STATUSES).optional(),
  fibre: z.string().trim().min(1).max(120).optional(),
  technique: z.string().trim().min(1).max(120).optional(),
  dyestuff: z.string().trim().min(1).max(120).optional(),
  q: z.string().trim().min(1).max(120).optional(),
  deleted: z.enum(['only']).optional(),
});
export type PieceListQuery = z.infer<typeof pieceListQuery>;

/** A piece's trials (GET /api/pieces/:id/trials): one page of 100 unless asked otherwise. */

// ---- Responses (server/presenters/piece.ts returns these types; tsc checks the presenter against them) ----

const evidencedTermOut = z.object({
  name: z.string(),
  evidence: z.enum(EVIDENCE),
  analysisId: z.number().nullable().optional(),
});

const pieceAbilities = z.object({
  'piece:update': z.boolean(),
  'piece:publish': z.boolean(),
  'piece:delete': z.boolean(),
  'piece:restore': z.boolean(),
  'piece:history': z.boolean(),
  'photo:create': z.boolean(),
});

export const pieceSchema = z.object({
  id: z.number(),
  accessionNumber: z.string(),
  objectName: z.string(),
  title: z.string(),
  dateText: z.string().nullable(),
  dateEdtf: z.string().nullable(),
  earliestYear: z.number().nullable(),
  latestYear: z.number().nullable(),
  place: z.string().nullable(),
  fibres: z.array(z.string()),
  weave: z.string().nullable(),
  threadCount: z.string().nullable(),
  heightMm: z.number().nullable(),
  widthMm: z.number().nullable(),
  repeatMm: z.number().nullable(),
  techniques: z.array(z.string()),
  dyestuffs: z.array(evidencedTermOut),
  historicalMordants: z.array(evidencedTermOut),
  description: z.string().nullable(),
  provenance: z.string().nullable(),
  condition: z.string().nullable(),
  creditLine: z.string().nullable(),
  status: z.enum(PIECE_STATUSES),
  ...curatorialOut,
  deletedAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
  abilities: pieceAbilities,
});
export type PieceOut = z.infer<typeof pieceSchema>;

/** The row in the archive table and grid: the fields worth sorting by, plus the first photo's thumbnail. */
export const pieceSummarySchema = z.object({
  id: z.number(),
  accessionNumber: z.string(),
  objectName: z.string(),
  title: z.string(),
  dateText: z.string().nullable(),
  earliestYear: z.number().nullable(),
  latestYear: z.number().nullable(),
  fibres: z.array(z.string()),
  techniques: z.array(z.string()),
  status: z.enum(PIECE_STATUSES),
  deletedAt: z.iso.datetime().nullable(),
  updatedAt: z.iso.datetime(),
  thumbUrl: z.string().nullable(),
});
export type PieceSummary = z.infer<typeof pieceSummarySchema>;

/** One row of a piece's history (audit events); `changes` maps each field to { from, to }. */
export const auditEventSchema = z.object({
  id: z.number(),
  action: z.string(),
  at: z.iso.datetime(),
  actor: z.object({ id: z.number(), name: z.string() }).nullable(),
  fields: z.array(z.string()),
  changes: z.record(z.string(), z.object({ from: z.unknown(), to: z.unknown() })),
});
export type AuditEventOut = z.infer<typeof auditEventSchema>;

export const pieceListResponse = paged(pieceSummarySchema);
export const pieceResponse = z.object({ piece: pieceSchema });
export const pieceDetailResponse = z.object({
  piece: pieceSchema,
  photos: z.array(photoSchema),
  /** Cumulative light exposure and allowance used (shared/compute/light-dose.ts); null for visitors. */
  lightDose: lightDoseSchema.nullable().optional(),
});
export const pieceHistoryResponse = z.object({ items: z.array(auditEventSchema) });
export type PieceListResponse = z.infer<typeof pieceListResponse>;
export type PieceResponse = z.infer<typeof pieceResponse>;
export type PieceDetailResponse = z.infer<typeof pieceDetailResponse>;
export type PieceHistoryResponse = z.infer<typeof pieceHistoryResponse>;

/** The Dublin Core record of a piece (JSON-LD, dcterms); fields without a value (and empty lists) are left out. */
export const dublinCoreSchema = z.looseObject({
  '@context': z.record(z.string(), z.string()),
  '@id': z.string(),
  '@type': z.literal('dcterms:PhysicalResource'),
  'dcterms:identifier': z.string(),
  'dcterms:title': z.string(),
  'dcterms:type': z.string(),
  'dcterms:medium': z.array(z.string()).optional(),
  'dcterms:subject': z.array(z.string()).optional(),
  'dcterms:modified': z.object({ '@value': z.string(), '@type': z.literal('xsd:dateTime') }),
});

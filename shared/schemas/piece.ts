import { z } from 'zod';
import { ACCESSION_MAX, ACCESSION_MESSAGE, ACCESSION_PATTERN, tidyAccession } from '../accession.ts';
import '../messages.ts';
import { dateIssues, YEAR_MAX, YEAR_MIN, type DateFields } from '../edtf.ts';

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
const year = z.number({ error: 'Enter a year' }).int('Enter a whole year').min(YEAR_MIN, `Use a year from ${YEAR_MIN}`).max(YEAR_MAX, `Use a year up to ${YEAR_MAX}`).nullable().optional();

export const evidencedTerm = z.object({
  name: text(120).min(1, 'Enter a name'),
  evidence: z.enum(EVIDENCE, { error: 'Choose attributed or identified' }),
});
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
    .pipe(z.string().min(1, 'Enter the accession number').max(ACCESSION_MAX, `Use at most ${ACCESSION_MAX} characters`).regex(ACCESSION_PATTERN, ACCESSION_MESSAGE)),
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

export const PIECE_SORTS = ['accessionNumber', 'title', 'objectName', 'earliestYear', 'updatedAt', 'createdAt'] as const;
export const pieceListQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
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

export const idParams = z.object({ id: z.coerce.number().int().positive() });

import { z } from 'zod';
import { ACCESSION_MAX, ACCESSION_MESSAGE, ACCESSION_PATTERN, tidyAccession } from '../accession.ts';
import '../messages.ts';
import { dateIssues, edtfYears, YEAR_MAX, YEAR_MIN } from '../edtf.ts';
import { pageQuery, paged } from './common.ts';
import { RIGHTS_MESSAGE, RIGHTS_URI_PATTERN, canonicalRights } from '../rights.ts';

// The columns of a piece catalogue CSV (import and export share them, so an export re-imports).
export const PIECE_CSV_FIELDS = [
  'accessionNumber',
  'objectName',
  'title',
  'dateText',
  'dateEdtf',
  'earliestYear',
  'latestYear',
  'place',
  'fibres',
  'weave',
  'threadCount',
  'heightMm',
  'widthMm',
  'repeatMm',
  'techniques',
  'dyestuffs',
  'historicalMordants',
  'description',
  'provenance',
  'condition',
  'creditLine',
  'status',
  // Curatorial fields (issue 19) that fit one cell; makers and marks are lists of records and stay out of the CSV.
  'patternName',
  'storageLocation',
  'objectRights',
  'imageRights',
] as const;
export type PieceCsvField = (typeof PIECE_CSV_FIELDS)[number];
export const REQUIRED_PIECE_FIELDS: readonly PieceCsvField[] = ['accessionNumber', 'objectName', 'title'];

export const FIELD_LABELS: Record<PieceCsvField, string> = {
  accessionNumber: 'Accession number',
  objectName: 'Object name',
  title: 'Title',
  dateText: 'Date (as written)',
  dateEdtf: 'Date (EDTF)',
  earliestYear: 'Earliest year',
  latestYear: 'Latest year',
  place: 'Place',
  fibres: 'Fibres',
  weave: 'Weave',
  threadCount: 'Thread count',
  heightMm: 'Height (mm)',
  widthMm: 'Width (mm)',
  repeatMm: 'Repeat (mm)',
  techniques: 'Techniques',
  dyestuffs: 'Dyestuffs',
  historicalMordants: 'Historical mordants',
  description: 'Description',
  provenance: 'Provenance',
  condition: 'Condition',
  creditLine: 'Credit line',
  status: 'Status',
  patternName: 'Pattern name',
  storageLocation: 'Storage location',
  objectRights: 'Object rights',
  imageRights: 'Image rights',
};

/** Lists in one cell are separated by semicolons; evidence follows a term in brackets: "madder (identified)". */
export const LIST_SEPARATOR = '; ';
const EVIDENCE = /\s*\((attributed|identified)\)\s*$/i;
export type Evidenced = { name: string; evidence: 'attributed' | 'identified' };

export const splitList = (cell: string) =>
  cell
    .split(';')
    .map((s) => s.trim())
    .filter(Boolean);
export function parseEvidenced(cell: string): Evidenced[] {
  return splitList(cell).map((item) => {
    const m = EVIDENCE.exec(item);
    return {
      name: m ? item.slice(0, m.index).trim() : item,
      evidence: m ? (m[1].toLowerCase() as Evidenced['evidence']) : 'attributed',
    };
  });
}
export const formatEvidenced = (list: Evidenced[]) => list.map((t) => `${t.name} (${t.evidence})`).join(LIST_SEPARATOR);

/**
 * "identified" stands on an analysis of the piece, which a CSV cannot carry: such a term is refused with the way
 * round it (import it attributed, then mark it identified on the piece page with its analysis).
 */
const evidencedCell = z
  .string()
  .transform(parseEvidenced)
  .superRefine((list, ctx) => {
    const identified = list.filter((t) => t.evidence === 'identified').map((t) => t.name);
    if (identified.length)
      ctx.addIssue({
        code: 'custom',
        message: `${identified.join(', ')}: "identified" needs the analysis behind it. Import as "${identified[0]} (attributed)", then record the analysis and mark it identified on the piece page.`,
      });
  });

/** Column mapping sent with an upload: CSV header → field (omitted headers map to a field of the same name). */
export const columnMapping = z.record(z.string(), z.union([z.enum(PIECE_CSV_FIELDS), z.literal('')]));
export type ColumnMapping = z.infer<typeof columnMapping>;

const text = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters.`)
    .transform((s) => (s === '' ? null : s));
const rightsCell = text(255)
  .refine((v) => v === null || RIGHTS_URI_PATTERN.test(v), `${RIGHTS_MESSAGE}.`)
  .transform((v) => (v === null ? null : canonicalRights(v)));
const required = (max: number, what: string) =>
  z.string().trim().min(1, `${what} is required.`).max(max, `At most ${max} characters.`);
const year = z
  .string()
  .trim()
  .transform((s, ctx) => {
    if (s === '') return null;
    if (!/^-?\d{1,4}$/.test(s)) {
      ctx.addIssue({ code: 'custom', message: `"${s}" is not a year.` });
      return z.NEVER;
    }
    if (Number(s) < YEAR_MIN || Number(s) > YEAR_MAX) {
      ctx.addIssue({ code: 'custom', message: `Use a year from ${YEAR_MIN} to ${YEAR_MAX}.` });
      return z.NEVER;
    }
    return Number(s);
  });
const mm = z
  .string()
  .trim()
  .transform((s, ctx) => {
    if (s === '') return null;
    const n = Number(s.replace(',', '.'));
    if (!Number.isFinite(n) || n <= 0 || n > 9_999_999) {
      ctx.addIssue({ code: 'custom', message: `"${s}" is not a length in millimetres.` });
      return z.NEVER;
    }
    return Math.round(n * 10) / 10;
  });

/** One CSV row (all cells strings) → a piece's fields; vocabulary and uniqueness checks need the archive and run on the server. */
export const pieceImportRow = z
  .object({
    accessionNumber: required(ACCESSION_MAX, 'Accession number')
      .transform(tidyAccession)
      .pipe(z.string().regex(ACCESSION_PATTERN, `${ACCESSION_MESSAGE}.`)),
    objectName: required(120, 'Object name'),
    title: required(255, 'Title'),
    dateText: text(120),
    dateEdtf: text(60),
    earliestYear: year,
    latestYear: year,
    place: text(160),
    fibres: z.string().transform(splitList),
    weave: text(80),
    threadCount: text(60),
    heightMm: mm,
    widthMm: mm,
    repeatMm: mm,
    techniques: z.string().transform(splitList),
    dyestuffs: evidencedCell,
    historicalMordants: evidencedCell,
    description: text(20_000),
    provenance: text(20_000),
    condition: text(20_000),
    creditLine: text(255),
    status: z
      .string()
      .trim()
      .toLowerCase()
      .transform((s) => (s === '' ? 'draft' : s))
      .pipe(z.enum(['draft', 'published'], { error: 'Status is draft or published.' })),
    patternName: text(160),
    storageLocation: text(160),
    objectRights: rightsCell,
    imageRights: rightsCell,
  })
  .transform((row, ctx) => {
    // The same date rules as the form and the API (shared/edtf.ts); years come from the EDTF date when not given.
    const issues = dateIssues(row);
    for (const i of issues) ctx.addIssue({ code: 'custom', path: [i.path], message: `${i.message}.` });
    if (issues.length) return z.NEVER;
    const range = row.dateEdtf ? edtfYears(row.dateEdtf) : null;
    row.earliestYear ??= range?.earliest ?? null;
    row.latestYear ??= range?.latest ?? null;
    if (row.earliestYear !== null && row.latestYear !== null && row.earliestYear > row.latestYear)
      ctx.addIssue({
        code: 'custom',
        path: ['latestYear'],
        message: 'The latest year comes before the earliest year.',
      });
    return row;
  });
export type PieceImportRow = z.output<typeof pieceImportRow>;

export const importQuery = z.object({
  dryRun: z
    .enum(['true', 'false', '1', '0'])
    .optional()
    .transform((v) => v === 'true' || v === '1'),
});

// Answers of POST /api/import/pieces (server/import/pieces.ts is typed by these).
/** A problem on one line of the file (1 is the header); `field` is null when no one column is at fault. */
export const importErrorSchema = z.object({
  line: z.number().int(),
  field: z.string().nullable(),
  message: z.string(),
});
export type ImportError = z.infer<typeof importErrorSchema>;
export const importPreviewRowSchema = z.object({
  line: z.number().int(),
  accessionNumber: z.string(),
  title: z.string(),
  errors: z.array(importErrorSchema),
});
export type ImportPreviewRow = z.infer<typeof importPreviewRowSchema>;
/** Rows and errors of a dry run are answered a page at a time (the first page with the dry run itself). */
export const IMPORT_PREVIEW_PAGE = 100;
/**
 * `?dryRun=true` (200): every row checked, nothing written. The counts cover the whole file; `items` and `errors`
 * are their first pages (IMPORT_PREVIEW_PAGE each); further pages come from GET /api/import/previews/:id/rows and
 * /errors until `expiresAt`.
 */
export const importPreviewSchema = z.object({
  dryRun: z.literal(true),
  id: z.string(),
  rows: z.number().int().min(0),
  valid: z.number().int().min(0),
  invalid: z.number().int().min(0),
  errorCount: z.number().int().min(0),
  pageSize: z.number().int().min(1),
  expiresAt: z.string(),
  items: z.array(importPreviewRowSchema),
  errors: z.array(importErrorSchema),
});
/** A dry run's id (32 hex digits). */
export const importPreviewParams = z.object({
  id: z.string().regex(/^[0-9a-f]{32}$/, 'Not the id of an import preview.'),
});
/** Paging through a dry run's rows: every row, or only those with errors. */
export const importPreviewRowsQuery = pageQuery(IMPORT_PREVIEW_PAGE, 500).extend({
  only: z.enum(['all', 'invalid']).default('all'),
});
export const importPreviewErrorsQuery = pageQuery(IMPORT_PREVIEW_PAGE, 500);
export const importPreviewRowsPage = paged(importPreviewRowSchema);
export const importPreviewErrorsPage = paged(importErrorSchema);
export type ImportPreview = z.infer<typeof importPreviewSchema>;
/** The import itself (201): the new pieces' ids. */
export const importResultSchema = z.object({
  dryRun: z.literal(false),
  imported: z.number().int().min(0),
  ids: z.array(z.number()),
});
export type ImportResult = z.infer<typeof importResultSchema>;

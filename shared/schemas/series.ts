import { z } from 'zod';
import '../messages.ts';
import { pageQuery, paged } from './common.ts';
import { BASES, OPERATIONS, TRIAL_STATUSES } from './trial.ts';

/** A mordant level: which chemical, and how much of it in % owf. */
export const mordantLevelSchema = z.object({
  level: z.string().trim().min(1).max(40),
  chemicals: z
    .array(
      z.object({
        refId: z.number().int().positive().nullable().default(null),
        name: z.string().min(1).max(160),
        owf: z.number().positive().max(200),
      }),
    )
    .min(1),
});

export const factorSchema = z.object({
  name: z.string().trim().min(1, 'Name the factor').max(40),
  // What the factor changes in the recipe: a dyestuff or tannin amount in % owf, or the mordant used.
  role: z.enum(['dyestuff', 'tannin', 'mordant', 'other']).default('other'),
  refId: z.number().int().positive().nullable().default(null),
  refName: z.string().trim().max(160).nullable().default(null),
  levels: z.array(z.string().trim().min(1, 'Empty level').max(40)).min(1, 'Give at least one level').max(12),
  mordants: z.array(mordantLevelSchema).max(12).optional(),
});
export type FactorInput = z.infer<typeof factorSchema>;

// The colour of the piece the series aims at, as a trial's target: one of a palette colour, a region or a measurement.
const targetId = z.number().int().positive().nullable().optional();
const seriesTarget = { targetPaletteColourId: targetId, targetRegionId: targetId, targetMeasurementId: targetId };
const oneTarget = (v: {
  targetPaletteColourId?: number | null;
  targetRegionId?: number | null;
  targetMeasurementId?: number | null;
}) => [v.targetPaletteColourId, v.targetRegionId, v.targetMeasurementId].filter((x) => x != null).length <= 1;
const oneTargetIssue = { message: 'Choose one target: a palette colour, a region or a measurement.', path: ['target'] };

export const seriesCreateSchema = z
  .object({
    code: z
      .string()
      .trim()
      .min(2)
      .max(20)
      .regex(/^[A-Za-z0-9-]+$/, 'Letters, digits and dashes only'),
    title: z.string().trim().min(1, 'Give the series a title').max(200),
    kind: z.enum(['series', 'workshop']).default('series'),
    pieceId: z.number().int().positive().nullable().default(null),
    factors: z.array(factorSchema).min(1, 'Add at least one factor').max(6),
    participants: z.array(z.string().trim().min(1).max(20)).max(60).default([]),
    // Per cell, not the trial's dry fibre mass the shared label names.
    dryMassG: z
      .number({ error: 'Enter the dry mass per cell in g' })
      .positive('The dry mass per cell must be more than 0 g')
      .max(10_000, 'The dry mass per cell must be 10,000 g or less'),
    liquorRatio: z.number().positive().max(200).default(30),
    deadVolumePct: z.number().min(0).max(100).default(10),
    heldOn: z
      .string()
      .regex(/^\d{4}-\d{2}-\d{2}$/)
      .nullable()
      .default(null),
    notes: z.string().trim().max(4000).nullable().default(null),
    ...seriesTarget,
  })
  .refine(oneTarget, oneTargetIssue);
export type SeriesCreateInput = z.infer<typeof seriesCreateSchema>;

export const seriesUpdateSchema = z
  .object({
    title: z.string().trim().min(1).max(200),
    participants: z.array(z.string().trim().min(1).max(20)).max(60),
    dryMassG: z.number().positive().max(10_000),
    deadVolumePct: z.number().min(0).max(100),
    // Cells kept, as their keys (see cellKey); the others are pruned.
    keep: z.array(z.string().min(1).max(400)).max(2000),
    notes: z.string().trim().max(4000).nullable(),
    ...seriesTarget,
  })
  .partial()
  .refine(oneTarget, oneTargetIssue);
export type SeriesUpdateInput = z.infer<typeof seriesUpdateSchema>;

export const seriesListQuery = pageQuery(50);

/** POST /api/series/preview: the cells a set of factors would make, before anything is saved. */
export const seriesPreviewSchema = z.object({ factors: z.array(factorSchema).min(1).max(6) });

// ---- Answers (presenters in server/presenters/series.ts declare their return types from these) ----

const num = z.number();
const nnum = z.number().nullable();
const nstr = z.string().nullable();
const cellSchema = z.record(z.string(), z.string());

export const seriesSummarySchema = z.object({
  id: num,
  code: z.string(),
  title: z.string(),
  kind: z.enum(['series', 'workshop']),
  heldOn: nstr,
  cellCount: num,
  participantCount: num,
  dryMassG: nnum,
});

const materialLines = z.object({
  lines: z.array(
    z.object({
      kind: z.enum(['dyestuff', 'chemical']),
      refId: nnum,
      name: z.string(),
      grams: num,
      gramsWithAllowance: num,
    }),
  ),
  fibreG: num,
  bathL: num,
  bathLWithAllowance: num,
});

export const seriesDetailSchema = seriesSummarySchema.extend({
  pieceId: nnum,
  target: z.object({ paletteColourId: nnum, regionId: nnum, measurementId: nnum }),
  factors: z.array(
    z.object({
      name: z.string(),
      levels: z.array(z.string()),
      role: z.enum(['dyestuff', 'tannin', 'mordant', 'other']).optional(),
      refId: nnum.optional(),
      refName: nstr.optional(),
      mordants: z
        .array(
          z.object({ level: z.string(), chemicals: z.array(z.object({ refId: nnum, name: z.string(), owf: num })) }),
        )
        .optional(),
    }),
  ),
  participants: z.array(z.string()),
  deadVolumePct: num,
  liquorRatio: num,
  notes: nstr,
  ownerId: nnum,
  cells: z.array(
    z.object({
      key: z.string(),
      cell: cellSchema,
      kept: z.boolean(),
      recipe: z.array(
        z.object({
          operation: z.enum(OPERATIONS),
          ingredients: z.array(
            z.object({
              kind: z.enum(['dyestuff', 'chemical']),
              refId: num,
              name: z.string(),
              amount: num,
              basis: z.enum(BASES),
              grams: num,
            }),
          ),
        }),
      ),
    }),
  ),
  keptCount: num,
  /** Materials for the kept cells with the dead-volume allowance (shared/compute/series.ts); null without a dry mass. */
  materials: z
    .object({
      deadVolumePct: num,
      unresolved: z.array(z.string()),
      whole: materialLines,
      perParticipant: z.array(materialLines.extend({ code: z.string() })),
    })
    .nullable(),
  trials: z.array(
    z.object({ id: num, code: z.string(), status: z.enum(TRIAL_STATUSES), cell: cellSchema.nullable(), dryMassG: num }),
  ),
  abilities: z.record(z.string(), z.boolean()),
});

export const seriesListResponse = paged(seriesSummarySchema);
export const seriesPreviewAnswer = z.object({ count: num, cells: z.array(cellSchema) });
export const seriesTrialsAnswer = z.object({
  created: z.array(z.object({ id: num, code: z.string(), cell: cellSchema.nullable() })),
  series: seriesDetailSchema,
});
export type SeriesSummary = z.infer<typeof seriesSummarySchema>;
export type SeriesDetail = z.infer<typeof seriesDetailSchema>;
export type SeriesList = z.infer<typeof seriesListResponse>;
export type SeriesPreview = z.infer<typeof seriesPreviewAnswer>;
export type SeriesTrialsAnswer = z.infer<typeof seriesTrialsAnswer>;

// Named components of the OpenAPI document (server/openapi/document.ts).
z.globalRegistry.add(seriesSummarySchema, { id: 'SeriesSummary' });
z.globalRegistry.add(seriesDetailSchema, { id: 'SeriesDetail' });

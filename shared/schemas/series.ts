import { z } from 'zod';
import '../messages.ts';

/** A mordant level: which chemical, and how much of it in % owf. */
export const mordantLevelSchema = z.object({
  level: z.string().trim().min(1).max(40),
  chemicals: z.array(z.object({ refId: z.number().int().positive().nullable().default(null), name: z.string().min(1).max(160), owf: z.number().positive().max(200) })).min(1),
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
const oneTarget = (v: { targetPaletteColourId?: number | null; targetRegionId?: number | null; targetMeasurementId?: number | null }) =>
  [v.targetPaletteColourId, v.targetRegionId, v.targetMeasurementId].filter((x) => x != null).length <= 1;
const oneTargetIssue = { message: 'Choose one target: a palette colour, a region or a measurement.', path: ['target'] };

export const seriesCreateSchema = z.object({
  code: z.string().trim().min(2).max(20).regex(/^[A-Za-z0-9-]+$/, 'Letters, digits and dashes only'),
  title: z.string().trim().min(1, 'Give the series a title').max(200),
  kind: z.enum(['series', 'workshop']).default('series'),
  pieceId: z.number().int().positive().nullable().default(null),
  factors: z.array(factorSchema).min(1, 'Add at least one factor').max(6),
  participants: z.array(z.string().trim().min(1).max(20)).max(60).default([]),
  // Per cell, not the trial's dry fibre mass the shared label names.
  dryMassG: z.number({ error: 'Enter the dry mass per cell in g' }).positive('The dry mass per cell must be more than 0 g').max(10_000, 'The dry mass per cell must be 10,000 g or less'),
  liquorRatio: z.number().positive().max(200).default(30),
  deadVolumePct: z.number().min(0).max(100).default(10),
  heldOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/).nullable().default(null),
  notes: z.string().trim().max(4000).nullable().default(null),
  ...seriesTarget,
}).refine(oneTarget, oneTargetIssue);
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

export const seriesListQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(50),
});


import { z } from 'zod';
import '../messages.ts';
import { CHART_PATCHES, CORNER_NAMES, FIT_METHODS, isConvexQuad } from '../compute/chart.ts';

/**
 * A colour chart marked in a photo (PUT /api/photos/:id/chart) and what the app makes of it. Geometry, the
 * fit and the grade are in shared/compute/chart.ts; the photo's sampling in server/media/chart.ts.
 */

export const PALETTE_VARIANTS = ['raw', 'corrected', 'calibrated'] as const;
export type PaletteVariant = (typeof PALETTE_VARIANTS)[number];
/** Most trustworthy first: a chart correction, then a grey-patch correction, then the photo as taken. */
export const VARIANT_TRUST: readonly PaletteVariant[] = ['calibrated', 'corrected', 'raw'];
export const VARIANT_WORDS: Record<PaletteVariant, string> = {
  raw: 'raw (as photographed)',
  corrected: 'corrected to D65 from the grey reference patch',
  calibrated: 'calibrated from the colour chart',
};

const coordinate = (axis: 'x' | 'y') =>
  z
    .number({ error: `Enter the ${axis} position in pixels` })
    .finite(`Enter the ${axis} position in pixels`)
    .min(0, `The ${axis} position must be 0 px or more`);
export const pointSchema = z.object({ x: coordinate('x'), y: coordinate('y') }).strict();

const labValue = z
  .object({
    L: z.number({ error: 'Enter L* as a number' }).min(0, 'L* must be 0 or more').max(100, 'L* must be 100 or less'),
    a: z
      .number({ error: 'Enter a* as a number' })
      .min(-200, 'a* must be −200 or more')
      .max(200, 'a* must be 200 or less'),
    b: z
      .number({ error: 'Enter b* as a number' })
      .min(-200, 'b* must be −200 or more')
      .max(200, 'b* must be 200 or less'),
  })
  .strict();

export const chartReferenceSchema = z.union(
  [
    z.literal('published-1976'),
    z
      .object({
        measured: z
          .array(labValue, { error: 'Give the 24 measured L*a*b* values' })
          .length(CHART_PATCHES, `Give exactly ${CHART_PATCHES} measured values, patch 1 to patch 24`),
      })
      .strict(),
  ],
  { error: 'Choose the published 1976 values or give your 24 measured values' },
);

export const chartInputSchema = z
  .object({
    corners: z
      .array(pointSchema, { error: 'Mark the four corner patches' })
      .length(4, 'Mark exactly four corner patches: 1, 6, 24 and 19'),
    reference: chartReferenceSchema,
  })
  .strict()
  .superRefine((v, ctx) => {
    if (v.corners.length === 4 && !isConvexQuad(v.corners))
      ctx.addIssue({
        code: 'custom',
        path: ['corners'],
        message: `The corners must go round the chart in order (${CORNER_NAMES.join(', ')}) and make a convex shape`,
      });
  });
export type ChartInput = z.infer<typeof chartInputSchema>;

/** Corners that fall outside a photo of this size, keyed like the form's fields (corners.2.x). */
export function cornerIssues(
  corners: ReadonlyArray<{ x: number; y: number }>,
  size: { width: number; height: number },
) {
  const fields: Record<string, string[]> = {};
  corners.forEach((p, i) => {
    if (p.x >= size.width) fields[`corners.${i}.x`] = [`Outside the photo (${size.width} px wide)`];
    if (p.y >= size.height) fields[`corners.${i}.y`] = [`Outside the photo (${size.height} px high)`];
  });
  return fields;
}

// ---- the stored and answered result ----

const lab = z.object({ L: z.number(), a: z.number(), b: z.number() });
const point = z.object({ x: z.number(), y: z.number() });
const row3 = z.tuple([z.number(), z.number(), z.number()]);

export const toleranceLevelSchema = z
  .object({
    name: z.string({ error: 'Name the level' }).trim().min(1, 'Name the level').max(40, 'Use at most 40 characters'),
    meanDeltaE00: z.number({ error: 'Enter the mean ΔE00 as a number' }).positive('The mean ΔE00 must be more than 0'),
    maxDeltaE00: z
      .number({ error: 'Enter the maximum ΔE00 as a number' })
      .positive('The maximum ΔE00 must be more than 0')
      .nullable()
      .optional(),
  })
  .strict();
export const toleranceLevelsInput = z
  .object({
    levels: z.array(toleranceLevelSchema).min(1, 'Give at least one level').max(8, 'Give at most 8 levels'),
    source: z
      .string({ error: 'Name the source of the levels' })
      .trim()
      .min(3, 'Name the source of the levels')
      .max(255, 'Use at most 255 characters'),
  })
  .strict();
export type ToleranceLevelsInput = z.infer<typeof toleranceLevelsInput>;
export const toleranceLevelsAnswer = z.object({
  levels: z.array(
    z.object({ name: z.string(), meanDeltaE00: z.number(), maxDeltaE00: z.number().nullable().optional() }),
  ),
  source: z.string(),
});

export const chartPatchSchema = z.object({
  patch: z.number(),
  name: z.string(),
  centre: point,
  /** Half the side of the sampled square, full-size pixels. */
  half: z.number(),
  measured: lab,
  corrected: lab,
  reference: lab,
  deltaE00Before: z.number(),
  deltaE00After: z.number(),
});

export const photoChartSchema = z.object({
  corners: z.array(point),
  reference: z.enum(['published-1976', 'measured']),
  referenceSource: z.string(),
  method: z.enum(FIT_METHODS),
  /** The correction: linear-light sRGB, corrected = matrix · measured. */
  matrix: z.tuple([row3, row3, row3]),
  /** The chart's area (full-size pixels), left out of every palette. */
  excluded: z.object({ x: z.number(), y: z.number(), w: z.number(), h: z.number() }),
  patches: z.array(chartPatchSchema),
  before: z.object({ mean: z.number(), max: z.number() }),
  after: z.object({ mean: z.number(), max: z.number() }),
  /** The best tolerance level met as photographed and after calibration (null: none met). */
  grade: z.object({ before: z.string().nullable(), after: z.string().nullable() }),
  tolerances: toleranceLevelsAnswer,
});
export type PhotoChart = z.infer<typeof photoChartSchema>;

import { z } from 'zod';
import '../messages.ts';
import { GREY_GRADES } from '../compute/fastness.ts';
import { id, idParams } from './common.ts';
import { PALETTE_VARIANTS } from './chart.ts';

/** One side of a fading pair: a region of one of the piece's photos, or a reading of the piece. */
const sideSchema = z.union(
  [
    z.object({ regionId: z.number({ error: 'Choose a region' }).int().positive('Choose a region') }).strict(),
    z.object({ measurementId: z.number({ error: 'Choose a reading' }).int().positive('Choose a reading') }).strict(),
  ],
  { error: 'Choose a region of a photo or a reading' },
);

export const fadingPairCreateSchema = z
  .object({
    label: z.string().trim().max(160, 'Use at most 160 characters').nullable().optional(),
    faded: sideSchema,
    protected: sideSchema,
  })
  .strict()
  .superRefine((v, ctx) => {
    const same =
      ('regionId' in v.faded && 'regionId' in v.protected && v.faded.regionId === v.protected.regionId) ||
      ('measurementId' in v.faded &&
        'measurementId' in v.protected &&
        v.faded.measurementId === v.protected.measurementId);
    if (same)
      ctx.addIssue({ code: 'custom', path: ['protected'], message: 'Choose a different area from the faded one' });
  });
export type FadingPairCreateInput = z.infer<typeof fadingPairCreateSchema>;
export const fadingPairParams = idParams.extend({ pairId: id });

const lab = z.object({ L: z.number(), a: z.number(), b: z.number() });
export const fadingSideSchema = z.object({
  kind: z.enum(['region', 'reading']),
  id: z.number(),
  /** Words for the side: the region's label or purpose and photo, the reading's label. */
  label: z.string(),
  /** null when the region has no palette yet. */
  lab: lab.nullable(),
  /** For a region: the palette variant its colour comes from (the most trustworthy one). */
  variant: z.enum(PALETTE_VARIANTS).nullable(),
  illuminant: z.string(),
  observer: z.string(),
});

export const fadingPairSchema = z.object({
  id: z.number(),
  pieceId: z.number(),
  label: z.string().nullable(),
  faded: fadingSideSchema,
  protected: fadingSideSchema,
  /** Protected (as made) is the standard, faded (as seen) the sample; null when a side has no colour or the conditions differ. */
  difference: z
    .object({
      deltaE00: z.number(),
      components: z.object({ dL: z.number(), dC: z.number(), dH: z.number(), dh: z.number() }),
      a05: z.object({ grade: z.number(), step: z.enum(GREY_GRADES) }).nullable(),
    })
    .nullable(),
  note: z.string().nullable(),
});
export type FadingPairOut = z.infer<typeof fadingPairSchema>;
/** The pairs, and what a new pair's sides may be: the regions of the piece's photos and the piece's readings. */
export const fadingPairListResponse = z.object({
  items: z.array(fadingPairSchema),
  candidates: z.object({
    regions: z.array(z.object({ id: z.number(), label: z.string() })),
    readings: z.array(z.object({ id: z.number(), label: z.string() })),
  }),
});
export type FadingPairList = z.infer<typeof fadingPairListResponse>;
export const fadingPairResponse = z.object({ pair: fadingPairSchema });

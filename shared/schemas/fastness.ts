import { z } from 'zod';
import '../messages.ts';
import { BLUE_WOOL_GRADES, GREY_GRADES } from '../compute/fastness.ts';

export const greyGrade = z.enum(GREY_GRADES, { error: 'Choose a grey-scale grade from 1 to 5 (half grades as 4-5)' });
export const blueWoolGrade = z.enum(BLUE_WOOL_GRADES, { error: 'Choose a blue wool grade from 1 to 8' });

/** A colour reading of a fastness specimen (CIELAB, D65/10° as ISO 105-A04/A05 ask). */
const readingLab = z.object({
  L: z.number({ error: 'Enter L* as a number from 0 to 100' }).min(0, 'L* is 0–100').max(100, 'L* is 0–100'),
  a: z
    .number({ error: 'Enter a* as a number from −200 to 200' })
    .min(-200, 'a* is −200 to 200')
    .max(200, 'a* is −200 to 200'),
  b: z
    .number({ error: 'Enter b* as a number from −200 to 200' })
    .min(-200, 'b* is −200 to 200')
    .max(200, 'b* is −200 to 200'),
});
/** Before and after: the specimen before and after the test (change), or the adjacent or rubbing cloth unstained and stained (staining). */
export const readingPair = z.object({ before: readingLab, after: readingLab });
export type ReadingPair = z.infer<typeof readingPair>;

const common = {
  /** Done without the standard's apparatus or conditions (e.g. a sunny window, hand washing). */
  informal: z.boolean().default(false),
  testedOn: z.iso.date().nullish(),
  notes: z.string().trim().max(1000).nullish(),
};

/** Light fastness, ISO 105-B02: blue wool references 1–8. */
export const lightFastness = z.object({ blueWool: blueWoolGrade, ...common });
/** Washing, ISO 105-C06: change in colour (ISO 105-A02) and staining of the adjacent fabric (ISO 105-A03). */
export const washFastness = z
  .object({
    change: greyGrade.nullish(),
    staining: greyGrade.nullish(),
    /** Instrument readings from which the grades are computed (shared/compute/grey-scale.ts), shown beside the assessor's. */
    readings: z.object({ change: readingPair.nullish(), staining: readingPair.nullish() }).nullish(),
    ...common,
  })
  .refine((v) => v.change != null || v.staining != null || v.readings?.change != null || v.readings?.staining != null, {
    message: 'Give the change in colour, the staining, or both',
    path: ['change'],
  });
/** Rubbing, ISO 105-X12: staining of the rubbing cloth (ISO 105-A03). */
export const rubFastness = z.object({
  staining: greyGrade,
  readings: z.object({ staining: readingPair.nullish() }).nullish(),
  ...common,
});

export const fastnessSchema = z.object({
  light: lightFastness.nullish(),
  washing: washFastness.nullish(),
  rubbingDry: rubFastness.nullish(),
  rubbingWet: rubFastness.nullish(),
});
export type Fastness = z.infer<typeof fastnessSchema>;
export type LightFastness = z.infer<typeof lightFastness>;
export type WashFastness = z.infer<typeof washFastness>;
export type RubFastness = z.infer<typeof rubFastness>;

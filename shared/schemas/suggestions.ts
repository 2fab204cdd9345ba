import { z } from 'zod';
import '../messages.ts';
import { ILLUMINANTS, OBSERVERS } from '../colour/conditions.ts';
import { BASES, OPERATIONS, stepsSchema } from './trial.ts';

// Recipe suggestions for a target colour (server/services/suggestions/): from the studio's finished trials nearest
// in colour, and from ladders (trials differing only in the strength of one ingredient) interpolated in strength.

const optionalId = z.coerce.number().int().positive('Give a numeric id').optional();
const coord = (label: string, min: number, max: number) =>
  z.coerce
    .number({ error: `Enter ${label} as a number from ${min} to ${max}` })
    .min(min, `${label} is ${min} to ${max}`)
    .max(max, `${label} is ${min} to ${max}`)
    .optional();

const dryMassG = z.coerce
  .number({ error: 'Enter the dry fibre mass in g' })
  .positive('The dry fibre mass must be more than 0 g')
  .max(100_000, 'A dry fibre mass above 100 kg (100,000 g) is not a trial');
/** The suggestions page's own small form: the dry fibre mass the recipes are scaled to. */
export const suggestionScaleSchema = z.object({ dryMassG });

export const recipeSuggestionQuery = z
  .object({
    L: coord('L*', 0, 100),
    a: coord('a*', -200, 200),
    b: coord('b*', -200, 200),
    /** The conditions a typed colour was measured under (default D65/10°). */
    illuminant: z.enum(ILLUMINANTS).optional(),
    observer: z.enum(OBSERVERS).optional(),
    paletteColourId: optionalId,
    regionId: optionalId,
    measurementId: optionalId,
    /** The dry fibre mass the recipe is scaled to, in g. */
    dryMassG: dryMassG.default(10),
    limit: z.coerce.number().int().min(1).max(20).default(5),
  })
  .superRefine((q, ctx) => {
    const typed = [q.L, q.a, q.b].filter((x) => x != null).length;
    const ids = [q.paletteColourId, q.regionId, q.measurementId].filter((x) => x != null).length;
    if (typed + ids === 0)
      ctx.addIssue({
        code: 'custom',
        path: ['target'],
        message: 'Give a colour: L*, a* and b*, or a palette colour, a region or a reading.',
      });
    else if (typed && typed < 3)
      for (const k of ['L', 'a', 'b'] as const)
        if (q[k] == null) ctx.addIssue({ code: 'custom', path: [k], message: `Enter ${k}* as well` });
    if ((typed ? 1 : 0) + ids > 1) ctx.addIssue({ code: 'custom', path: ['target'], message: 'Give one colour only.' });
  });
export type RecipeSuggestionQuery = z.input<typeof recipeSuggestionQuery>;

const labOut = z.object({ L: z.number(), a: z.number(), b: z.number() });

export const suggestedIngredientSchema = z.object({
  kind: z.enum(['dyestuff', 'chemical']),
  refId: z.number(),
  name: z.string(),
  amount: z.number(),
  basis: z.enum(BASES),
  /** Weighed out for the chosen dry mass (% owf, or g/L × the bath's volume); null when the volume is unknown. */
  grams: z.number().nullable(),
  /** The ingredient whose strength the ladder varies, set here by interpolation. */
  interpolated: z.boolean(),
});
export const suggestedStepSchema = z.object({
  operation: z.enum(OPERATIONS),
  ingredients: z.array(suggestedIngredientSchema),
  liquorRatio: z.number().nullable(),
  temperatureC: z.number().nullable(),
  minutes: z.number().nullable(),
  ph: z.number().nullable(),
  notes: z.string().nullable(),
  /** Active baths holding one of the step's chemicals, to draw from instead of making the bath up. */
  baths: z.array(z.object({ id: z.number(), code: z.string(), name: z.string() })),
});

export const recipeSuggestionSchema = z.object({
  /** The finished trials the suggestion rests on. */
  basis: z.array(z.object({ id: z.number(), code: z.string(), strength: z.number().nullable() })),
  source: z.enum(['nearest-trial', 'ladder']),
  recipe: z.object({ dryMassG: z.number(), steps: z.array(suggestedStepSchema) }),
  predicted: z.object({
    lab: labOut,
    /** ΔE00 between the predicted colour and the target, under the target's conditions. */
    deltaE00: z.number(),
    method: z.enum(['as-dyed', 'kubelka-munk', 'lab-path']),
    extrapolated: z.boolean(),
  }),
  /** The error to expect, ΔE00: leave-one-out on the ladder's own rungs, or the trial's own result for a repeat. */
  expectedError: z.object({ deltaE00: z.number().nullable(), basis: z.string() }),
  confidence: z.enum(['high', 'medium', 'low']),
  explanation: z.string(),
});
export type RecipeSuggestion = z.infer<typeof recipeSuggestionSchema>;

export const recipeSuggestionsResponse = z.object({
  target: labOut.extend({
    illuminant: z.string(),
    observer: z.string(),
    source: z.enum(['instrument', 'image-estimate']),
    label: z.string(),
  }),
  items: z.array(recipeSuggestionSchema),
  /** How many finished trials were weighed, and how many ladders they form. */
  considered: z.object({ trials: z.number(), ladders: z.number() }),
});
export type RecipeSuggestionsResponse = z.infer<typeof recipeSuggestionsResponse>;

/**
 * "Try this": a planned trial with a suggested recipe, its target and a note of the evidence, made in one go. The
 * recipe is sent as the trial's steps (the dyer may have changed an amount); the server checks them as any recipe.
 */
export const suggestionTrialSchema = z
  .object({
    pieceId: z.number().int().positive().nullable().optional(),
    targetPaletteColourId: z.number().int().positive().nullable().optional(),
    targetRegionId: z.number().int().positive().nullable().optional(),
    targetMeasurementId: z.number().int().positive().nullable().optional(),
    dryMassG: z
      .number({ error: 'Enter the dry fibre mass in g' })
      .positive('The dry fibre mass must be more than 0 g')
      .max(100_000, 'A dry fibre mass above 100 kg (100,000 g) is not a trial'),
    fibre: z.string().trim().max(80).nullable().optional(),
    steps: stepsSchema.shape.steps.min(1, 'A suggestion has at least one step'),
    /** What the suggestion rests on, in words: kept as the trial's notes. */
    evidence: z.string().trim().min(1, 'Say what the suggestion rests on').max(2000),
  })
  .refine(
    (v) => [v.targetPaletteColourId, v.targetRegionId, v.targetMeasurementId].filter((x) => x != null).length <= 1,
    { message: 'Choose one target: a palette colour, a region or a measurement.', path: ['target'] },
  );
export type SuggestionTrialInput = z.input<typeof suggestionTrialSchema>;

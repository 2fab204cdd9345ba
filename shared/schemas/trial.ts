import { z } from 'zod';
import '../messages.ts';
import { fastnessSchema } from './fastness.ts';
import { DRY_MASS_BASES } from '../compute/moisture.ts';

// Shared by the server's validation and the client's forms; types come from z.infer.

export const TRIAL_STATUSES = ['planned', 'in-progress', 'finished', 'abandoned'] as const;
export const TRIAL_KINDS = ['modern', 'historical'] as const;
export const OPERATIONS = ['scour', 'tannin', 'mordant-bath', 'print-paste', 'dye-bath', 'vat', 'overdye', 'after-treatment', 'rinse'] as const;
export const BASES = ['owf', 'g/L', 'g'] as const;
export const REASONS = ['toxicity', 'regulation', 'availability', 'waste'] as const;
export const GEOMETRIES = ['d:8°', '45°a:0°'] as const;
export const ILLUMINANTS = ['D65', 'D50', 'A', 'F2', 'F11'] as const;
export const OBSERVERS = ['2', '10'] as const;

export const operationLabels: Record<(typeof OPERATIONS)[number], string> = {
  scour: 'Scour',
  tannin: 'Tannin',
  'mordant-bath': 'Mordant bath',
  'print-paste': 'Print paste',
  'dye-bath': 'Dye bath',
  vat: 'Vat',
  overdye: 'Overdye',
  'after-treatment': 'After-treatment',
  rinse: 'Rinse',
};
export { DRY_MASS_BASES };
export const dryMassBasisLabels: Record<(typeof DRY_MASS_BASES)[number], string> = { 'air-dry': 'air-dry (conditioned)', 'oven-dry': 'oven-dry' };
export const basisLabels: Record<(typeof BASES)[number], string> = { owf: '% owf', 'g/L': 'g/L', g: 'g' };

const id = z.coerce.number().int().positive();
const optionalId = id.nullable().optional();
const text = (max: number) => z.string().trim().max(max).nullable().optional();
// A number the field's label names when it is missing or not a number (shared/messages.ts); `what` starts the sentence.
const positive = (what: string) => z.number().positive(`${what} must be more than 0`);

export const labSchema = z.object({
  L: z.number({ error: 'Enter L* as a number from 0 to 100' }).min(0, 'L* is 0–100').max(100, 'L* is 0–100'),
  a: z.number({ error: 'Enter a* as a number from −200 to 200' }).min(-200, 'a* is −200 to 200').max(200, 'a* is −200 to 200'),
  b: z.number({ error: 'Enter b* as a number from −200 to 200' }).min(-200, 'b* is −200 to 200').max(200, 'b* is −200 to 200'),
});
export type LabInput = z.infer<typeof labSchema>;

/** A colour to compare, optionally with the conditions it was measured under (unstated: the caller vouches they match). */
export const conditionedLabSchema = labSchema.extend({ illuminant: z.enum(ILLUMINANTS).optional(), observer: z.enum(OBSERVERS).optional() });
export const colourDifferenceSchema = z.object({ reference: conditionedLabSchema, sample: conditionedLabSchema });

export { fastnessSchema };

const targetFields = {
  targetPaletteColourId: optionalId,
  targetRegionId: optionalId,
  targetMeasurementId: optionalId,
};
const oneTarget = (v: { targetPaletteColourId?: number | null; targetRegionId?: number | null; targetMeasurementId?: number | null }) =>
  [v.targetPaletteColourId, v.targetRegionId, v.targetMeasurementId].filter((x) => x != null).length <= 1;
const oneTargetIssue = { message: 'Choose one target: a palette colour, a region or a measurement.', path: ['target'] };

const trialFields = {
  status: z.enum(TRIAL_STATUSES).default('planned'),
  fibre: text(80),
  weave: text(80),
  gsm: positive('The fabric weight').max(2000, 'The fabric weight must be 2,000 g/m² or less').nullable().optional(),
  dryMassG: positive('The dry fibre mass').max(100_000, 'A dry fibre mass above 100 kg (100,000 g) is not a trial'),
  /** How the dry mass was weighed: air-dry (commercial) or oven-dry; the recipe works on the air-dry mass. */
  dryMassBasis: z.enum(DRY_MASS_BASES, { error: 'Choose air-dry or oven-dry' }).default('air-dry'),
  notes: text(5000),
  startedOn: z.iso.date({ error: 'Enter a date such as 2024-03-12' }).nullable().optional(),
  fastness: fastnessSchema.nullable().optional(),
  ...targetFields,
};

export const trialCreateSchema = z
  .object({ pieceId: optionalId, kind: z.enum(TRIAL_KINDS).default('modern'), ...trialFields })
  .refine(oneTarget, oneTargetIssue);
export type TrialCreateInput = z.input<typeof trialCreateSchema>;

/** The kind is fixed at creation: a historical record never turns into a modern recipe. */
export const trialUpdateSchema = z
  .object({ pieceId: optionalId, ...trialFields, status: z.enum(TRIAL_STATUSES).optional(), dryMassG: trialFields.dryMassG.optional(), dryMassBasis: z.enum(DRY_MASS_BASES, { error: 'Choose air-dry or oven-dry' }).optional() })
  .partial()
  .refine(oneTarget, oneTargetIssue);
export type TrialUpdateInput = z.input<typeof trialUpdateSchema>;

export const trialListQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  status: z.enum(TRIAL_STATUSES).optional(),
  kind: z.enum(TRIAL_KINDS).optional(),
  pieceId: id.optional(),
  dyerId: id.optional(),
  mine: z.enum(['1', '0']).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(25),
});
export type TrialListQuery = z.input<typeof trialListQuerySchema>;

export const ingredientSchema = z.object({
  kind: z.enum(['dyestuff', 'chemical']),
  refId: id,
  amount: positive('The amount'),
  basis: z.enum(BASES),
});
export type IngredientInput = z.infer<typeof ingredientSchema>;

/** Print paste make-up: final volume, and the stock solution the mordant is drawn from. */
export const pasteSchema = z.object({
  volumeMl: positive('The paste volume'),
  stockGPerL: positive('The stock strength').nullable().optional(),
});

export const stepSchema = z.object({
  /** The stored step this one continues (sent back by the editor), so its bath draw is edited rather than drawn again. */
  id: optionalId,
  operation: z.enum(OPERATIONS),
  ingredients: z.array(ingredientSchema).max(20).default([]),
  liquorRatio: positive('The liquor ratio').max(500).nullable().optional(),
  temperatureC: z.number().min(0).max(130, '°C above 130 is not a dye bath').nullable().optional(),
  minutes: z.number().min(0).max(100_000).nullable().optional(),
  ph: z.number().min(0, 'pH is 0–14').max(14, 'pH is 0–14').nullable().optional(),
  paste: pasteSchema.nullable().optional(),
  batchId: optionalId,
  batchVolumeMl: positive('The volume drawn').nullable().optional(),
  notes: text(2000),
  /** A historical-only chemical in a modern trial is used only when confirmed, with the reason (the server checks). */
  historicalUseConfirmed: z.boolean({ error: 'Tick the box or leave it empty' }).optional(),
  historicalUseReason: text(2000),
}).superRefine((s, ctx) => {
  // A draw is a bath and a volume together: one without the other would be saved as half a record.
  if (s.batchId != null && s.batchVolumeMl == null) ctx.addIssue({ code: 'custom', path: ['batchVolumeMl'], message: 'Enter the volume drawn from the bath, in mL' });
  if (s.batchId == null && s.batchVolumeMl != null) ctx.addIssue({ code: 'custom', path: ['batchId'], message: 'Choose the bath this volume is drawn from' });
});
export type StepInput = z.input<typeof stepSchema>;

export const stepsSchema = z.object({ steps: z.array(stepSchema).max(40) });
export type StepsInput = z.input<typeof stepsSchema>;

const substitutionFields = z.object({
  stepId: optionalId,
  historicalChemicalId: optionalId,
  historicalPractice: text(255),
  historicalAmountG: positive('The historical amount').nullable().optional(),
  modernChemicalId: optionalId,
  modernPractice: text(255),
  modernAmountG: z.number().min(0, 'Amount cannot be negative').nullable().optional(),
  reason: z.enum(REASONS),
  notes: text(2000),
});
export const substitutionSchema = substitutionFields
  .refine((v) => v.historicalChemicalId != null || Boolean(v.historicalPractice), { message: 'Name the historical chemical or practice.', path: ['historicalChemicalId'] })
  .refine((v) => v.modernChemicalId != null || Boolean(v.modernPractice), { message: 'Name the modern chemical or practice.', path: ['modernChemicalId'] });
export type SubstitutionInput = z.input<typeof substitutionSchema>;

export const measurementSchema = labSchema.extend({
  illuminant: z.enum(ILLUMINANTS).default('D65'),
  observer: z.enum(OBSERVERS).default('10'),
  geometry: z.enum(GEOMETRIES).nullable().optional(),
  specular: z.enum(['SCI', 'SCE']).nullable().optional(),
  instrument: text(120),
  label: text(160),
  takenOn: z.iso.date({ error: 'Enter a date such as 2024-03-12' }).nullable().optional(),
});
export type MeasurementInput = z.input<typeof measurementSchema>;

export const idParams = z.object({ id });
export const childParams = z.object({ id, childId: id });

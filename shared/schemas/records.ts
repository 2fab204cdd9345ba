import { z } from 'zod';
import '../messages.ts';
import { LIGHT_CATEGORIES } from '../data/light-sensitivity.ts';

// The records behind a piece's claims: analyses (with their findings and report), condition reports and
// display periods with the light dose they add up to. Served by server/routes/records/.

export const ANALYSIS_METHODS = [
  'HPLC-DAD',
  'LC-MS',
  'XRF',
  'FORS',
  'Raman',
  'FTIR',
  'optical microscopy',
  'SEM-EDS',
  'other',
] as const;
export const CONFIDENCES = ['confirmed', 'probable', 'possible', 'not-found'] as const;
export const CONFIDENCE_WORDS: Record<(typeof CONFIDENCES)[number], string> = {
  confirmed: 'confirmed',
  probable: 'probable',
  possible: 'possible',
  'not-found': 'not found',
};
export const REPORT_FIELD = 'report';
/** A lab report PDF may be up to 40 MB. */
export const MAX_REPORT_BYTES = 40 * 1024 * 1024;

const isoDate = z.iso.date({ error: 'Use a date such as 2024-03-04' });
const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters`);
const optionalText = (max: number) =>
  z
    .union([text(max), z.null()])
    .optional()
    .transform((v) => (v === '' || v === undefined ? null : v));

export const findingSchema = z.object({
  substance: text(80).min(1, 'Enter a colorant or element'),
  confidence: z.enum(CONFIDENCES, { error: 'Choose confirmed, probable, possible or not found' }),
});
export type FindingInput = z.infer<typeof findingSchema>;

const analysisFields = {
  method: z.enum(ANALYSIS_METHODS, { error: 'Choose a method' }),
  regionId: z.number().int().positive().nullable().optional(),
  site: optionalText(500),
  laboratory: optionalText(160),
  analyst: optionalText(160),
  analysedOn: isoDate,
  notes: optionalText(10_000),
  findings: z
    .array(findingSchema)
    .max(60, 'Record at most 60 findings')
    .refine((a) => new Set(a.map((f) => f.substance.toLowerCase())).size === a.length, 'Each substance only once')
    .default([]),
};
export const analysisCreateSchema = z
  .object({
    ...analysisFields,
    /** Names of the piece's dyestuffs and mordants this analysis identifies: they become "identified" and point at it. */
    identifies: z.array(text(120).min(1)).max(40).default([]),
  })
  .strict()
  .refine((a) => a.regionId != null || !!a.site, {
    path: ['site'],
    message: 'Describe the sample or site, or choose a region of a photo',
  });
export const analysisUpdateSchema = z.object(analysisFields).partial().strict();
export type AnalysisCreateInput = z.infer<typeof analysisCreateSchema>;
export type AnalysisUpdateInput = z.infer<typeof analysisUpdateSchema>;

export const analysisSchema = z.object({
  id: z.number(),
  pieceId: z.number(),
  method: z.enum(ANALYSIS_METHODS),
  regionId: z.number().nullable(),
  site: z.string().nullable(),
  laboratory: z.string().nullable(),
  analyst: z.string().nullable(),
  analysedOn: z.string(),
  notes: z.string().nullable(),
  findings: z.array(z.object({ substance: z.string(), confidence: z.enum(CONFIDENCES) })),
  /** Dyestuffs and mordant metals the findings point to (marker compounds, shared/data/marker-compounds.ts). */
  suggests: z.array(
    z.object({
      name: z.string(),
      kind: z.enum(['dyestuff', 'mordant']),
      markers: z.array(z.string()),
      confidence: z.enum(['confirmed', 'probable']),
    }),
  ),
  report: z
    .object({ sha256: z.string(), bytes: z.number(), name: z.string().nullable(), url: z.string().nullable() })
    .nullable(),
  createdAt: z.iso.datetime(),
  abilities: z.object({ 'analysis:update': z.boolean() }),
});
export type AnalysisOut = z.infer<typeof analysisSchema>;
export const analysisResponse = z.object({ analysis: analysisSchema });
export const analysisListResponse = z.object({
  items: z.array(analysisSchema),
  canCreate: z.boolean(),
});
export type AnalysisListResponse = z.infer<typeof analysisListResponse>;

// ---- condition reports ----

export const conditionCreateSchema = z
  .object({
    assessedOn: isoDate,
    assessor: text(160).min(1, 'Enter who assessed the piece'),
    state: text(120).min(1, 'Enter the overall state, e.g. stable'),
    notes: optionalText(10_000),
    photoIds: z.array(z.number().int().positive()).max(20).default([]),
    regionIds: z.array(z.number().int().positive()).max(40).default([]),
  })
  .strict();
export type ConditionCreateInput = z.infer<typeof conditionCreateSchema>;
export const conditionReportSchema = z.object({
  id: z.number(),
  pieceId: z.number(),
  assessedOn: z.string(),
  assessor: z.string(),
  state: z.string(),
  notes: z.string().nullable(),
  photoIds: z.array(z.number()),
  regionIds: z.array(z.number()),
  createdAt: z.iso.datetime(),
});
export type ConditionReportOut = z.infer<typeof conditionReportSchema>;
export const conditionReportResponse = z.object({ report: conditionReportSchema });
export const conditionListResponse = z.object({ items: z.array(conditionReportSchema), canCreate: z.boolean() });
export type ConditionListResponse = z.infer<typeof conditionListResponse>;

// ---- light exposure ----

export const displayFields = z
  .object({
    from: isoDate,
    to: isoDate,
    lux: z
      .number({ error: 'Enter the illuminance in lux' })
      .positive('The illuminance must be more than 0 lux')
      .max(100_000, 'The illuminance must be at most 100 000 lux'),
    hoursPerDay: z
      .number({ error: 'Enter the hours lit a day' })
      .positive('The hours lit must be more than 0')
      .max(24, 'A day has at most 24 hours'),
    uvMicrowattsPerLumen: z
      .number({ error: 'Enter the UV in µW/lm' })
      .min(0, 'The UV must be 0 µW/lm or more')
      .max(10_000, 'The UV must be at most 10 000 µW/lm')
      .nullable()
      .optional(),
    place: optionalText(160),
  })
  .strict();
const displayRules = <T extends z.ZodType<{ from: string; to: string }>>(s: T) =>
  s.refine((p) => p.to >= p.from, { path: ['to'], message: 'The display ends before it starts' });
export const displayCheckSchema = displayRules(displayFields);
/** `confirm: true` records a period that takes the piece over its annual allowance (after the warning). */
export const displayCreateSchema = displayRules(displayFields.extend({ confirm: z.boolean().optional() }));
export type DisplayCreateInput = z.infer<typeof displayCreateSchema>;

export const displayPeriodSchema = z.object({
  id: z.number(),
  pieceId: z.number(),
  from: z.string(),
  to: z.string(),
  lux: z.number(),
  hoursPerDay: z.number(),
  uvMicrowattsPerLumen: z.number().nullable(),
  place: z.string().nullable(),
  days: z.number(),
  luxHours: z.number(),
  uvAboveGuide: z.boolean(),
});
export type DisplayPeriodOut = z.infer<typeof displayPeriodSchema>;

export const lightDoseSchema = z.object({
  luxHours: z.number(),
  daysOnDisplay: z.number(),
  category: z.enum(LIGHT_CATEGORIES),
  categoryLabel: z.string(),
  categoryFrom: z.array(z.string()),
  annualLimitLuxHours: z.number().nullable(),
  byYear: z.array(z.object({ year: z.number(), luxHours: z.number(), days: z.number() })),
  thisYear: z.object({ year: z.number(), luxHours: z.number(), usedFraction: z.number().nullable() }),
  totalAllowanceLuxHours: z.number().nullable(),
  totalUsedFraction: z.number().nullable(),
  source: z.string(),
});
export type LightDoseOut = z.infer<typeof lightDoseSchema>;
export const excessSchema = z.object({ year: z.number(), luxHours: z.number(), limitLuxHours: z.number() });
export const displayListResponse = z.object({
  items: z.array(displayPeriodSchema),
  lightDose: lightDoseSchema,
  canCreate: z.boolean(),
});
export type DisplayListResponse = z.infer<typeof displayListResponse>;
export const displayCheckResponse = z.object({
  exceeds: z.array(excessSchema),
  lightDose: lightDoseSchema,
  message: z.string().nullable(),
});
export type DisplayCheckResponse = z.infer<typeof displayCheckResponse>;
export const displayCreateResponse = z.object({ display: displayPeriodSchema, lightDose: lightDoseSchema });

import { z } from 'zod';
import '../messages.ts';
import { photoIngestSchema } from './ingest.ts';
import { fastnessSchema } from './fastness.ts';
import { GREY_GRADES } from '../compute/fastness.ts';
import { DRY_MASS_BASES } from '../compute/moisture.ts';
import { LOAD_METALS } from '../compute/chemistry.ts';
import { pageQuery, paged } from './common.ts';
import { PHOTO_VIEWS } from './photo.ts';
import { PALETTE_VARIANTS } from './chart.ts';
import { chemicalSchema } from './reference.ts';
import { ILLUMINANTS, OBSERVERS } from '../colour/conditions.ts';
import { metamerismAnswer, spectrumSchema } from './spectral.ts';

// Shared by the server's validation and the client's forms; types come from z.infer.

export const TRIAL_STATUSES = ['planned', 'in-progress', 'finished', 'abandoned'] as const;
export const TRIAL_KINDS = ['modern', 'historical'] as const;
/** Which state of the piece a trial aims at (a fading pair's sides): as made (protected area) or as seen (faded). */
export const TARGET_AIMS = ['as-made', 'as-seen'] as const;
export type TargetAim = (typeof TARGET_AIMS)[number];
export const TARGET_AIM_WORDS: Record<TargetAim, string> = {
  'as-made': 'the piece as made (the protected area)',
  'as-seen': 'the piece as seen (the faded area)',
};
export const OPERATIONS = [
  'scour',
  'tannin',
  'mordant-bath',
  'print-paste',
  'dye-bath',
  'vat',
  'overdye',
  'after-treatment',
  'rinse',
] as const;
export const BASES = ['owf', 'g/L', 'g'] as const;
export const REASONS = ['toxicity', 'regulation', 'availability', 'waste'] as const;
export const GEOMETRIES = ['d:8°', '45°a:0°'] as const;
export { ILLUMINANTS, OBSERVERS };

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
export const dryMassBasisLabels: Record<(typeof DRY_MASS_BASES)[number], string> = {
  'air-dry': 'air-dry (conditioned)',
  'oven-dry': 'oven-dry',
};
export const basisLabels: Record<(typeof BASES)[number], string> = { owf: '% owf', 'g/L': 'g/L', g: 'g' };

const id = z.coerce.number().int().positive();
const optionalId = id.nullable().optional();
const text = (max: number) => z.string().trim().max(max).nullable().optional();
// A number the field's label names when it is missing or not a number (shared/messages.ts); `what` starts the sentence.
const positive = (what: string) => z.number().positive(`${what} must be more than 0`);

export const labSchema = z.object({
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
export type LabInput = z.infer<typeof labSchema>;

/** A colour to compare, optionally with the conditions it was measured under (unstated: the caller vouches they match). */
export const conditionedLabSchema = labSchema.extend({
  illuminant: z.enum(ILLUMINANTS).optional(),
  observer: z.enum(OBSERVERS).optional(),
});
export const colourDifferenceSchema = z.object({ reference: conditionedLabSchema, sample: conditionedLabSchema });

/** Instrumental grey-scale grades (shared/compute/grey-scale.ts): the reference is the original or the undyed fabric. */
export const greyScaleRequest = z.object({ reference: labSchema, sample: labSchema });
const gradeResult = z.object({ grade: z.number(), step: z.enum(GREY_GRADES), difference: z.number() });
export const greyScaleAnswer = z.object({
  change: gradeResult,
  staining: gradeResult,
  sources: z.object({ change: z.string(), staining: z.string() }),
});
export type GreyScaleAnswer = z.infer<typeof greyScaleAnswer>;

export { fastnessSchema };

const targetFields = {
  targetPaletteColourId: optionalId,
  targetRegionId: optionalId,
  targetMeasurementId: optionalId,
  targetAim: z.enum(TARGET_AIMS, { error: 'Choose as made or as seen' }).nullable().optional(),
};
const oneTarget = (v: {
  targetPaletteColourId?: number | null;
  targetRegionId?: number | null;
  targetMeasurementId?: number | null;
}) => [v.targetPaletteColourId, v.targetRegionId, v.targetMeasurementId].filter((x) => x != null).length <= 1;
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
  .refine(oneTarget, oneTargetIssue)
  .refine((v) => v.targetAim == null || v.targetRegionId != null || v.targetMeasurementId != null, {
    message: 'An aim (as made or as seen) needs a target: a region or a reading of the piece.',
    path: ['targetAim'],
  });
export type TrialCreateInput = z.input<typeof trialCreateSchema>;

/** The kind is fixed at creation: a historical record never turns into a modern recipe. */
export const trialUpdateSchema = z
  .object({
    pieceId: optionalId,
    ...trialFields,
    status: z.enum(TRIAL_STATUSES).optional(),
    dryMassG: trialFields.dryMassG.optional(),
    dryMassBasis: z.enum(DRY_MASS_BASES, { error: 'Choose air-dry or oven-dry' }).optional(),
  })
  .partial()
  .refine(oneTarget, oneTargetIssue);
export type TrialUpdateInput = z.input<typeof trialUpdateSchema>;

export const trialListQuerySchema = z
  .object({
    q: z.string().trim().max(100).optional(),
    status: z.enum(TRIAL_STATUSES).optional(),
    kind: z.enum(TRIAL_KINDS).optional(),
    pieceId: id.optional(),
    dyerId: id.optional(),
    mine: z.enum(['1', '0']).optional(),
  })
  .extend(pageQuery(25).shape);
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

export const stepSchema = z
  .object({
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
  })
  .superRefine((s, ctx) => {
    // A draw is a bath and a volume together: one without the other would be saved as half a record.
    if (s.batchId != null && s.batchVolumeMl == null)
      ctx.addIssue({ code: 'custom', path: ['batchVolumeMl'], message: 'Enter the volume drawn from the bath, in mL' });
    if (s.batchId == null && s.batchVolumeMl != null)
      ctx.addIssue({ code: 'custom', path: ['batchId'], message: 'Choose the bath this volume is drawn from' });
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
  .refine((v) => v.historicalChemicalId != null || Boolean(v.historicalPractice), {
    message: 'Name the historical chemical or practice.',
    path: ['historicalChemicalId'],
  })
  .refine((v) => v.modernChemicalId != null || Boolean(v.modernPractice), {
    message: 'Name the modern chemical or practice.',
    path: ['modernChemicalId'],
  });
export type SubstitutionInput = z.input<typeof substitutionSchema>;

/**
 * A reading: L*a*b* typed in, or a reflectance spectrum from which the server computes them for
 * the reading's illuminant and observer (any L*a*b* sent beside a spectrum are not used).
 */
export const measurementSchema = z
  .object({
    L: labSchema.shape.L.optional(),
    a: labSchema.shape.a.optional(),
    b: labSchema.shape.b.optional(),
    spectrum: spectrumSchema.nullable().optional(),
    illuminant: z.enum(ILLUMINANTS).default('D65'),
    observer: z.enum(OBSERVERS).default('10'),
    geometry: z.enum(GEOMETRIES).nullable().optional(),
    specular: z.enum(['SCI', 'SCE']).nullable().optional(),
    instrument: text(120),
    label: text(160),
    takenOn: z.iso.date({ error: 'Enter a date such as 2024-03-12' }).nullable().optional(),
  })
  .superRefine((m, ctx) => {
    if (m.spectrum != null) return;
    if (m.L == null) ctx.addIssue({ code: 'custom', path: ['L'], message: 'Enter L* as a number from 0 to 100' });
    if (m.a == null) ctx.addIssue({ code: 'custom', path: ['a'], message: 'Enter a* as a number from −200 to 200' });
    if (m.b == null) ctx.addIssue({ code: 'custom', path: ['b'], message: 'Enter b* as a number from −200 to 200' });
  });
export type MeasurementInput = z.input<typeof measurementSchema>;

export const childParams = z.object({ id, childId: id });

/** GET /api/pieces/:id/trials: the piece's trials, 100 to a page. */
export const pieceTrialsQuery = pageQuery(100);

/** PUT /api/colour/verdict-bands: ΔE00 upper bounds that rise, with their source. */
const bandLimit = z.number().positive().max(100);
export const verdictBandsInput = z.object({
  bands: z
    .object({ match: bandLimit, close: bandLimit, near: bandLimit })
    .refine((b) => b.match < b.close && b.close < b.near, { message: 'Bands must rise: match < close < near.' }),
  source: z.string().trim().min(3, 'Say where the bands come from').max(255),
});

// ---- Answers (presenters in server/presenters/trial.ts declare their return types from these) ----

const num = z.number();
const nnum = z.number().nullable();
const nstr = z.string().nullable();
const lab = { L: num, a: num, b: num };
const conditions = { illuminant: z.enum(ILLUMINANTS), observer: z.enum(OBSERVERS) };

export const verdictBandsSchema = z.object({ match: num, close: num, near: num });
export const verdictBandsAnswer = z.object({ bands: verdictBandsSchema, source: z.string() });

/** differenceReport (shared/colour/difference.ts): ΔE00, CMC, components and the words. */
export const differenceSchema = z.object({
  deltaE00: num,
  cmc21: num,
  cmc11: num,
  deltaEab: num,
  dL: num,
  dC: num,
  dH: num,
  dh: num,
  da: num,
  db: num,
  words: z.array(z.string()),
  verdict: z.enum(['match', 'close', 'near', 'different']),
});
export const colourDifferenceAnswer = differenceSchema.extend({
  conditions: z.object({
    illuminant: z.enum(ILLUMINANTS).nullable(),
    referenceObserver: z.enum(OBSERVERS).nullable(),
    sampleObserver: z.enum(OBSERVERS).nullable(),
    observersDiffer: z.boolean(),
  }),
  note: nstr,
  bands: verdictBandsSchema,
  bandsSource: z.string(),
});

export const resolvedColourSchema = z.object({
  ...lab,
  ...conditions,
  source: z.enum(['instrument', 'image-estimate']),
  label: z.string(),
  readings: nnum,
  setAside: z.object({ ...lab, ...conditions, source: z.literal('image-estimate') }).nullable(),
});
const storedSpectrumSchema = z.object({ startNm: num, intervalNm: num, values: z.array(num) });
const trialMetamerismSchema = metamerismAnswer.extend({
  reference: z.object({ label: z.string(), spectrum: storedSpectrumSchema }),
  sample: z.object({ label: z.string(), readings: num, spectrum: storedSpectrumSchema }),
});
export type TrialMetamerism = z.infer<typeof trialMetamerismSchema>;
export type StoredSpectrum = z.infer<typeof storedSpectrumSchema>;
/** trialColour (server/services/trials/colour.ts): target, result, their difference and the other comparisons. */
export const trialColourSchema = z.object({
  target: resolvedColourSchema.nullable(),
  result: resolvedColourSchema.nullable(),
  difference: differenceSchema.nullable(),
  conditions: z
    .object({
      illuminant: z.enum(ILLUMINANTS),
      targetObserver: z.enum(OBSERVERS),
      resultObserver: z.enum(OBSERVERS),
      observersDiffer: z.boolean(),
    })
    .nullable(),
  note: nstr,
  missing: z.object({ ...conditions, message: z.string() }).nullable(),
  results: z.array(resolvedColourSchema),
  comparisons: z.array(
    z.object({
      illuminant: z.enum(ILLUMINANTS),
      target: resolvedColourSchema,
      result: resolvedColourSchema,
      difference: differenceSchema,
      observersDiffer: z.boolean(),
      note: nstr,
      primary: z.boolean(),
    }),
  ),
  bandsSource: z.string(),
  /** Both sides measured as spectra: the pair under every illuminant (shared/colour/metamerism.ts). */
  metamerism: trialMetamerismSchema.nullable(),
});

export const measurementOutSchema = z.object({
  id: num,
  ...lab,
  illuminant: z.string(),
  observer: z.string(),
  geometry: nstr,
  specular: z.enum(['SCI', 'SCE']).nullable(),
  instrument: nstr,
  label: nstr,
  takenOn: nstr,
  source: z.string(),
  spectrum: storedSpectrumSchema.nullable(),
});

export const trialSummarySchema = z.object({
  id: num,
  code: z.string(),
  kind: z.enum(TRIAL_KINDS),
  status: z.enum(TRIAL_STATUSES),
  piece: z.object({ id: num, accessionNumber: z.string(), title: z.string(), createdById: nnum }).nullable(),
  dyer: z.object({ id: num, name: z.string() }).nullable(),
  fibre: nstr,
  dryMassG: num,
  dryMassBasis: z.enum(DRY_MASS_BASES),
  startedOn: nstr,
  notes: nstr,
  updatedAt: z.iso.datetime(),
  colour: trialColourSchema.nullable(),
  abilities: z.object({ 'trial:update': z.boolean(), 'trial:delete': z.boolean() }),
});

const chemRef = z.object({ id: num, name: z.string() });
const historicalOnlyWarning = z.object({
  code: z.literal('historical-only-in-modern'),
  chemicalId: num,
  name: z.string(),
  message: z.string(),
});
const incompatibleMixWarning = z.object({
  code: z.literal('incompatible-mix'),
  pair: z.string(),
  chemicals: z.array(chemRef),
  message: z.string(),
  hazard: z.string(),
  source: z.string(),
});
export const stepWarningSchema = z.discriminatedUnion('code', [historicalOnlyWarning, incompatibleMixWarning]);
const atStep = { stepPosition: num };
export const positionedStepWarningSchema = z.discriminatedUnion('code', [
  historicalOnlyWarning.extend(atStep),
  incompatibleMixWarning.extend(atStep),
]);

/** computeStep (shared/trials/quantities.ts) with pasteMakeUp (shared/compute/paste.ts). */
export const stepComputedSchema = z.object({
  volumeL: nnum,
  ingredients: z.array(z.object({ grams: nnum, gPerL: nnum, percentOwf: nnum })),
  missing: z.array(nstr),
  paste: z
    .object({
      finalVolumeMl: num,
      mordants: z.array(z.object({ name: z.string(), gPerL: num, grams: num, stockMl: nnum })),
      thickener: z
        .object({
          name: z.string(),
          gPerL: num,
          grams: num,
          usualRange: z
            .object({ kind: z.string(), label: z.string(), min: num, max: num, source: z.string() })
            .nullable(),
          outsideUsualRange: z.boolean(),
        })
        .nullable(),
      waterMl: num,
    })
    .nullable(),
  pasteProblem: nstr,
});

export const trialStepOutSchema = z.object({
  id: num,
  position: num,
  operation: z.enum(OPERATIONS),
  ingredients: z.array(
    z.object({
      kind: z.enum(['dyestuff', 'chemical']),
      refId: num,
      amount: num,
      basis: z.enum(BASES),
      name: z.string(),
    }),
  ),
  liquorRatio: nnum,
  temperatureC: nnum,
  minutes: nnum,
  ph: nnum,
  paste: z.object({ volumeMl: num, stockGPerL: nnum }).nullable(),
  batchId: nnum,
  batch: z.object({ id: num, code: z.string(), name: z.string(), status: z.string(), remainingMl: num }).nullable(),
  batchVolumeMl: nnum,
  notes: nstr,
  computed: stepComputedSchema,
  cautions: z.array(chemicalSchema),
  warnings: z.array(stepWarningSchema),
  historicalUse: z
    .object({ reason: nstr, confirmedBy: z.object({ id: num, name: nstr }).nullable(), confirmedAt: z.iso.datetime() })
    .nullable(),
});

export const substitutionOutSchema = z.object({
  id: num,
  stepId: nnum,
  stepPosition: nnum,
  historicalChemical: chemicalSchema.nullable(),
  historicalPractice: nstr,
  historicalAmountG: nnum,
  modernChemical: chemicalSchema.nullable(),
  modernPractice: nstr,
  modernAmountG: nnum,
  /** The modern amount used in the metal load: as entered, or from the recipe step. */
  modernAmountUsedG: nnum,
  modernAmountFrom: z.enum(['entered', 'recipe']).nullable(),
  reason: z.enum(REASONS),
  notes: nstr,
});

/** trialMetalLoad (shared/trials/metal-load.ts). */
export const metalLoadSchema = z.object({
  rows: z.array(
    z.object({
      metal: z.enum(LOAD_METALS),
      heavy: z.boolean(),
      beforeG: num,
      afterG: num,
      avoidedG: num,
      beforeGPerKgFibre: nnum,
      afterGPerKgFibre: nnum,
    }),
  ),
  incomplete: num,
  fibreMassG: num,
});

/** recipeMass (shared/compute/moisture.ts). */
export const recipeMassSchema = z.object({
  enteredG: num,
  basis: z.enum(DRY_MASS_BASES),
  recipeMassG: num,
  otherG: nnum,
  fibre: nstr,
  regainPct: nnum,
  regainNote: nstr,
  problem: nstr,
  source: z.string(),
});

/** mordantChecks (shared/compute/mordant-checks.ts). */
export const mordantCheckSchema = z.object({
  stepPosition: num,
  refId: num,
  name: z.string(),
  mordant: z.enum(['potash-alum', 'aluminium-sulfate', 'aluminium-acetate', 'tannin']),
  percentOwf: nnum,
  range: z.object({ low: num, high: num, applies: z.string() }).nullable(),
  verdict: z.enum(['below', 'within', 'above', 'no-range', 'not-computed']),
  gAlPerKg: nnum,
  rangeGAlPerKg: z.tuple([num, num]).nullable(),
  marking: z.string(),
});

export const trialDetailSchema = trialSummarySchema.extend({
  weave: nstr,
  gsm: nnum,
  fastness: z.record(z.string(), z.unknown()).nullable(),
  /** The grey-scale grades computed from the stored before/after readings (ISO 105-A05 / A04), beside the assessor's. */
  fastnessComputed: z.array(
    z.object({
      test: z.enum(['washing', 'rubbingDry', 'rubbingWet']),
      scale: z.enum(['change', 'staining']),
      assessor: nstr,
      computed: gradeResult,
      source: z.string(),
    }),
  ),
  target: z.object({
    paletteColourId: nnum,
    regionId: nnum,
    measurementId: nnum,
    aim: z.enum(TARGET_AIMS).nullable(),
  }),
  steps: z.array(trialStepOutSchema),
  substitutions: z.array(substitutionOutSchema),
  metalLoad: metalLoadSchema,
  mass: recipeMassSchema,
  checks: z.object({
    fibre: nstr,
    fibreClass: z.enum(['cellulose', 'protein']).nullable(),
    mordant: z.array(mordantCheckSchema),
    warnings: z.array(
      z.union([
        z.object({
          code: z.literal('cellulose-alum-without-fixing'),
          stepPosition: num,
          message: z.string(),
          marking: z.string(),
        }),
        incompatibleMixWarning.extend(atStep),
      ]),
    ),
  }),
  measurements: z.array(measurementOutSchema),
  photos: z.array(
    z.object({ id: num, width: num, height: num, view: z.enum(PHOTO_VIEWS), caption: nstr, originalName: nstr }),
  ),
  warnings: z.array(positionedStepWarningSchema),
  historicalRecord: z.boolean(),
});

export type TrialColourOut = z.infer<typeof trialColourSchema>;
export type TrialSummaryView = z.infer<typeof trialSummarySchema>;
export type TrialView = z.infer<typeof trialDetailSchema>;
export type MeasurementView = z.infer<typeof measurementOutSchema>;
export type StepWarning = z.infer<typeof stepWarningSchema>;
export type ColourDifferenceAnswer = z.infer<typeof colourDifferenceAnswer>;
export type VerdictBandsAnswer = z.infer<typeof verdictBandsAnswer>;

export const trialListResponse = paged(trialSummarySchema);
export type TrialList = z.infer<typeof trialListResponse>;
export const trialAnswer = z.object({ trial: trialDetailSchema });
export const trialSavedAnswer = z.object({ trial: trialDetailSchema, notified: z.boolean() });
export const stepsSavedAnswer = z.object({
  trial: trialDetailSchema,
  warnings: z.array(positionedStepWarningSchema),
  warning: z.boolean(),
});
export const substitutionAnswer = z.object({ substitution: substitutionOutSchema, metalLoad: metalLoadSchema });
export const measurementAnswer = z.object({ measurement: measurementOutSchema });
export const measurementImportAnswer = z.object({ imported: num, measurements: z.array(measurementOutSchema) });
/** The swatch's palette is read by its ingest job: empty in the 201 answer (stage queued), then on the trial. */
export const trialPhotoAnswer = z.object({
  photo: z.object({
    id: num,
    width: num,
    height: num,
    view: z.enum(PHOTO_VIEWS),
    originalName: nstr,
    ingest: photoIngestSchema,
  }),
  palette: z.array(
    z.object({
      rank: num,
      ...lab,
      hex: z.string(),
      share: num,
      name: z.string(),
      variant: z.enum(PALETTE_VARIANTS),
      background: z.boolean(),
    }),
  ),
});
export type TrialPhotoAnswer = z.infer<typeof trialPhotoAnswer>;
export const pieceTrialsResponse = trialListResponse.extend({
  piece: z.object({ id: num, accessionNumber: z.string(), title: z.string() }),
  targets: z.object({ measurements: z.array(measurementOutSchema) }),
});
export type PieceTrials = z.infer<typeof pieceTrialsResponse>;

// Named components of the OpenAPI document (server/openapi/document.ts).
z.globalRegistry.add(trialSummarySchema, { id: 'TrialSummary' });
z.globalRegistry.add(trialDetailSchema, { id: 'TrialDetail' });
z.globalRegistry.add(trialColourSchema, { id: 'TrialColour' });
z.globalRegistry.add(measurementOutSchema, { id: 'Measurement' });
z.globalRegistry.add(substitutionOutSchema, { id: 'Substitution' });
z.globalRegistry.add(metalLoadSchema, { id: 'MetalLoad' });
z.globalRegistry.add(differenceSchema, { id: 'ColourDifference' });

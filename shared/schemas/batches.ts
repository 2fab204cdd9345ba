import { z } from 'zod';
import '../messages.ts';
import { pageQuery, paged } from './common.ts';
import { chemicalSchema } from './reference.ts';

export const BATCH_KINDS = ['mordant-bath', 'print-paste', 'dye-bath', 'vat', 'stock'] as const;
export type BatchKindName = (typeof BATCH_KINDS)[number];

/** Kinds that are only drawn from (a use takes volume, not strength): a stock solution and a print paste. */
export const DRAW_ONLY_KINDS: readonly BatchKindName[] = ['print-paste', 'stock'];

/**
 * The uptake per reference load applied when the new-batch form leaves it empty: 0 for what is only
 * drawn from; 10 % for a bath the fibre is worked in (the app's starting estimate, common practice,
 * recalled from memory; a test strip tells more than the figure).
 */
export const UPTAKE_DEFAULTS: Record<BatchKindName, number> = {
  'mordant-bath': 0.1,
  'dye-bath': 0.1,
  vat: 0.1,
  'print-paste': 0,
  stock: 0,
};
export const BATCH_STATUSES = ['active', 'exhausted', 'disposed'] as const;
export const BATCH_EVENT_TYPES = ['use', 'top-up', 'water', 'test-strip', 'ph', 'disposal'] as const;

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date such as 2024-03-04');
// `label` as it reads mid-sentence ("the volume"); a missing or non-numeric value is worded by shared/messages.ts.
const ml = (label: string) =>
  z
    .number()
    .positive(`${cap(label)} must be more than 0 mL`)
    .max(1_000_000, `${cap(label)} must be at most 1,000,000 mL`);
const cap = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

// The API stores the uptake as a fraction; forms show it as a percentage (batchCreateFormSchema).
const fraction = z
  .number()
  .min(0, 'Give the uptake per use as a fraction from 0 to 1 (0.1 = 10 %)')
  .max(1, 'Give the uptake per use as a fraction from 0 to 1 (0.1 = 10 %)');

export const batchIngredientSchema = z.object({
  kind: z.enum(['dyestuff', 'chemical']),
  refId: z.number().int().positive(),
  name: z.string().trim().min(1).max(160),
  grams: z.number().positive('Enter the amount in g').max(100_000),
});
export type BatchIngredientInput = z.infer<typeof batchIngredientSchema>;

export const batchCreateSchema = z.object({
  code: z
    .string()
    .trim()
    .min(2, 'Give the batch a code such as MB-12')
    .max(20)
    .regex(/^[A-Za-z0-9-]+$/, 'Letters, digits and dashes only'),
  kind: z.enum(BATCH_KINDS),
  name: z.string().trim().min(1, 'Name the batch').max(160),
  ingredients: z.array(batchIngredientSchema).max(30).default([]),
  volumeMl: ml('the volume'),
  thickenerGPerL: z.number().min(0).max(500).nullable().default(null),
  ph: z.number().min(0).max(14).nullable().default(null),
  madeOn: isoDate,
  checkBy: isoDate.nullable().default(null),
  parentId: z.number().int().positive().nullable().default(null),
  // Share of the strength one reference load of fibre takes (shared/compute/ledger.ts): a dyer's estimate,
  // not a measurement. Left empty, the batch kind's default applies (UPTAKE_DEFAULTS).
  uptakePerUse: fraction.nullable().default(null),
  notes: z.string().trim().max(4000).nullable().default(null),
});
export type BatchCreateInput = z.infer<typeof batchCreateSchema>;

/** The new-bath form: the same fields, but the uptake typed as a percentage (0–100), stored as a fraction. */
export const batchCreateFormSchema = batchCreateSchema.extend({
  uptakePerUse: z
    .number()
    .min(0, 'Give the uptake per use as a percentage from 0 to 100')
    .max(100, 'Give the uptake per use as a percentage from 0 to 100')
    .nullable()
    .default(null)
    .transform((pct) => (pct == null ? null : pct / 100)),
});

export const batchUpdateSchema = z
  .object({
    name: z.string().trim().min(1).max(160),
    checkBy: isoDate.nullable(),
    thickenerGPerL: z.number().min(0).max(500).nullable(),
    ph: z.number().min(0).max(14).nullable(),
    uptakePerUse: fraction,
    notes: z.string().trim().max(4000).nullable(),
  })
  .partial();
export type BatchUpdateInput = z.infer<typeof batchUpdateSchema>;

export const batchListQuery = z
  .object({
    status: z.enum(BATCH_STATUSES).optional(),
    kind: z.enum(BATCH_KINDS).optional(),
    due: z.enum(['1', 'true']).optional(),
  })
  .extend(pageQuery(50).shape);

/** One ledger event; which fields are required depends on its type. */
export const batchEventSchema = z
  .object({
    type: z.enum(BATCH_EVENT_TYPES),
    volumeMl: ml('the volume').optional(),
    trialId: z.number().int().positive().optional(),
    // A trial may also be named by its code (T-YYYY-NNN), as dyers write it on the jar.
    trialCode: z
      .string()
      .trim()
      .regex(/^T-\d{4}-\d{3,}$/, 'Use a trial code such as T-2024-001')
      .optional(),
    fibreMassG: z.number().positive('Enter the fibre mass in g').max(100_000).optional(),
    additions: z.array(batchIngredientSchema).max(30).optional(),
    ph: z.number().min(0).max(14).optional(),
    result: z.string().trim().min(1).max(255).optional(),
    route: z.string().trim().min(1).max(255).optional(),
    ruleFollowed: z.string().trim().min(1).max(255).optional(),
    reason: z.string().trim().min(1).max(1000).optional(),
    notes: z.string().trim().max(4000).optional(),
    occurredAt: z.iso.datetime().optional(),
  })
  .superRefine((e, ctx) => {
    const need = (field: keyof typeof e, message: string) => {
      if (e[field] === undefined) ctx.addIssue({ code: 'custom', path: [field], message });
    };
    if (e.type === 'use') need('volumeMl', 'Enter the volume drawn in mL');
    if (e.type === 'water') need('volumeMl', 'Enter the water added in mL');
    if (e.type === 'top-up' && !e.additions?.length && e.volumeMl === undefined)
      ctx.addIssue({ code: 'custom', path: ['additions'], message: 'Add a chemical or a volume' });
    if (e.type === 'test-strip') need('result', 'Describe what the strip showed');
    if (e.type === 'ph') need('ph', 'Enter the pH reading');
    if (e.type === 'disposal') {
      need('route', 'Say how it was disposed of (e.g. collected by a licensed waste contractor)');
      need('ruleFollowed', 'Name the local rule or the safety data sheet section followed');
    }
  });
export type BatchEventInput = z.infer<typeof batchEventSchema>;

/** Said wherever disposal comes up; the product gives no disposal advice of its own. */
export const DISPOSAL_NOTICE =
  'Dispose of spent baths only as your local regulations and the supplier’s safety data sheet require; where they call for it, use a licensed waste contractor. Tinctoria gives no disposal advice of its own.';

// ---- Answers (presenters in server/presenters/batches.ts declare their return types from these) ----

const num = z.number();
const nnum = z.number().nullable();
const nstr = z.string().nullable();
const batchIngredientOut = z.object({
  kind: z.enum(['dyestuff', 'chemical']),
  refId: num,
  name: z.string(),
  grams: num,
});

export const batchEventOutSchema = z.object({
  id: num,
  type: z.enum(BATCH_EVENT_TYPES),
  volumeMl: nnum,
  fibreMassG: nnum,
  trialId: nnum,
  stepId: nnum,
  trialCode: nstr,
  additions: z.array(batchIngredientOut).nullable(),
  ph: nnum,
  result: nstr,
  route: nstr,
  ruleFollowed: nstr,
  notes: nstr,
  occurredAt: z.iso.datetime(),
  createdById: nnum,
});

export const batchSummarySchema = z.object({
  id: num,
  code: z.string(),
  kind: z.enum(BATCH_KINDS),
  name: z.string(),
  volumeMl: num,
  status: z.enum(BATCH_STATUSES),
  madeOn: z.string(),
  madeById: nnum,
  checkBy: nstr,
  dueForCheck: z.boolean(),
  parentId: nnum,
  remainingMl: num,
  uses: num,
  fibreMassG: num,
  /** Relative to the bath as made (1 = as made): an estimate from the ledger, not a measurement. */
  estimatedStrength: z.object({ value: num, estimate: z.literal(true), basis: z.string() }),
});

export const batchDetailSchema = batchSummarySchema.extend({
  ingredients: z.array(batchIngredientOut),
  thickenerGPerL: nnum,
  ph: nnum,
  uptakePerUse: num,
  notes: nstr,
  /** madeByReaction (shared/compute/stoichiometry.ts), rounded; null when the charge does not react. */
  made: z
    .object({
      reaction: z.string(),
      active: z.object({
        name: z.string(),
        formula: z.string(),
        grams: num,
        gPerL: num,
        nowGPerL: z.object({ value: num, estimate: z.literal(true) }),
      }),
      metal: z.object({ symbol: z.string(), gPerL: num }).nullable(),
      limiting: z.string(),
      excess: z.array(z.object({ name: z.string(), grams: num })),
      byProducts: z.array(z.object({ name: z.string(), grams: num, fate: z.enum(['solution', 'precipitate']) })),
      note: z.string(),
      source: z.string(),
    })
    .nullable(),
  uptake: z.object({
    value: num,
    referenceLoadG: nnum,
    estimate: z.literal(true),
    drawOnly: z.boolean(),
    basis: z.string(),
  }),
  topUpSuggestion: z
    .object({
      items: z.array(z.object({ name: z.string(), refId: nnum, grams: num, thickener: z.boolean() })),
      waterMl: num,
      volumeAfterMl: num,
      usesSinceTopUp: num,
      rule: z.string(),
    })
    .nullable(),
  testStripPrompt: nstr,
  timeline: z.array(
    z.object({
      eventId: nnum,
      at: z.iso.datetime(),
      type: z.enum(['made', ...BATCH_EVENT_TYPES]),
      remainingMl: num,
      strength: num,
    }),
  ),
  events: z.array(batchEventOutSchema),
  cautions: z.array(chemicalSchema),
  parent: z.object({ id: num, code: z.string() }).nullable(),
  children: z.array(z.object({ id: num, code: z.string(), name: z.string() })),
  disposalNotice: z.string(),
  abilities: z.record(z.string(), z.boolean()),
});

export const batchListResponse = paged(batchSummarySchema);
export const batchEventAnswer = z.object({ event: batchEventOutSchema, batch: batchDetailSchema });
export type BatchSummary = z.infer<typeof batchSummarySchema>;
export type BatchDetail = z.infer<typeof batchDetailSchema>;
export type BatchEventOut = z.infer<typeof batchEventOutSchema>;
export type BatchList = z.infer<typeof batchListResponse>;

// Named components of the OpenAPI document (server/openapi/document.ts).
z.globalRegistry.add(batchSummarySchema, { id: 'BatchSummary' });
z.globalRegistry.add(batchDetailSchema, { id: 'BatchDetail' });
z.globalRegistry.add(batchEventOutSchema, { id: 'BatchEvent' });

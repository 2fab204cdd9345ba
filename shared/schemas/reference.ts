import { z } from 'zod';
import '../messages.ts';
import { pageQuery, paged } from './common.ts';
import { FormulaError, parseFormula, type Composition } from '../compute/chemistry.ts';

/** The parser's fault in people's words with its position ("Unexpected "x" at position 7"), or null when the formula reads. */
export function formulaFault(f: string): string | null {
  try {
    parseFormula(f);
    return null;
  } catch (e) {
    return e instanceof FormulaError
      ? `${e.reason}. Write a formula such as KAl(SO4)2·12H2O or CaSO4·½H2O`
      : 'Write a formula such as KAl(SO4)2·12H2O';
  }
}
const composition = (f: string): Composition | null => {
  try {
    return parseFormula(f);
  } catch {
    return null;
  }
};

export const CHEMICAL_ROLES = ['mordant', 'assistant', 'reducer', 'alkali', 'acid', 'tannin', 'thickener'] as const;
export const CHEMICAL_STATUSES = ['permitted', 'restricted', 'historical-only'] as const;
export const SIGNAL_WORDS = ['Danger', 'Warning'] as const;
/**
 * Where a chemical's signal word, H statements and pictograms come from: the harmonised classification
 * (EU CLP Regulation (EC) No 1272/2008, Annex VI), a supplier's classification (SDS / C&L notification), or
 * recalled from memory and still to be checked against the supplier's safety data sheet.
 */
export const HAZARD_BASES = ['harmonised', 'supplier', 'memory'] as const;
export type HazardBasis = (typeof HAZARD_BASES)[number];
export const HAZARD_BASIS_LABELS: Record<HazardBasis, string> = {
  harmonised: 'Harmonised EU classification (CLP)',
  supplier: "Supplier's classification",
  memory: "Recalled from memory — check the supplier's safety data sheet",
};

/** The whole reference fits a page of 200 (the forms' pickers ask for it all), 100 unless asked. */
export const chemicalListQuery = pageQuery(100, 200).extend({
  role: z.enum(CHEMICAL_ROLES).optional(),
  status: z.enum(CHEMICAL_STATUSES).optional(),
  q: z.string().trim().max(100).optional(),
});
export const dyestuffListQuery = chemicalListQuery.pick({ q: true, page: true, pageSize: true });

export const ghsSchema = z.object({
  signalWord: z.enum(SIGNAL_WORDS).nullable(),
  hStatements: z.array(z.string()),
  ppe: z.string().nullable(),
  caution: z.string().nullable(),
  source: z.string().nullable(),
  /** Where the hazard data come from (HAZARD_BASES); null on rows nobody has classified yet. */
  basis: z.enum(HAZARD_BASES).nullable(),
  /** The H statements as a label shows them (H400 left out where H410 applies: CLP Annex I, 1.1.3 precedence as recalled). */
  labelStatements: z.array(z.string()),
});

export const chemicalSchema = z
  .object({
    id: z.number(),
    name: z.string(),
    role: z.enum(CHEMICAL_ROLES),
    formula: z.string().nullable(),
    /** g/mol, computed from the formula with IUPAC 2021 abridged atomic weights. */
    molarMass: z.number().nullable(),
    metal: z.string().nullable(),
    /** 0–1, computed from the formula. */
    metalMassFraction: z.number().nullable(),
    status: z.enum(CHEMICAL_STATUSES),
    ghs: ghsSchema,
    source: z.string(),
    atomicWeightsSource: z.string().nullable(),
  })
  .meta({ id: 'Chemical' });

export const dyestuffSchema = z
  .object({
    id: z.number(),
    name: z.string(),
    ciName: z.string().nullable(),
    colorants: z.string().nullable(),
    species: z.string().nullable(),
    dyeClass: z.string().nullable(),
    source: z.string(),
  })
  .meta({ id: 'Dyestuff' });

export type Ghs = z.infer<typeof ghsSchema>;
export type ChemicalView = z.infer<typeof chemicalSchema>;
export type DyestuffView = z.infer<typeof dyestuffSchema>;
export type ChemicalListQuery = z.infer<typeof chemicalListQuery>;
export const chemicalListResponse = paged(chemicalSchema);
export const dyestuffListResponse = paged(dyestuffSchema);
export type ChemicalList = z.infer<typeof chemicalListResponse>;
export type DyestuffList = z.infer<typeof dyestuffListResponse>;

const formulaField = z
  .string()
  .trim()
  .max(80)
  .nullable()
  .superRefine((f, ctx) => {
    if (f == null || f === '') return;
    const fault = formulaFault(f);
    if (fault) ctx.addIssue({ code: 'custom', message: fault });
  });

// An empty text box means "none": '' becomes null before the field's own checks.
const blankToNull = <S extends z.ZodType>(schema: S) =>
  z.preprocess((v) => (v === undefined || (typeof v === 'string' && v.trim() === '') ? null : v), schema);

const chemicalFields = {
  name: z.string().trim().min(1, 'Give a name').max(120),
  role: z.enum(CHEMICAL_ROLES),
  formula: formulaField,
  metal: z
    .string()
    .trim()
    .regex(/^[A-Z][a-z]?$/, 'Give an element symbol such as Al')
    .nullable(),
  status: z.enum(CHEMICAL_STATUSES),
  signalWord: z.enum(SIGNAL_WORDS).nullable(),
  hStatements: z.array(z.string().trim().min(1).max(200)).max(30),
  ppe: z.string().trim().max(255).nullable(),
  caution: z.string().trim().max(2000).nullable(),
  source: z.string().trim().min(1, 'Say where the data come from').max(255),
  hazardSource: z.string().trim().max(255).nullable(),
  hazardBasis: z.enum(HAZARD_BASES).nullable(),
};

/** Admin edit of a chemical's reference row; the formula must parse with the known elements. */
export const chemicalPatchSchema = z
  .object(chemicalFields)
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Change at least one field', path: ['_'] });
export type ChemicalPatch = z.infer<typeof chemicalPatchSchema>;

/**
 * Admin adds a chemical: the same checks as an edit; a formula that cannot be read is refused with the
 * position of the fault, and a metal must occur in the formula.
 */
export const chemicalCreateSchema = z
  .object({
    ...chemicalFields,
    formula: blankToNull(formulaField),
    metal: blankToNull(chemicalFields.metal),
    signalWord: blankToNull(chemicalFields.signalWord),
    hStatements: chemicalFields.hStatements.default([]),
    ppe: blankToNull(chemicalFields.ppe),
    caution: blankToNull(chemicalFields.caution),
    hazardSource: blankToNull(chemicalFields.hazardSource),
    hazardBasis: z.enum(HAZARD_BASES).default('memory'),
  })
  .superRefine((v, ctx) => {
    if (!v.metal) return;
    if (!v.formula) {
      ctx.addIssue({
        code: 'custom',
        path: ['metal'],
        message: 'Give the formula the metal belongs to, or leave the metal empty',
      });
      return;
    }
    const comp = composition(v.formula);
    if (comp && !comp[v.metal])
      ctx.addIssue({ code: 'custom', path: ['metal'], message: `The formula has no ${v.metal}` });
  });
export type ChemicalCreate = z.infer<typeof chemicalCreateSchema>;
export type ChemicalCreateInput = z.input<typeof chemicalCreateSchema>;

/** Admin adds a dyestuff to the reference. */
export const dyestuffCreateSchema = z.object({
  name: z.string().trim().min(1, 'Give a name').max(120),
  ciName: blankToNull(z.string().trim().max(60).nullable()),
  colorants: blankToNull(z.string().trim().max(255).nullable()),
  species: blankToNull(z.string().trim().max(255).nullable()),
  dyeClass: blankToNull(z.string().trim().max(60).nullable()),
  source: z.string().trim().min(1, 'Say where the data come from').max(255),
});
export type DyestuffCreate = z.infer<typeof dyestuffCreateSchema>;
export type DyestuffCreateInput = z.input<typeof dyestuffCreateSchema>;

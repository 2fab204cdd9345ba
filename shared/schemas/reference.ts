import { z } from 'zod';
import '../messages.ts';
import { parseFormula } from '../compute/chemistry.ts';

const formulaParses = (f: string) => {
  try {
    parseFormula(f);
    return true;
  } catch {
    return false;
  }
};

export const CHEMICAL_ROLES = ['mordant', 'assistant', 'reducer', 'alkali', 'acid', 'tannin', 'thickener'] as const;
export const CHEMICAL_STATUSES = ['permitted', 'restricted', 'historical-only'] as const;
export const SIGNAL_WORDS = ['Danger', 'Warning'] as const;

export const idParams = z.object({ id: z.coerce.number().int().positive('Give a numeric id') });

export const chemicalListQuery = z.object({
  role: z.enum(CHEMICAL_ROLES).optional(),
  status: z.enum(CHEMICAL_STATUSES).optional(),
  q: z.string().trim().max(100).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(100),
});
export const dyestuffListQuery = chemicalListQuery.pick({ q: true, page: true, pageSize: true });

export const ghsSchema = z.object({
  signalWord: z.enum(SIGNAL_WORDS).nullable(),
  hStatements: z.array(z.string()),
  ppe: z.string().nullable(),
  caution: z.string().nullable(),
  source: z.string().nullable(),
});

export const chemicalSchema = z.object({
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
});

export const dyestuffSchema = z.object({
  id: z.number(),
  name: z.string(),
  ciName: z.string().nullable(),
  colorants: z.string().nullable(),
  species: z.string().nullable(),
  dyeClass: z.string().nullable(),
  source: z.string(),
});

export type Ghs = z.infer<typeof ghsSchema>;
export type ChemicalView = z.infer<typeof chemicalSchema>;
export type DyestuffView = z.infer<typeof dyestuffSchema>;
export type ChemicalListQuery = z.infer<typeof chemicalListQuery>;
export type Paged<T> = { items: T[]; total: number; page: number; pageSize: number };

/** Admin edit of a chemical's reference row; the formula must parse with the known elements. */
export const chemicalPatchSchema = z
  .object({
    name: z.string().trim().min(1, 'Give a name').max(120),
    role: z.enum(CHEMICAL_ROLES),
    formula: z
      .string()
      .trim()
      .max(80)
      .nullable()
      .refine((f) => f == null || f === '' || formulaParses(f), 'Write a formula such as KAl(SO4)2·12H2O with known elements'),
    metal: z.string().trim().regex(/^[A-Z][a-z]?$/, 'Give an element symbol such as Al').nullable(),
    status: z.enum(CHEMICAL_STATUSES),
    signalWord: z.enum(SIGNAL_WORDS).nullable(),
    hStatements: z.array(z.string().trim().min(1).max(200)).max(30),
    ppe: z.string().trim().max(255).nullable(),
    caution: z.string().trim().max(2000).nullable(),
    source: z.string().trim().min(1, 'Say where the data come from').max(255),
    hazardSource: z.string().trim().max(255).nullable(),
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, { message: 'Change at least one field', path: ['_'] });
export type ChemicalPatch = z.infer<typeof chemicalPatchSchema>;

import { z } from 'zod';
import '../messages.ts';
import { parseEdtf } from '../edtf.ts';
import { RIGHTS_MESSAGE, RIGHTS_URI_PATTERN, canonicalRights } from '../rights.ts';

// The curatorial fields of a piece (issue 19): makers with their role and dates, pattern name, marks and
// inscriptions, storage location (staff only: the presenter leaves it out for visitors, IIIF and Dublin Core),
// and the object's and images' rights as standard rights URIs (shared/rights.ts).

export const MAKER_ROLES = ['designer', 'block cutter', 'printer', 'dyer', 'manufactory'] as const;
export const MARK_KINDS = ['stamp', 'inscription', 'label', 'woven mark', 'signature', 'number', 'other'] as const;

const text = (max: number) => z.string().trim().max(max, `Use at most ${max} characters`);
const optionalText = (max: number) =>
  z
    .union([text(max), z.null()])
    .optional()
    .transform((v) => (v === '' || v === undefined ? null : v));

/** A maker's dates in EDTF, read by the same reader as the piece's date (shared/edtf.ts). */
const makerDates = optionalText(60).superRefine((v, ctx) => {
  if (!v) return;
  const r = parseEdtf(v);
  if (!r.ok) ctx.addIssue({ code: 'custom', message: r.message });
});

export const makerSchema = z.object({
  name: text(160).min(1, 'Enter the maker’s name'),
  role: z.enum(MAKER_ROLES, { error: 'Choose a role: designer, block cutter, printer, dyer or manufactory' }),
  dates: makerDates,
});
export type Maker = z.infer<typeof makerSchema>;

export const markSchema = z.object({
  text: text(500).min(1, 'Enter the text of the mark as it reads'),
  kind: z.enum(MARK_KINDS, { error: 'Choose what kind of mark it is' }),
  place: optionalText(160),
});
export type Mark = z.infer<typeof markSchema>;

export const rightsUri = z
  .union([z.string().trim().max(255, 'Use at most 255 characters'), z.null()])
  .optional()
  .transform((v) => (v === '' || v === undefined ? null : v))
  .refine((v) => v === null || RIGHTS_URI_PATTERN.test(v), RIGHTS_MESSAGE)
  .transform((v) => (v === null ? null : canonicalRights(v)));

/** Spread into the piece's create and update fields (shared/schemas/piece.ts). */
export const curatorialFields = {
  makers: z.array(makerSchema).max(30, 'List at most 30 makers').optional(),
  patternName: optionalText(160),
  marks: z.array(markSchema).max(30, 'List at most 30 marks').optional(),
  storageLocation: optionalText(160),
  objectRights: rightsUri,
  imageRights: rightsUri,
};

const makerOut = z.object({ name: z.string(), role: z.enum(MAKER_ROLES), dates: z.string().nullable() });
const markOut = z.object({ text: z.string(), kind: z.enum(MARK_KINDS), place: z.string().nullable() });

/** Spread into pieceSchema; storageLocation is absent from a visitor's answer. */
export const curatorialOut = {
  makers: z.array(makerOut),
  patternName: z.string().nullable(),
  marks: z.array(markOut),
  storageLocation: z.string().nullable().optional(),
  objectRights: z.string().nullable(),
  imageRights: z.string().nullable(),
};

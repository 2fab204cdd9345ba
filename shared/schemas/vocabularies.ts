import { z } from 'zod';
import '../messages.ts';
import { CHEMICAL_STATUSES, SIGNAL_WORDS } from './reference.ts';

/** GET /api/vocabularies: the terms the catalogue forms offer (fibres, weaves, techniques, dyestuffs, mordant chemicals). */
const termSchema = z.object({ term: z.string(), note: z.string().nullable() });
export const vocabulariesSchema = z.object({
  fibres: z.array(termSchema),
  weaves: z.array(termSchema),
  techniques: z.array(termSchema),
  dyestuffs: z.array(z.object({ name: z.string(), ciName: z.string().nullable() })),
  mordants: z.array(
    z.object({
      name: z.string(),
      formula: z.string().nullable(),
      status: z.enum(CHEMICAL_STATUSES),
      signalWord: z.enum(SIGNAL_WORDS).nullable(),
      hStatements: z.array(z.string()),
      ppe: z.string().nullable(),
    }),
  ),
});
export type Vocabularies = z.infer<typeof vocabulariesSchema>;

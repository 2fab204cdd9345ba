import { Router } from 'express';
import { z } from 'zod';
import { colourDifferenceSchema } from '../../../shared/schemas/trial.ts';
import { differenceReport } from '../../../shared/colour/index.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden } from '../../http/errors.ts';
import { parseBody } from '../../http/validate.ts';
import { sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { setVerdictBands, verdictBands } from '../../services/settings.ts';

export const colourRouter = Router();

/**
 * ΔE00 (1:1:1), CMC(2:1) and CMC(1:1) of a sample against a reference (the original is the
 * standard: CMC is not symmetric), with words and the verdict from the bands in force.
 * A pure computation on the numbers sent, so anyone may ask.
 */
colourRouter.post('/difference', async (req, res) => {
  const { reference, sample } = parseBody(colourDifferenceSchema, req);
  const { bands, source } = await verdictBands();
  res.json({ ...differenceReport(reference, sample, bands), bands, bandsSource: source });
});

colourRouter.get('/verdict-bands', async (_req, res) => {
  res.json(await verdictBands());
});

const limit = z.number().positive().max(100);
const bandsInput = z.object({
  bands: z.object({ match: limit, close: limit, near: limit }).refine((b) => b.match < b.close && b.close < b.near, { message: 'Bands must rise: match < close < near.' }),
  source: z.string().trim().min(3, 'Say where the bands come from').max(255),
});

/** Admins tune the verdict bands (ΔE00 upper bounds), naming their source. */
colourRouter.put('/verdict-bands', requireUser, async (req, res) => {
  const input = parseBody(bandsInput, req);
  if (!can(actorOf(req), 'reference:manage')) throw forbidden('Only admins change the verdict bands.');
  res.json(await sequelize.transaction((transaction) => setVerdictBands(input.bands, input.source, transaction)));
});

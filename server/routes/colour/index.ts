import { Router } from 'express';
import { z } from 'zod';
import { colourDifferenceSchema } from '../../../shared/schemas/trial.ts';
import { differenceReport, verdictFor } from '../../../shared/colour/index.ts';
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
  const report = differenceReport(reference, sample);
  res.json({ ...report, verdict: verdictFor(report.deltaE00, bands), bands, bandsSource: source });
});

colourRouter.get('/verdict-bands', async (_req, res) => {
  res.json(await verdictBands());
});

const bandsInput = z.object({ bands: z.record(z.string(), z.unknown()), source: z.string().trim().min(3).max(255) });

/** Admins tune the verdict bands; the server checks the shape against the shared colour module's defaults. */
colourRouter.put('/verdict-bands', requireUser, async (req, res) => {
  const input = parseBody(bandsInput, req);
  if (!can(actorOf(req), 'reference:manage')) throw forbidden('Only admins change the verdict bands.');
  const current = await verdictBands();
  const bands = { ...current.bands, ...input.bands } as typeof current.bands;
  res.json(await sequelize.transaction((transaction) => setVerdictBands(bands, input.source, transaction)));
});

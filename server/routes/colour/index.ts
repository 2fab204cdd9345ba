import { Router } from 'express';
import {
  colourDifferenceSchema,
  verdictBandsInput,
  type ColourDifferenceAnswer,
} from '../../../shared/schemas/trial.ts';
import { differenceReport } from '../../../shared/colour/index.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden, unprocessable } from '../../http/errors.ts';
import { parseBody } from '../../http/validate.ts';
import { sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { setVerdictBands, verdictBands } from '../../services/settings.ts';

export const colourRouter = Router();

/**
 * ΔE00 (1:1:1), CMC(2:1) and CMC(1:1) of a sample against a reference (the original is the
 * standard: CMC is not symmetric), with words and the verdict from the bands in force.
 * A pure computation on the numbers sent, so anyone may ask. Colours stated to be under
 * different illuminants are refused: their L*a*b* values rest on different whites.
 */
colourRouter.post('/difference', async (req, res) => {
  const { reference, sample } = parseBody(colourDifferenceSchema, req);
  if (reference.illuminant && sample.illuminant && reference.illuminant !== sample.illuminant) {
    throw unprocessable(
      `These colours are under different illuminants (the reference under ${reference.illuminant}, the sample under ${sample.illuminant}), so no colour difference is given. Compare readings taken under the same illuminant.`,
      { fields: { 'sample.illuminant': [`Must be ${reference.illuminant}, as the reference`] } },
    );
  }
  const observersDiffer = Boolean(reference.observer && sample.observer && reference.observer !== sample.observer);
  const conditions = {
    illuminant: reference.illuminant ?? sample.illuminant ?? null,
    referenceObserver: reference.observer ?? null,
    sampleObserver: sample.observer ?? null,
    observersDiffer,
  };
  const note = observersDiffer
    ? `Observers differ (reference ${reference.observer}°, sample ${sample.observer}°): the figures are given, but part of the difference may come from the observer rather than the colours.`
    : null;
  const { bands, source } = await verdictBands();
  const answer: ColourDifferenceAnswer = {
    ...differenceReport(reference, sample, bands),
    conditions,
    note,
    bands,
    bandsSource: source,
  };
  res.json(answer);
});

colourRouter.get('/verdict-bands', async (_req, res) => {
  res.json(await verdictBands());
});

/** Admins tune the verdict bands (ΔE00 upper bounds), naming their source. */
colourRouter.put('/verdict-bands', requireUser, async (req, res) => {
  const input = parseBody(verdictBandsInput, req);
  if (!can(actorOf(req), 'reference:manage')) throw forbidden('Only admins change the verdict bands.');
  res.json(await sequelize.transaction((transaction) => setVerdictBands(input.bands, input.source, transaction)));
});

import { Router } from 'express';
import {
  colourDifferenceSchema,
  greyScaleRequest,
  verdictBandsInput,
  type ColourDifferenceAnswer,
  type GreyScaleAnswer,
} from '../../../shared/schemas/trial.ts';
import {
  metamerismRequest,
  spectrumRequest,
  type MetamerismAnswer,
  type SpectrumAnswer,
} from '../../../shared/schemas/spectral.ts';
import { differenceReport } from '../../../shared/colour/index.ts';
import { metamerism } from '../../../shared/colour/metamerism.ts';
import { SPECTRAL_METHOD, spectrumToLab, toFractions } from '../../../shared/colour/spectral.ts';
import { GREY_SCALE_SOURCES, greyScaleGrades } from '../../../shared/compute/grey-scale.ts';
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

/** XYZ and L*a*b* of a reflectance spectrum under one illuminant and observer (a check tool: anyone may ask). */
colourRouter.post('/spectrum', (req, res) => {
  const { spectrum, illuminant, observer } = parseBody(spectrumRequest, req);
  const { XYZ, white, lab } = spectrumToLab(
    { ...spectrum, values: toFractions(spectrum.values, spectrum.unit) },
    illuminant,
    observer,
  );
  const answer: SpectrumAnswer = { illuminant, observer, XYZ, white, lab, method: SPECTRAL_METHOD };
  res.json(answer);
});

/** ΔE00 of a pair of spectra under each illuminant, the worst, and the metamerism index. */
colourRouter.post('/metamerism', async (req, res) => {
  const { reference, sample, observer } = parseBody(metamerismRequest, req);
  const { bands } = await verdictBands();
  const fractions = (s: typeof reference) => ({ ...s, values: toFractions(s.values, s.unit) });
  const answer: MetamerismAnswer = metamerism(fractions(reference), fractions(sample), observer, bands);
  res.json(answer);
});

/** Instrumental grey-scale grades for change in colour (ISO 105-A05) and staining (ISO 105-A04). */
colourRouter.post('/grey-scale', (req, res) => {
  const { reference, sample } = parseBody(greyScaleRequest, req);
  const answer: GreyScaleAnswer = { ...greyScaleGrades(reference, sample), sources: GREY_SCALE_SOURCES };
  res.json(answer);
});

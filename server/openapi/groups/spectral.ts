import { greyScaleAnswer, greyScaleRequest } from '../../../shared/schemas/trial.ts';
import {
  metamerismAnswer,
  metamerismRequest,
  spectrumAnswer,
  spectrumRequest,
} from '../../../shared/schemas/spectral.ts';
import { defineRoutes } from '../registry.ts';

// The spectral and grey-scale colour tools (server/routes/colour): pure computations on the numbers sent.
export default defineRoutes('spectral', [
  {
    method: 'post',
    path: '/api/colour/spectrum',
    summary: 'XYZ and L*a*b* of a reflectance spectrum under an illuminant and observer (ASTM E308)',
    roles: 'anyone',
    body: spectrumRequest,
    responses: { 200: spectrumAnswer },
  },
  {
    method: 'post',
    path: '/api/colour/metamerism',
    summary: 'ΔE00 of two spectra under each illuminant, the worst, and the CIE metamerism index',
    roles: 'anyone',
    body: metamerismRequest,
    responses: { 200: metamerismAnswer },
  },
  {
    method: 'post',
    path: '/api/colour/grey-scale',
    summary: 'Instrumental grey-scale grades: change in colour (ISO 105-A05) and staining (ISO 105-A04)',
    roles: 'anyone',
    body: greyScaleRequest,
    responses: { 200: greyScaleAnswer },
  },
]);

import { idParams } from '../../../shared/schemas/common.ts';
import {
  childParams,
  colourDifferenceAnswer,
  colourDifferenceSchema,
  measurementAnswer,
  measurementImportAnswer,
  measurementSchema,
  pieceTrialsQuery,
  pieceTrialsResponse,
  stepsSavedAnswer,
  stepsSchema,
  substitutionAnswer,
  substitutionSchema,
  trialAnswer,
  trialCreateSchema,
  trialListQuerySchema,
  trialListResponse,
  trialPhotoAnswer,
  trialSavedAnswer,
  trialUpdateSchema,
  verdictBandsAnswer,
  verdictBandsInput,
} from '../../../shared/schemas/trial.ts';
import { z } from 'zod';
import { defineRoutes } from '../registry.ts';

// Trials (server/routes/trials, trial-cards) and the colour tools (server/routes/colour).
const READ = 'any signed-in role';
const CREATE = 'dyer, admin';
const OWN = 'the dyer who keeps the trial, admin';
const pdf = { contentType: 'application/pdf', description: 'The printable sample card (PDF)' };

export default defineRoutes('trials', [
  { method: 'get', path: '/api/pieces/:id/trials', summary: "A piece's trials and the instrument readings of the original offered as targets", roles: READ, params: idParams, query: pieceTrialsQuery, responses: { 200: pieceTrialsResponse } },
  { method: 'post', path: '/api/pieces/:id/trials', summary: 'Attach a new trial to a piece (its curator is told by e-mail)', roles: CREATE, params: idParams, body: trialCreateSchema, responses: { 201: trialSavedAnswer } },
  { method: 'get', path: '/api/trials', summary: 'List trials', roles: READ, query: trialListQuerySchema, responses: { 200: trialListResponse } },
  { method: 'post', path: '/api/trials', summary: 'Record a trial', roles: CREATE, body: trialCreateSchema, responses: { 201: trialSavedAnswer } },
  { method: 'get', path: '/api/trials/:id', summary: 'One trial with its recipe, substitutions, readings, photos and colour comparison', roles: READ, params: idParams, responses: { 200: trialAnswer } },
  { method: 'patch', path: '/api/trials/:id', summary: 'Change a trial', roles: OWN, params: idParams, body: trialUpdateSchema, responses: { 200: trialSavedAnswer } },
  { method: 'delete', path: '/api/trials/:id', summary: 'Delete a trial', roles: OWN, params: idParams, responses: { 204: null } },
  { method: 'put', path: '/api/trials/:id/steps', summary: 'Replace the ordered recipe; the answer carries any safety warnings', roles: OWN, params: idParams, body: stepsSchema, responses: { 200: stepsSavedAnswer } },
  { method: 'post', path: '/api/trials/:id/substitutions', summary: 'Add a substitution (historical → modern practice)', roles: OWN, params: idParams, body: substitutionSchema, responses: { 201: substitutionAnswer } },
  { method: 'put', path: '/api/trials/:id/substitutions/:childId', summary: 'Change a substitution', roles: OWN, params: childParams, body: substitutionSchema, responses: { 200: substitutionAnswer } },
  { method: 'delete', path: '/api/trials/:id/substitutions/:childId', summary: 'Remove a substitution', roles: OWN, params: childParams, responses: { 204: null } },
  { method: 'post', path: '/api/trials/:id/measurements', summary: 'Add an instrument reading of the swatch', roles: OWN, params: idParams, body: measurementSchema, responses: { 201: measurementAnswer } },
  { method: 'delete', path: '/api/trials/:id/measurements/:childId', summary: 'Remove a reading', roles: OWN, params: childParams, responses: { 204: null } },
  {
    method: 'post',
    path: '/api/trials/:id/measurements/import',
    summary: 'Import readings from CSV (the file as a text/csv body, or { csv } as JSON): all rows, or none with the bad lines listed',
    roles: OWN,
    params: idParams,
    body: z.object({ csv: z.string() }),
    responses: { 201: measurementImportAnswer },
  },
  { method: 'post', path: '/api/trials/:id/photos', summary: 'Upload one swatch photo (multipart/form-data, field "photo"); its palette is extracted', roles: OWN, params: idParams, responses: { 201: trialPhotoAnswer } },
  { method: 'post', path: '/api/colour/difference', summary: 'ΔE00 and CMC of a sample against a reference, in words, with the verdict', roles: 'anyone', body: colourDifferenceSchema, responses: { 200: colourDifferenceAnswer } },
  { method: 'get', path: '/api/colour/verdict-bands', summary: 'The ΔE00 verdict bands in force and their source', roles: 'anyone', responses: { 200: verdictBandsAnswer } },
  { method: 'put', path: '/api/colour/verdict-bands', summary: 'Set the verdict bands, naming their source', roles: 'admin', body: verdictBandsInput, responses: { 200: verdictBandsAnswer } },
  { method: 'get', path: '/api/trials/:id/card.pdf', summary: 'The printable sample card of one trial', roles: READ, params: idParams, responses: { 200: pdf } },
]);

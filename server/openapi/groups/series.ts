import { idParams } from '../../../shared/schemas/common.ts';
import {
  seriesCreateSchema,
  seriesDetailSchema,
  seriesListQuery,
  seriesListResponse,
  seriesPreviewAnswer,
  seriesPreviewSchema,
  seriesTrialsAnswer,
  seriesUpdateSchema,
} from '../../../shared/schemas/series.ts';
import { defineRoutes } from '../registry.ts';

// Trial series and workshops (server/routes/series).
const READ = 'any signed-in role';
const OWN = 'the dyer who keeps the series, admin';
const pdf = (description: string) => ({ contentType: 'application/pdf', description });

export default defineRoutes('series', [
  {
    method: 'get',
    path: '/api/series',
    summary: 'List series and workshops',
    roles: READ,
    query: seriesListQuery,
    responses: { 200: seriesListResponse },
  },
  {
    method: 'post',
    path: '/api/series/preview',
    summary: 'The cells a set of factors would make (nothing is saved)',
    roles: READ,
    body: seriesPreviewSchema,
    responses: { 200: seriesPreviewAnswer },
  },
  {
    method: 'post',
    path: '/api/series',
    summary: 'Plan a series or workshop',
    roles: 'dyer, admin',
    body: seriesCreateSchema,
    responses: { 201: seriesDetailSchema },
  },
  {
    method: 'get',
    path: '/api/series/:id',
    summary: 'One series: cells, recipes per cell, materials list, trials',
    roles: READ,
    params: idParams,
    responses: { 200: seriesDetailSchema },
  },
  {
    method: 'patch',
    path: '/api/series/:id',
    summary: 'Change a series (title, participants, kept cells, target)',
    roles: OWN,
    params: idParams,
    body: seriesUpdateSchema,
    responses: { 200: seriesDetailSchema },
  },
  {
    method: 'post',
    path: '/api/series/:id/trials',
    summary: 'Create a trial for each kept cell',
    roles: OWN,
    params: idParams,
    responses: { 201: seriesTrialsAnswer },
  },
  {
    method: 'get',
    path: '/api/series/:id/cards.pdf',
    summary: 'Sample cards of every trial in the series',
    roles: READ,
    params: idParams,
    responses: { 200: pdf('The sample cards (PDF)') },
  },
  {
    method: 'get',
    path: '/api/series/:id/labels.pdf',
    summary: 'Swatch labels with hazard pictograms',
    roles: READ,
    params: idParams,
    responses: { 200: pdf('The swatch labels (PDF)') },
  },
]);

import {
  batchCreateSchema,
  batchDetailSchema,
  batchEventAnswer,
  batchEventSchema,
  batchListQuery,
  batchListResponse,
  batchUpdateSchema,
} from '../../../shared/schemas/batches.ts';
import { idParams } from '../../../shared/schemas/common.ts';
import { defineRoutes } from '../registry.ts';

// Mordant baths, pastes and stocks with their ledgers (server/routes/batches).
const READ = 'any signed-in role';
const OWN = 'the dyer who made the batch, admin';

export default defineRoutes('batches', [
  {
    method: 'get',
    path: '/api/batches',
    summary: 'List batches with their ledger figures',
    roles: READ,
    query: batchListQuery,
    responses: { 200: batchListResponse },
  },
  {
    method: 'post',
    path: '/api/batches',
    summary: 'Make a batch',
    roles: 'dyer, admin',
    body: batchCreateSchema,
    responses: { 201: batchDetailSchema },
  },
  {
    method: 'get',
    path: '/api/batches/:id',
    summary: 'One batch: ledger, timeline, top-up suggestion, cautions',
    roles: READ,
    params: idParams,
    responses: { 200: batchDetailSchema },
  },
  {
    method: 'patch',
    path: '/api/batches/:id',
    summary: 'Change a batch',
    roles: OWN,
    params: idParams,
    body: batchUpdateSchema,
    responses: { 200: batchDetailSchema },
  },
  {
    method: 'post',
    path: '/api/batches/:id/events',
    summary: 'Record a ledger event (use, top-up, water, test strip, pH, disposal)',
    roles: 'dyer, admin',
    params: idParams,
    body: batchEventSchema,
    responses: { 201: batchEventAnswer },
  },
  {
    method: 'get',
    path: '/api/batches/:id/label.pdf',
    summary: 'The printable jar label',
    roles: READ,
    params: idParams,
    responses: { 200: { contentType: 'application/pdf', description: 'The jar label (PDF)' } },
  },
]);

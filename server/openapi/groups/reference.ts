import { idParams } from '../../../shared/schemas/common.ts';
import {
  chemicalCreateSchema,
  chemicalListQuery,
  chemicalListResponse,
  chemicalPatchSchema,
  chemicalSchema,
  dyestuffCreateSchema,
  dyestuffListQuery,
  dyestuffListResponse,
  dyestuffSchema,
} from '../../../shared/schemas/reference.ts';
import { defineRoutes } from '../registry.ts';

// The chemical and dyestuff reference (server/routes/reference): read by anyone, kept by admins.
export default defineRoutes('reference', [
  {
    method: 'get',
    path: '/api/chemicals',
    summary: 'List chemicals (mordants, assistants, …) with their hazard data',
    roles: 'anyone',
    query: chemicalListQuery,
    responses: { 200: chemicalListResponse },
  },
  {
    method: 'get',
    path: '/api/chemicals/:id',
    summary: 'One chemical',
    roles: 'anyone',
    params: idParams,
    responses: { 200: chemicalSchema },
  },
  {
    method: 'post',
    path: '/api/chemicals',
    summary: 'Add a chemical',
    roles: 'admin',
    body: chemicalCreateSchema,
    responses: { 201: chemicalSchema },
  },
  {
    method: 'patch',
    path: '/api/chemicals/:id',
    summary: 'Change a chemical (audited)',
    roles: 'admin',
    params: idParams,
    body: chemicalPatchSchema,
    responses: { 200: chemicalSchema },
  },
  {
    method: 'get',
    path: '/api/dyestuffs',
    summary: 'List dyestuffs',
    roles: 'anyone',
    query: dyestuffListQuery,
    responses: { 200: dyestuffListResponse },
  },
  {
    method: 'post',
    path: '/api/dyestuffs',
    summary: 'Add a dyestuff',
    roles: 'admin',
    body: dyestuffCreateSchema,
    responses: { 201: dyestuffSchema },
  },
  {
    method: 'get',
    path: '/api/dyestuffs/:id',
    summary: 'One dyestuff',
    roles: 'anyone',
    params: idParams,
    responses: { 200: dyestuffSchema },
  },
]);

import { defineRoutes } from '../registry.ts';
import { idParams } from '../../../shared/schemas/common.ts';
import { jobListQuery, jobListResponse, jobResponse } from '../../../shared/schemas/jobs.ts';

export default defineRoutes('jobs', [
  {
    method: 'get',
    path: '/api/jobs',
    summary: "Background jobs, newest first: one photo's (photoId) for whoever may read it, all for admins",
    roles: 'signed in (photoId); admin (all)',
    query: jobListQuery,
    responses: { 200: jobListResponse },
  },
  {
    method: 'get',
    path: '/api/jobs/:id',
    summary: 'One job with its state and progress',
    roles: 'signed in who may read its photo; admin for fixity checks',
    params: idParams,
    responses: { 200: jobResponse },
  },
  {
    method: 'post',
    path: '/api/jobs/:id/retry',
    summary: 'Start a failed job again with fresh attempts',
    roles: 'curator, admin (photo jobs); admin (fixity checks)',
    params: idParams,
    responses: { 200: jobResponse },
  },
]);

import { defineRoutes } from '../registry.ts';
import { jobResponse } from '../../../shared/schemas/jobs.ts';
import { fixityLatestSchema } from '../../../shared/schemas/fixity.ts';

export default defineRoutes('admin-fixity', [
  {
    method: 'post',
    path: '/api/admin/fixity',
    summary:
      'Queue a check of every master against its recorded sha256 (200 with the open one when a check is already queued or running)',
    roles: 'admin',
    responses: { 200: jobResponse, 202: jobResponse },
  },
  {
    method: 'get',
    path: '/api/admin/fixity/latest',
    summary: 'The newest fixity check and the report of the newest finished one',
    roles: 'admin',
    responses: { 200: fixityLatestSchema },
  },
]);

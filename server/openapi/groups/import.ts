import { defineRoutes } from '../registry.ts';
import {
  importPreviewErrorsPage,
  importPreviewErrorsQuery,
  importPreviewParams,
  importPreviewRowsPage,
  importPreviewRowsQuery,
  importPreviewSchema,
  importQuery,
  importResultSchema,
} from '../../../shared/schemas/piece-import.ts';

export default defineRoutes('import', [
  {
    method: 'post',
    path: '/api/import/pieces',
    // The body is multipart/form-data: `file` (a UTF-8 CSV, up to 50 MB) and `mapping` (JSON of `columnMapping`).
    summary:
      'Import pieces from a CSV (multipart: file, mapping); ?dryRun=true checks every row, writes nothing and answers the counts with the first page of rows and errors',
    roles: 'curator, admin',
    query: importQuery,
    responses: { 200: importPreviewSchema, 201: importResultSchema },
  },
  {
    method: 'get',
    path: '/api/import/previews/:id/rows',
    summary: "A page of a dry run's checked rows (all, or only=invalid); the dry run's maker only, for a day",
    roles: 'curator, admin (own previews)',
    params: importPreviewParams,
    query: importPreviewRowsQuery,
    responses: { 200: importPreviewRowsPage },
  },
  {
    method: 'get',
    path: '/api/import/previews/:id/errors',
    summary: "A page of a dry run's errors, in file order; the dry run's maker only, for a day",
    roles: 'curator, admin (own previews)',
    params: importPreviewParams,
    query: importPreviewErrorsQuery,
    responses: { 200: importPreviewErrorsPage },
  },
]);

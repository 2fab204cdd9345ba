import { defineRoutes } from '../registry.ts';
import { importPreviewSchema, importQuery, importResultSchema } from '../../../shared/schemas/piece-import.ts';

export default defineRoutes('import', [
  {
    method: 'post',
    path: '/api/import/pieces',
    // The body is multipart/form-data: `file` (a UTF-8 CSV, up to 50 MB) and `mapping` (JSON of `columnMapping`).
    summary: 'Import pieces from a CSV (multipart: file, mapping); ?dryRun=true checks every row and writes nothing',
    roles: 'curator, admin',
    query: importQuery,
    responses: { 200: importPreviewSchema, 201: importResultSchema },
  },
]);

import { defineRoutes } from '../registry.ts';
import { shadeQuerySchema } from '../../../shared/schemas/search.ts';

const csv = (description: string) => ({ contentType: 'text/csv', description });

// Whole-archive CSVs under /api/export, then one piece's exports under /api/pieces/:id (pieceExportRouter).
export default defineRoutes('export', [
  {
    method: 'get',
    path: '/api/export/pieces.csv',
    summary: 'The catalogue as CSV (re-importable)',
    roles: 'researcher, curator, admin',
    responses: { 200: csv('Every piece, one row each, in the import format') },
  },
  {
    method: 'get',
    path: '/api/export/trials.csv',
    summary: 'Every trial with its colour and fastness as CSV',
    roles: 'signed in',
    responses: { 200: csv('Every trial, one row each') },
  },
  {
    method: 'get',
    path: '/api/export/palettes.csv',
    summary: "Every visible piece's palette as CSV",
    roles: 'anyone (visitors: published pieces only)',
    responses: { 200: csv('One row per palette colour') },
  },
  {
    method: 'get',
    path: '/api/export/shade.csv',
    summary: 'The matches of a shade search as CSV (the parameters of GET /api/search/shade)',
    roles: 'anyone (sees what the search shows them)',
    query: shadeQuerySchema,
    responses: { 200: csv('One row per match, nearest first') },
  },
  // The per-piece exports (/api/pieces/:id/…) are declared with the pieces group, where they are mounted.
]);

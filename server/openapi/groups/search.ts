import { searchQuerySchema, searchResponse, shadeQuerySchema, shadeResponse } from '../../../shared/schemas/search.ts';
import { defineRoutes } from '../registry.ts';

// Open to everyone; what each role sees (drafts, trials) is decided in the search service.
export default defineRoutes('search', [
  {
    method: 'get',
    path: '/api/search',
    summary: 'Full-text and faceted search of pieces (20 a page unless asked)',
    roles: 'anyone (visitors: published pieces only)',
    query: searchQuerySchema,
    responses: { 200: searchResponse },
  },
  {
    method: 'get',
    path: '/api/search/shade',
    summary: 'Pieces with a palette colour within a CIEDE2000 radius of a colour',
    roles: 'anyone (visitors: published pieces only)',
    query: shadeQuerySchema,
    responses: { 200: shadeResponse },
  },
]);

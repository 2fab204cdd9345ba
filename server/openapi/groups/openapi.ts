import { openApiDocumentSchema } from '../../../shared/schemas/openapi.ts';
import { defineRoutes } from '../registry.ts';

export default defineRoutes('openapi', [
  {
    method: 'get',
    path: '/api/openapi.json',
    summary: 'This document: the OpenAPI 3.1 description of every /api route',
    roles: 'anyone',
    responses: { 200: openApiDocumentSchema },
  },
]);

import { vocabulariesSchema } from '../../../shared/schemas/vocabularies.ts';
import { defineRoutes } from '../registry.ts';

export default defineRoutes('vocabularies', [
  {
    method: 'get',
    path: '/api/vocabularies',
    summary: 'The terms the catalogue forms offer: fibres, weaves, techniques, dyestuffs, mordants',
    roles: 'anyone',
    responses: { 200: vocabulariesSchema },
  },
]);

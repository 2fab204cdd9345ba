import { defineRoutes } from '../registry.ts';
import { idParams } from '../../../shared/schemas/common.ts';
import {
  savedSearchCreateSchema,
  savedSearchListResponse,
  savedSearchResponse,
} from '../../../shared/schemas/saved-search.ts';

export default defineRoutes('saved-searches', [
  {
    method: 'get',
    path: '/api/saved-searches',
    summary: 'My saved searches, by name; each opens /search again with its words, facets and shade',
    roles: 'admin, curator, researcher, dyer (each sees only their own)',
    responses: { 200: savedSearchListResponse },
  },
  {
    method: 'post',
    path: '/api/saved-searches',
    summary: 'Save a search (the /search query string) under a name; each name once per person',
    roles: 'admin, curator, researcher, dyer',
    body: savedSearchCreateSchema,
    responses: { 201: savedSearchResponse },
  },
  {
    method: 'delete',
    path: '/api/saved-searches/:id',
    summary: 'Delete one of my saved searches (another person’s answers 404)',
    roles: 'admin, curator, researcher, dyer (own only)',
    params: idParams,
    responses: { 204: null },
  },
]);

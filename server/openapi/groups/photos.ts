import {
  colourParams,
  paletteColourUpdateSchema,
  palettesResponse,
  photoParams,
  photoResponse,
  photoUpdateSchema,
  rectSchema,
  referencePatchResponse,
  regionCreateSchema,
  regionListResponse,
  regionParams,
  regionSavedResponse,
  regionUpdateSchema,
} from '../../../shared/schemas/photo.ts';
import { defineRoutes } from '../registry.ts';

// Every photo route is for signed-in users; changes are the curators' (and admins').
const writers = 'curator, admin';

export default defineRoutes('photos', [
  { method: 'get', path: '/api/photos/:id', summary: 'One photo with its palettes and regions', roles: 'signed-in users', params: photoParams, responses: { 200: photoResponse } },
  { method: 'patch', path: '/api/photos/:id', summary: "Change a photo's caption or view", roles: writers, params: photoParams, body: photoUpdateSchema, responses: { 200: photoResponse } },
  { method: 'delete', path: '/api/photos/:id', summary: 'Remove a photo, its palettes, regions and files', roles: writers, params: photoParams, responses: { 204: null } },
  { method: 'get', path: '/api/photos/:id/regions', summary: "The photo's regions", roles: 'signed-in users', params: photoParams, responses: { 200: regionListResponse } },
  {
    method: 'post',
    path: '/api/photos/:id/regions',
    summary: 'Mark a region; the palettes it affects are recomputed',
    roles: writers,
    params: photoParams,
    body: regionCreateSchema,
    responses: { 201: regionSavedResponse },
  },
  {
    method: 'patch',
    path: '/api/photos/:id/regions/:regionId',
    summary: 'Change a region; the palettes it affects are recomputed',
    roles: writers,
    params: regionParams,
    body: regionUpdateSchema,
    responses: { 200: regionSavedResponse },
  },
  { method: 'delete', path: '/api/photos/:id/regions/:regionId', summary: 'Remove a region', roles: writers, params: regionParams, responses: { 200: palettesResponse } },
  {
    method: 'put',
    path: '/api/photos/:id/reference-patch',
    summary: 'Set the grey reference patch; every palette is recomputed with the correction',
    roles: writers,
    params: photoParams,
    body: rectSchema,
    responses: { 200: referencePatchResponse },
  },
  { method: 'delete', path: '/api/photos/:id/reference-patch', summary: 'Clear the reference patch and its correction', roles: writers, params: photoParams, responses: { 200: referencePatchResponse } },
  {
    method: 'patch',
    path: '/api/photos/:id/palette/:colourId',
    summary: 'Mark a palette colour as background (or not); the shares are recomputed',
    roles: writers,
    params: colourParams,
    body: paletteColourUpdateSchema,
    responses: { 200: palettesResponse },
  },
]);

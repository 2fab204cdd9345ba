import { idParams } from '../../../shared/schemas/common.ts';
import { photoUploadResponse } from '../../../shared/schemas/photo.ts';
import {
  dublinCoreSchema,
  pieceCreateSchema,
  pieceDetailResponse,
  pieceHistoryResponse,
  pieceListQuery,
  pieceListResponse,
  pieceResponse,
  pieceUpdateSchema,
} from '../../../shared/schemas/piece.ts';
import {
  fadingPairCreateSchema,
  fadingPairListResponse,
  fadingPairParams,
  fadingPairResponse,
} from '../../../shared/schemas/fading.ts';
import { defineRoutes } from '../registry.ts';

// Everything mounted on /api/pieces, in mount order: the per-piece exports, the catalogue, the piece's trials.
export default defineRoutes('pieces', [
  {
    method: 'get',
    path: '/api/pieces/:id/dublin-core.jsonld',
    summary: "The piece's Dublin Core record (JSON-LD, dcterms)",
    roles: 'researcher, curator, admin',
    params: idParams,
    responses: { 200: dublinCoreSchema },
  },
  {
    method: 'get',
    path: '/api/pieces/:id/palettes.csv',
    summary: "The piece's photo palettes as CSV (image estimates, D65/2°)",
    roles: 'anyone (visitors: published pieces only)',
    params: idParams,
    responses: {
      200: { contentType: 'text/csv', description: 'One row per palette colour of every photo of the piece' },
    },
  },
  {
    method: 'get',
    path: '/api/pieces/:id/masters.zip',
    summary: "The piece's master files in a ZIP with a SHA-256 manifest",
    roles: 'researcher, curator, admin',
    params: idParams,
    responses: {
      200: {
        contentType: 'application/zip',
        description: 'Masters stored uncompressed, manifest-sha256.txt in sha256sum -c form',
      },
    },
  },
  {
    method: 'get',
    path: '/api/pieces',
    summary: 'List pieces (25 a page unless asked), sorted and filtered',
    roles: 'anyone (visitors: published pieces only; deleted pieces: curator, admin)',
    query: pieceListQuery,
    responses: { 200: pieceListResponse },
  },
  {
    method: 'post',
    path: '/api/pieces',
    summary: 'Catalogue a new piece',
    roles: 'curator, admin',
    body: pieceCreateSchema,
    responses: { 201: pieceResponse },
  },
  {
    method: 'get',
    path: '/api/pieces/:id',
    summary: 'One piece with its photos, palettes and regions',
    roles: 'anyone (visitors: published pieces only)',
    params: idParams,
    responses: { 200: pieceDetailResponse },
  },
  {
    method: 'patch',
    path: '/api/pieces/:id',
    summary: 'Change a piece',
    roles: 'curator, admin',
    params: idParams,
    body: pieceUpdateSchema,
    responses: { 200: pieceResponse },
  },
  {
    method: 'delete',
    path: '/api/pieces/:id',
    summary: 'Delete a piece (soft delete, restorable)',
    roles: 'curator, admin',
    params: idParams,
    responses: { 204: null },
  },
  {
    method: 'post',
    path: '/api/pieces/:id/restore',
    summary: 'Restore a deleted piece',
    roles: 'admin',
    params: idParams,
    responses: { 200: pieceResponse },
  },
  {
    method: 'get',
    path: '/api/pieces/:id/history',
    summary: "The piece's history, newest first",
    roles: 'researcher, curator, admin',
    params: idParams,
    responses: { 200: pieceHistoryResponse },
  },
  {
    method: 'get',
    path: '/api/pieces/:id/fading-pairs',
    summary:
      "The piece's fading pairs: each faded area beside a protected one, with ΔE00, its components and the ISO 105-A05 grade",
    roles: 'signed-in users who may read the piece',
    params: idParams,
    responses: { 200: fadingPairListResponse },
  },
  {
    method: 'post',
    path: '/api/pieces/:id/fading-pairs',
    summary: 'Pair a faded area with a protected one (each a region of a photo of the piece, or a reading)',
    roles: 'curator, admin',
    params: idParams,
    body: fadingPairCreateSchema,
    responses: { 201: fadingPairResponse },
  },
  {
    method: 'delete',
    path: '/api/pieces/:id/fading-pairs/:pairId',
    summary: 'Remove a fading pair',
    roles: 'curator, admin',
    params: fadingPairParams,
    responses: { 204: null },
  },
  {
    method: 'post',
    path: '/api/pieces/:id/photos',
    summary:
      'Upload photos to a piece (multipart/form-data, field "photo", up to 20 files, each within MEDIA_MAX_BYTES and MEDIA_MAX_PIXELS: 2 GB and 1 gigapixel by default)',
    roles: 'curator, admin',
    params: idParams,
    responses: { 201: photoUploadResponse },
  },
]);

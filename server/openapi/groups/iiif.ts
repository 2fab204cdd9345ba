import {
  annotationPageSchema,
  iiifPhotoParams,
  iiifPieceParams,
  imageInfoSchema,
  manifestSchema,
} from '../../../shared/schemas/iiif.ts';
import { defineRoutes } from '../registry.ts';

// Mounted at /iiif, outside /api (server/app.ts). JSON answers are sent as application/ld+json with the
// IIIF or W3C profile, or as application/json to a client that asks only for that.
const readers = 'anyone (visitors: published pieces only)';

export default defineRoutes('iiif', [
  {
    method: 'get',
    path: '/iiif/photos/:photoId/info.json',
    summary: "Image API 3.0 info.json of a photo's level-0 tiles",
    roles: readers,
    params: iiifPhotoParams,
    responses: { 200: imageInfoSchema },
  },
  {
    method: 'get',
    path: '/iiif/photos/:photoId/annotations.json',
    summary: "The photo's regions as a W3C Web Annotation page",
    roles: readers,
    params: iiifPhotoParams,
    responses: { 200: annotationPageSchema },
  },
  {
    method: 'get',
    path: '/iiif/photos/:photoId',
    summary: "The image service's base URL: redirects to its info.json",
    roles: 'anyone',
    params: iiifPhotoParams,
    responses: { 303: { contentType: 'text/plain', description: 'See Other: Location is the photo’s info.json' } },
  },
  {
    method: 'get',
    path: '/iiif/photos/:photoId/{*tile}',
    summary: 'One level-0 tile, {region}/{size}/0/default.jpg or full/{w},{h}/0/default.jpg',
    roles: readers,
    params: iiifPhotoParams,
    responses: { 200: { contentType: 'image/jpeg', description: 'A JPEG tile' } },
  },
  {
    method: 'get',
    path: '/iiif/:pieceId/manifest.json',
    summary: 'Presentation API 3.0 manifest of a piece: one canvas per photo, regions as annotations',
    roles: readers,
    params: iiifPieceParams,
    responses: { 200: manifestSchema },
  },
]);

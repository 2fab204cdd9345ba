import { mediaParams } from '../../../shared/schemas/photo.ts';
import { defineRoutes } from '../registry.ts';

// Mounted at /media, outside /api (server/app.ts).
export default defineRoutes('media', [
  {
    method: 'get',
    path: '/media/photos/:id/:kind',
    summary: 'A photo file: thumb, display or master (the master as an attachment, EXIF untouched)',
    roles:
      'thumb, display: anyone (visitors: published pieces only); master: signed-in users, with GPS only curator, admin',
    params: mediaParams,
    responses: { 200: { contentType: 'image/*', description: 'The image file (the master in its uploaded format)' } },
  },
]);

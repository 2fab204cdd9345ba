import { defineRoutes } from '../registry.ts';
import { healthSchema } from '../../../shared/schemas/health.ts';

export default defineRoutes('health', [
  {
    method: 'get',
    path: '/api/health',
    summary:
      'Whether the server and its database answer, with the database round trip, the job backlog and the search indexes (503 with the same body when the database is down)',
    roles: 'anyone',
    responses: { 200: healthSchema },
  },
]);

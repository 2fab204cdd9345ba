import { defineRoutes } from '../registry.ts';
import { outboxPageSchema, outboxQuery } from '../../../shared/schemas/outbox.ts';

export default defineRoutes('outbox', [
  {
    method: 'get',
    path: '/api/outbox',
    summary: "The local mail catcher's messages, newest first (not mounted in production)",
    roles: 'admin',
    query: outboxQuery,
    responses: { 200: outboxPageSchema },
  },
]);

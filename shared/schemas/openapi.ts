import { z } from 'zod';
import '../messages.ts';

/** The OpenAPI document as served (GET /api/openapi.json); its content is checked by tests/api/openapi.test.ts. */
export const openApiDocumentSchema = z.object({
  openapi: z.string(),
  info: z.object({ title: z.string(), version: z.string() }),
  paths: z.record(z.string(), z.record(z.string(), z.unknown())),
  components: z.record(z.string(), z.unknown()),
});

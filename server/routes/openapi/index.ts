import { Router } from 'express';
import { openApiDocument } from '../../openapi/document.ts';

/** GET /api/openapi.json: the OpenAPI 3.1 document of every /api route (public; rendered at /api/docs/). */
export const openapiRouter = Router();

openapiRouter.get('/', (_req, res) => {
  res.json(openApiDocument());
});

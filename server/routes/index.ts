import { Router } from 'express';
import { healthRouter } from './health/index.ts';

/** Every API router, mounted under /api. */
export function apiRouter() {
  const router = Router();
  router.use('/health', healthRouter);
  return router;
}

import { Router } from 'express';
import { healthRouter } from './health/index.ts';
import { authRouter } from './auth/index.ts';

/** Every API router, mounted under /api. */
export function apiRouter() {
  const router = Router();
  router.use('/health', healthRouter);
  router.use('/auth', authRouter);
  return router;
}

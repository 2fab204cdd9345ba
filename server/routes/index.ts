import { Router } from 'express';
import { healthRouter } from './health/index.ts';
import { authRouter } from './auth/index.ts';
import { searchRouter } from './search/index.ts';

/** Every API router, mounted under /api. */
export function apiRouter() {
  const router = Router();
  router.use('/health', healthRouter);
  router.use('/auth', authRouter);
  router.use('/search', searchRouter);
  return router;
}

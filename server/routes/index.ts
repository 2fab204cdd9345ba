import { Router } from 'express';
import { healthRouter } from './health/index.ts';
import { authRouter } from './auth/index.ts';
import { piecesRouter } from './pieces/index.ts';
import { photosRouter } from './photos/index.ts';
import { vocabulariesRouter } from './vocabularies/index.ts';

/** Every API router, mounted under /api. */
export function apiRouter() {
  const router = Router();
  router.use('/health', healthRouter);
  router.use('/auth', authRouter);
  router.use('/pieces', piecesRouter);
  router.use('/photos', photosRouter);
  router.use('/vocabularies', vocabulariesRouter);
  return router;
}

import { Router } from 'express';
import { healthRouter } from './health/index.ts';
import { authRouter } from './auth/index.ts';
import { batchesRouter } from './batches/index.ts';
import { seriesRouter } from './series/index.ts';
import { trialCardsRouter } from './trial-cards/index.ts';
import { chemicalsRouter, dyestuffsRouter } from './reference/index.ts';

/** Every API router, mounted under /api. */
export function apiRouter() {
  const router = Router();
  router.use('/health', healthRouter);
  router.use('/auth', authRouter);
  router.use('/batches', batchesRouter);
  router.use('/series', seriesRouter);
  router.use('/trials', trialCardsRouter);
  router.use('/chemicals', chemicalsRouter);
  router.use('/dyestuffs', dyestuffsRouter);
  return router;
}

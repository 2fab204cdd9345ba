import { Router } from 'express';
import { healthRouter } from './health/index.ts';
import { authRouter } from './auth/index.ts';
import { jobsRouter } from './jobs/index.ts';
import { fixityRouter } from './admin-fixity/index.ts';
import { importRouter } from './import/index.ts';
import { exportRouter, pieceExportRouter } from './export/index.ts';

/** Every API router, mounted under /api. */
export function apiRouter() {
  const router = Router();
  router.use('/health', healthRouter);
  router.use('/auth', authRouter);
  router.use('/jobs', jobsRouter);
  router.use('/admin/fixity', fixityRouter);
  router.use('/import', importRouter);
  router.use('/export', exportRouter);
  // Per-piece exports (Dublin Core, masters ZIP) beside the catalogue's own /pieces routes.
  router.use('/pieces', pieceExportRouter);
  return router;
}

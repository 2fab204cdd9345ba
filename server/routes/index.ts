import { tusHandler } from './uploads/index.ts';
import { requireUser } from '../http/auth.ts';
import { Router } from 'express';
import { isProduction } from '../env.ts';
import { healthRouter } from './health/index.ts';
import { openapiRouter } from './openapi/index.ts';
import { authRouter } from './auth/index.ts';
import { chemicalsRouter, dyestuffsRouter } from './reference/index.ts';
import { invitationsRouter } from './invitations/index.ts';
import { teamRouter } from './team/index.ts';
import { outboxRouter } from './outbox/index.ts';
import { jobsRouter } from './jobs/index.ts';
import { fixityRouter } from './admin-fixity/index.ts';
import { importRouter } from './import/index.ts';
import { exportRouter, pieceExportRouter } from './export/index.ts';
import { piecesRouter } from './pieces/index.ts';
import { photosRouter } from './photos/index.ts';
import { vocabulariesRouter } from './vocabularies/index.ts';
import { pieceTrialsRouter, trialsRouter } from './trials/index.ts';
import { colourRouter } from './colour/index.ts';
import { batchesRouter } from './batches/index.ts';
import { seriesRouter } from './series/index.ts';
import { trialCardsRouter } from './trial-cards/index.ts';
import { searchRouter } from './search/index.ts';
import { suggestionsRouter } from './suggestions/index.ts';
import { analysesRouter, pieceRecordsRouter } from './records/index.ts';
import { homeRouter } from './home/index.ts';
import { savedSearchesRouter } from './saved-searches/index.ts';

/** Every API router, mounted under /api. Each route also needs a row in tests/support/route-matrix.ts. */
export function apiRouter() {
  const router = Router();
  router.use('/health', healthRouter);
  router.use('/openapi.json', openapiRouter);
  router.use('/chemicals', chemicalsRouter);
  router.use('/dyestuffs', dyestuffsRouter);
  router.use('/auth', authRouter());
  router.use('/invitations', invitationsRouter);
  router.use('/team', teamRouter);
  // The outbox shows the local mail catcher's messages; there is none in production.
  if (!isProduction) router.use('/outbox', outboxRouter);
  router.use('/jobs', jobsRouter);
  // tus 1.0 resumable uploads: a protocol of its own (not JSON), handled by @tus/server (server/routes/uploads/).
  router.use('/uploads', requireUser, tusHandler);
  router.use('/admin/fixity', fixityRouter);
  router.use('/import', importRouter);
  router.use('/export', exportRouter);
  // Per-piece exports (Dublin Core, masters ZIP) beside the catalogue's own /pieces routes.
  router.use('/pieces', pieceExportRouter);
  router.use('/pieces', piecesRouter);
  router.use('/pieces', pieceTrialsRouter);
  router.use('/pieces', pieceRecordsRouter);
  router.use('/analyses', analysesRouter);
  router.use('/photos', photosRouter);
  router.use('/vocabularies', vocabulariesRouter);
  router.use('/trials', trialsRouter);
  router.use('/colour', colourRouter);
  router.use('/batches', batchesRouter);
  router.use('/series', seriesRouter);
  router.use('/trials', trialCardsRouter);
  router.use('/search', searchRouter);
  router.use('/suggestions', suggestionsRouter);
  router.use('/home', homeRouter);
  router.use('/saved-searches', savedSearchesRouter);
  return router;
}

import { Router, type RequestHandler } from 'express';
import { mayCarryGps } from '../../presenters/photo.ts';
import { idParams } from '../../../shared/schemas/common.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden } from '../../http/errors.ts';
import { parseParams, parseQuery } from '../../http/validate.ts';
import { Photo } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { baseUrl, readablePiece } from '../../iiif/access.ts';
import { writePiecesCsv } from '../../export/pieces-csv.ts';
import { writeTrialsCsv } from '../../export/trials-csv.ts';
import { writePalettesCsv } from '../../export/palettes-csv.ts';
import { writeShadeCsv } from '../../export/shade-csv.ts';
import { shadeQuerySchema } from '../../../shared/schemas/search.ts';
import { dublinCore } from '../../export/dublin-core.ts';
import { writeMastersZip } from '../../export/masters-zip.ts';

const mayExport: RequestHandler = (req, _res, next) => (can(actorOf(req), 'export:run') ? next() : next(forbidden()));
const stamp = () => new Date().toISOString().slice(0, 10);
const safeName = (s: string) => s.replace(/[^\p{L}\p{N}._-]+/gu, '_');

/** /api/export: whole-archive CSVs. */
export const exportRouter = Router();

exportRouter.get('/pieces.csv', requireUser, mayExport, async (_req, res) => {
  res.type('text/csv; charset=utf-8').attachment(`tinctoria-pieces-${stamp()}.csv`);
  await writePiecesCsv(res);
});

// Whoever may read trials may take them away as a spreadsheet: the CSV holds nothing the trial pages do not show.
const mayReadTrials: RequestHandler = (req, _res, next) =>
  can(actorOf(req), 'trial:read') ? next() : next(forbidden());

exportRouter.get('/trials.csv', requireUser, mayReadTrials, async (_req, res) => {
  res.type('text/csv; charset=utf-8').attachment(`tinctoria-trials-${stamp()}.csv`);
  await writeTrialsCsv(res);
});

// Palettes follow the pieces' read rule (visitors: published pieces only; deleted pieces are left out).
exportRouter.get('/palettes.csv', async (req, res) => {
  const where = actorOf(req) ? {} : { status: 'published' as const };
  res.type('text/csv; charset=utf-8').attachment(`tinctoria-palettes-${stamp()}.csv`);
  await writePalettesCsv(res, { ...where, deletedAt: null });
});

// The same parameters as GET /api/search/shade, and the same visibility (decided in the search service).
exportRouter.get('/shade.csv', async (req, res) => {
  const input = parseQuery(shadeQuerySchema, req);
  const actor = actorOf(req);
  if (!can(actor, 'search:run')) throw forbidden();
  const onePage = req.query.page !== undefined || req.query.limit !== undefined;
  res
    .type('text/csv; charset=utf-8')
    .attachment(
      `tinctoria-shade-${(input.hex ?? `L${input.L}a${input.a}b${input.b}`).replace('#', '')}-${stamp()}.csv`,
    );
  await writeShadeCsv(res, actor, input, onePage);
});

/** /api/pieces/:id/…: one piece's exports. The piece is loaded (404 when unreadable) before the role check. */
export const pieceExportRouter = Router();

pieceExportRouter.get('/:id/dublin-core.jsonld', requireUser, async (req, res) => {
  const piece = await readablePiece(actorOf(req), parseParams(idParams, req).id);
  if (!can(actorOf(req), 'export:run')) throw forbidden();
  res.type('application/ld+json').send(JSON.stringify(dublinCore(baseUrl(req), piece), null, 2));
});

pieceExportRouter.get('/:id/palettes.csv', async (req, res) => {
  const piece = await readablePiece(actorOf(req), parseParams(idParams, req).id);
  res.type('text/csv; charset=utf-8').attachment(`${safeName(piece.accessionNumber)}-palettes.csv`);
  await writePalettesCsv(res, { id: piece.id });
});

pieceExportRouter.get('/:id/masters.zip', requireUser, async (req, res) => {
  const piece = await readablePiece(actorOf(req), parseParams(idParams, req).id);
  if (!can(actorOf(req), 'export:run')) throw forbidden();
  const photos = await Photo.findAll({ where: { pieceId: piece.id }, order: [['id', 'ASC']] });
  res.type('application/zip').attachment(`${safeName(piece.accessionNumber)}-masters.zip`);
  // Masters with GPS only for those the policy lets see it (photo:master); the manifest lists the rest as withheld.
  const actor = actorOf(req);
  await writeMastersZip(res, piece, photos, (photo) => can(actor, 'photo:master', { hasGps: mayCarryGps(photo) }));
});

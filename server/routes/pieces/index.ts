import { Router } from 'express';
import { idParams } from '../../../shared/schemas/common.ts';
import { pieceCreateSchema, pieceListQuery, pieceUpdateSchema } from '../../../shared/schemas/piece.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden, notFound, unauthorized } from '../../http/errors.ts';
import { parseBody, parseParams, parseQuery } from '../../http/validate.ts';
import { AuditEvent, User, sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { presentAuditEvent, presentPiece, presentPieceRow, pieceRecord } from '../../presenters/piece.ts';
import { presentPhoto } from '../../presenters/photo.ts';
import { createPiece, deletePiece, restorePiece, updatePiece } from '../../services/pieces.ts';
import { listPieces, loadPhotosOf, loadReadablePiece } from './load.ts';
import { cachedList } from './list-cache.ts';
import { photoUploadRouter } from '../photos/upload.ts';
import { fadingRouter } from './fading.ts';
import { lightDoseOf } from '../../services/records/displays.ts';

export const piecesRouter = Router();

piecesRouter.get('/', async (req, res) => {
  const actor = actorOf(req);
  const q = parseQuery(pieceListQuery, req);
  if (q.deleted && !actor) throw unauthorized();
  if (q.deleted && !can(actor, 'piece:read', { deleted: true }))
    throw forbidden('Only curators and admins see deleted pieces.');
  const audience = can(actor, 'piece:list-drafts') ? 'staff' : 'public';
  const { json, etag } = await cachedList(audience, q, async () => {
    const { rows, total, firstPhoto } = await listPieces(actor, q);
    return {
      items: rows.map((p) => presentPieceRow(p, firstPhoto.get(p.id) ?? null)),
      total,
      page: q.page,
      pageSize: q.pageSize,
    };
  });
  // Sent as cached, already serialised (list-cache.ts); Express still answers 304 when the tag matches.
  res.set('ETag', etag).type('json').send(json);
});

piecesRouter.post('/', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const input = parseBody(pieceCreateSchema, req);
  if (!can(actor, 'piece:create')) throw forbidden();
  if (input.status === 'published' && !can(actor, 'piece:publish'))
    throw forbidden('Your role may not publish pieces.');
  const piece = await sequelize.transaction((transaction) => createPiece({ actor, transaction, input }));
  res.status(201).json({ piece: presentPiece(piece, actor) });
});

piecesRouter.get('/:id', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const piece = await loadReadablePiece(actor, id);
  const photos = await loadPhotosOf(piece.id);
  const lightDose = can(actor, 'display:read') ? await lightDoseOf(piece) : null;
  res.json({
    piece: presentPiece(piece, actor),
    photos: photos.map((x) => presentPhoto(x.photo, actor, x)),
    lightDose,
  });
});

piecesRouter.patch('/:id', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const changes = parseBody(pieceUpdateSchema, req);
  const piece = await loadReadablePiece(actor, id);
  if (piece.deletedAt) throw notFound('Piece');
  if (!can(actor, 'piece:update', pieceRecord(piece))) throw forbidden();
  if (changes.status && changes.status !== piece.status && !can(actor, 'piece:publish', pieceRecord(piece)))
    throw forbidden('Your role may not publish pieces.');
  const updated = await sequelize.transaction((transaction) =>
    updatePiece({ actor, transaction, input: { piece, changes } }),
  );
  res.json({ piece: presentPiece(updated, actor) });
});

piecesRouter.delete('/:id', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const piece = await loadReadablePiece(actor, id);
  if (piece.deletedAt) throw notFound('Piece');
  if (!can(actor, 'piece:delete', pieceRecord(piece))) throw forbidden();
  await sequelize.transaction((transaction) => deletePiece({ actor, transaction, input: { piece } }));
  res.status(204).end();
});

piecesRouter.post('/:id/restore', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const piece = await loadReadablePiece(actor, id);
  if (!can(actor, 'piece:restore', pieceRecord(piece))) throw forbidden('Only an admin may restore a deleted piece.');
  const restored = await sequelize.transaction((transaction) => restorePiece({ actor, transaction, input: { piece } }));
  res.json({ piece: presentPiece(restored, actor) });
});

piecesRouter.get('/:id/history', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const piece = await loadReadablePiece(actor, id);
  if (!can(actor, 'piece:history', pieceRecord(piece))) throw forbidden();
  const events = await AuditEvent.findAll({
    where: { entity: 'piece', entityId: piece.id },
    include: [{ model: User, as: 'actor', attributes: ['id', 'name'] }],
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  res.json({ items: events.map(presentAuditEvent) });
});

piecesRouter.use('/:id/photos', photoUploadRouter);
piecesRouter.use('/:id/fading-pairs', fadingRouter);

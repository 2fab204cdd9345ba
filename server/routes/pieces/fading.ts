import { Router } from 'express';
import { idParams } from '../../../shared/schemas/common.ts';
import { fadingPairCreateSchema, fadingPairParams } from '../../../shared/schemas/fading.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden, notFound } from '../../http/errors.ts';
import { parseBody, parseParams } from '../../http/validate.ts';
import { FadingPair, sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { pieceRecord } from '../../presenters/piece.ts';
import { addFadingPair, fadingCandidates, presentFadingPair, removeFadingPair } from '../../services/fading-pairs.ts';
import { loadReadablePiece } from './load.ts';

/** Fading pairs of a piece: a faded area beside a protected one (issue 17, point 5). */
export const fadingRouter = Router({ mergeParams: true });
fadingRouter.use(requireUser);

fadingRouter.get('/', async (req, res) => {
  const piece = await loadReadablePiece(actorOf(req), parseParams(idParams, req).id);
  const pairs = await FadingPair.findAll({ where: { pieceId: piece.id }, order: [['id', 'ASC']] });
  res.json({ items: await Promise.all(pairs.map(presentFadingPair)), candidates: await fadingCandidates(piece.id) });
});

fadingRouter.post('/', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const input = parseBody(fadingPairCreateSchema, req);
  const piece = await loadReadablePiece(actor, id);
  if (piece.deletedAt) throw notFound('Piece');
  if (!can(actor, 'piece:update', pieceRecord(piece))) throw forbidden();
  const pair = await sequelize.transaction((transaction) =>
    addFadingPair({ actor, transaction, input: { piece, pair: input } }),
  );
  res.status(201).json({ pair: await presentFadingPair(pair) });
});

fadingRouter.delete('/:pairId', async (req, res) => {
  const actor = actorOf(req);
  const { id, pairId } = parseParams(fadingPairParams, req);
  const piece = await loadReadablePiece(actor, id);
  if (!can(actor, 'piece:update', pieceRecord(piece))) throw forbidden();
  const pair = await FadingPair.findOne({ where: { id: pairId, pieceId: piece.id } });
  if (!pair) throw notFound('Fading pair');
  await sequelize.transaction((transaction) => removeFadingPair({ actor, transaction, input: { piece, pair } }));
  res.status(204).end();
});

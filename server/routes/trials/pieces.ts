import { Router } from 'express';
import { idParams } from '../../../shared/schemas/common.ts';
import { childParams, measurementSchema, pieceTrialsQuery, trialCreateSchema } from '../../../shared/schemas/trial.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden, notFound } from '../../http/errors.ts';
import { parseBody, parseParams, parseQuery } from '../../http/validate.ts';
import { ColourMeasurement, sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { presentMeasurement } from '../../presenters/trial.ts';
import { addPieceReading, removePieceReading } from '../../services/piece-readings.ts';
import { pieceMeasurements } from '../../services/trials/colour.ts';
import { withTrialCode } from '../../services/trials/code.ts';
import { notifyCurator } from '../../services/trials/notify.ts';
import { createTrial } from '../../services/trials/trials.ts';
import { loadReadablePiece } from '../pieces/load.ts';
import { listTrials, loadReadableTrial, presentTrialDetail } from './load.ts';

/** /api/pieces/:id/trials: the reproductions of one piece (mounted beside the pieces router). */
export const pieceTrialsRouter = Router();

pieceTrialsRouter.get('/:id/trials', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const { page, pageSize } = parseQuery(pieceTrialsQuery, req);
  const piece = await loadReadablePiece(actor, id);
  const [list, measurements] = await Promise.all([
    listTrials(actor, { pieceId: piece.id, page, pageSize }),
    pieceMeasurements(piece.id),
  ]);
  // The instrument readings of the original, offered as trial targets beside its regions and palettes.
  res.json({
    ...list,
    piece: { id: piece.id, accessionNumber: piece.accessionNumber, title: piece.title },
    targets: { measurements: measurements.map(presentMeasurement) },
  });
});

/** Attach a new trial to the piece; the curator who catalogued it is told by e-mail. */
pieceTrialsRouter.post('/:id/trials', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const piece = await loadReadablePiece(actor, id);
  if (piece.deletedAt) throw notFound('Piece');
  const input = trialCreateSchema.parse({ ...req.body, pieceId: piece.id });
  if (!can(actor, 'trial:create')) throw forbidden('Only dyers record trials.');
  const created = await withTrialCode((transaction) => createTrial({ actor, transaction, input }));
  const notified = await notifyCurator(created, actor);
  res
    .status(201)
    .json({ trial: await presentTrialDetail(actor, await loadReadableTrial(actor, created.id)), notified });
});

/** A reading of the original itself (L*a*b* or a spectrum), by those who measure pieces. */
pieceTrialsRouter.post('/:id/measurements', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const input = parseBody(measurementSchema, req);
  const piece = await loadReadablePiece(actor, id);
  if (piece.deletedAt) throw notFound('Piece');
  if (!can(actor, 'measurement:create')) throw forbidden('Only curators and researchers record readings of a piece.');
  const m = await sequelize.transaction((transaction) =>
    addPieceReading({ actor, transaction, input: { ...input, piece } }),
  );
  res.status(201).json({ measurement: presentMeasurement(m) });
});

pieceTrialsRouter.delete('/:id/measurements/:childId', requireUser, async (req, res) => {
  const actor = actorOf(req);
  const { id, childId } = parseParams(childParams, req);
  const piece = await loadReadablePiece(actor, id);
  if (!can(actor, 'measurement:create')) throw forbidden('Only curators and researchers remove readings of a piece.');
  const measurement = await ColourMeasurement.findOne({ where: { id: childId, pieceId: piece.id, trialId: null } });
  if (!measurement) throw notFound('Reading');
  await sequelize.transaction((transaction) =>
    removePieceReading({ actor, transaction, input: { piece, measurement } }),
  );
  res.status(204).end();
});

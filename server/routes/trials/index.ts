import express, { Router } from 'express';
import { Transaction } from 'sequelize';
import { idParams } from '../../../shared/schemas/common.ts';
import {
  childParams,
  measurementSchema,
  stepsSchema,
  substitutionSchema,
  trialCreateSchema,
  trialListQuerySchema,
  trialUpdateSchema,
} from '../../../shared/schemas/trial.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { badRequest, forbidden, notFound } from '../../http/errors.ts';
import { parseBody, parseParams, parseQuery } from '../../http/validate.ts';
import { ColourMeasurement, sequelize, Substitution } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { presentMeasurement } from '../../presenters/trial.ts';
import { withTrialCode } from '../../services/trials/code.ts';
import { addMeasurement, importMeasurements, removeMeasurement } from '../../services/trials/measurements.ts';
import { notifyCurator } from '../../services/trials/notify.ts';
import {
  addSubstitution,
  createTrial,
  deleteTrial,
  removeSubstitution,
  replaceSteps,
  updateSubstitution,
  updateTrial,
} from '../../services/trials/trials.ts';
import { listTrials, loadReadableTrial, loadWritableTrial, presentTrialDetail } from './load.ts';
import { trialPhotosRouter } from './photos.ts';
import { pieceTrialsRouter } from './pieces.ts';

export { pieceTrialsRouter };

// Saving a recipe changes bath ledgers. Read committed: the ledger read after a bath row's lock sees every draw
// committed before it (a repeatable-read snapshot taken at the first read would not), and no gap locks make
// saves of different trials deadlock on their step inserts.
const drawing = { isolationLevel: Transaction.ISOLATION_LEVELS.READ_COMMITTED };
export const trialsRouter = Router();

// Every trial route is for signed-in people only: visitors get 401 before anything is looked up.
trialsRouter.use(requireUser);

trialsRouter.get('/', async (req, res) => {
  const q = parseQuery(trialListQuerySchema, req);
  res.json(await listTrials(actorOf(req), q));
});

trialsRouter.post('/', async (req, res) => {
  const actor = actorOf(req);
  const input = parseBody(trialCreateSchema, req);
  if (!can(actor, 'trial:create')) throw forbidden('Only dyers record trials.');
  const created = await withTrialCode((transaction) => createTrial({ actor, transaction, input }));
  const notified = await notifyCurator(created, actor);
  const trial = await loadReadableTrial(actor, created.id);
  res.status(201).json({ trial: await presentTrialDetail(actor, trial), notified });
});

trialsRouter.get('/:id', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  res.json({ trial: await presentTrialDetail(actor, await loadReadableTrial(actor, id)) });
});

trialsRouter.patch('/:id', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const input = parseBody(trialUpdateSchema, req);
  const trial = await loadWritableTrial(actor, id);
  const before = trial.pieceId;
  await sequelize.transaction((transaction) => updateTrial({ actor, transaction, input: { ...input, trial } }));
  const notified = trial.pieceId != null && trial.pieceId !== before ? await notifyCurator(trial, actor) : false;
  res.json({ trial: await presentTrialDetail(actor, await loadReadableTrial(actor, id)), notified });
});

trialsRouter.delete('/:id', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const trial = await loadReadableTrial(actor, id);
  if (!can(actor, 'trial:delete', { ownerId: trial.dyerId }))
    throw forbidden('Only the dyer who keeps this trial may delete it.');
  await sequelize.transaction(drawing, (transaction) => deleteTrial({ actor, transaction, input: { trial } }));
  res.status(204).end();
});

/** Replace the whole ordered recipe; the answer carries any safety warnings. */
trialsRouter.put('/:id/steps', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const input = parseBody(stepsSchema, req);
  const trial = await loadWritableTrial(actor, id);
  await sequelize.transaction(drawing, (transaction) =>
    replaceSteps({ actor, transaction, input: { ...input, trial } }),
  );
  const detail = await presentTrialDetail(actor, trial);
  res.json({ trial: detail, warnings: detail.warnings, warning: detail.warnings.length > 0 });
});

trialsRouter.post('/:id/substitutions', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const input = parseBody(substitutionSchema, req);
  const trial = await loadWritableTrial(actor, id);
  const sub = await sequelize.transaction((transaction) =>
    addSubstitution({ actor, transaction, input: { ...input, trial } }),
  );
  const detail = await presentTrialDetail(actor, trial);
  res
    .status(201)
    .json({ substitution: detail.substitutions.find((s) => s.id === sub.id), metalLoad: detail.metalLoad });
});

async function loadSubstitution(trialId: number, id: number) {
  const sub = await Substitution.findOne({ where: { id, trialId } });
  if (!sub) throw notFound('Substitution');
  return sub;
}

trialsRouter.put('/:id/substitutions/:childId', async (req, res) => {
  const actor = actorOf(req);
  const { id, childId } = parseParams(childParams, req);
  const input = parseBody(substitutionSchema, req);
  const trial = await loadWritableTrial(actor, id);
  const substitution = await loadSubstitution(trial.id, childId);
  await sequelize.transaction((transaction) =>
    updateSubstitution({ actor, transaction, input: { ...input, substitution } }),
  );
  const detail = await presentTrialDetail(actor, trial);
  res.json({ substitution: detail.substitutions.find((s) => s.id === childId), metalLoad: detail.metalLoad });
});

trialsRouter.delete('/:id/substitutions/:childId', async (req, res) => {
  const actor = actorOf(req);
  const { id, childId } = parseParams(childParams, req);
  const trial = await loadWritableTrial(actor, id);
  const substitution = await loadSubstitution(trial.id, childId);
  await sequelize.transaction((transaction) => removeSubstitution({ actor, transaction, input: { substitution } }));
  res.status(204).end();
});

trialsRouter.post('/:id/measurements', async (req, res) => {
  const actor = actorOf(req);
  const { id } = parseParams(idParams, req);
  const input = parseBody(measurementSchema, req);
  const trial = await loadWritableTrial(actor, id);
  const m = await sequelize.transaction((transaction) =>
    addMeasurement({ actor, transaction, input: { ...input, trial } }),
  );
  res.status(201).json({ measurement: presentMeasurement(m) });
});

trialsRouter.delete('/:id/measurements/:childId', async (req, res) => {
  const actor = actorOf(req);
  const { id, childId } = parseParams(childParams, req);
  const trial = await loadWritableTrial(actor, id);
  const measurement = await ColourMeasurement.findOne({ where: { id: childId, trialId: trial.id } });
  if (!measurement) throw notFound('Measurement');
  await sequelize.transaction((transaction) => removeMeasurement({ actor, transaction, input: { measurement } }));
  res.status(204).end();
});

/** A CSV of readings: all rows, or none with the bad lines listed. */
trialsRouter.post(
  '/:id/measurements/import',
  express.text({ type: ['text/csv', 'text/plain', 'application/csv'], limit: '2mb' }),
  async (req, res) => {
    const actor = actorOf(req);
    const { id } = parseParams(idParams, req);
    const trial = await loadWritableTrial(actor, id);
    // The file as the body (text/csv), or { csv: "…" } as JSON.
    const csv: unknown = typeof req.body === 'string' ? req.body : req.body?.csv;
    if (typeof csv !== 'string' || !csv.trim())
      throw badRequest('Send the CSV file as the request body (Content-Type text/csv) or as { "csv": "…" }.', {
        fields: { csv: ['Attach a CSV file of readings'] },
      });
    const rows = await sequelize.transaction((transaction) =>
      importMeasurements({ actor, transaction, input: { trial, csv } }),
    );
    res.status(201).json({ imported: rows.length, measurements: rows.map(presentMeasurement) });
  },
);

trialsRouter.use('/:id/photos', trialPhotosRouter);

import { Router, type Request } from 'express';
import {
  batchCreateSchema,
  batchEventSchema,
  batchListQuery,
  batchUpdateSchema,
} from '../../../shared/schemas/batches.ts';
import { idParams, toPaged } from '../../../shared/schemas/common.ts';
import { abilities, actorOf, requireUser } from '../../http/auth.ts';
import { forbidden, notFound } from '../../http/errors.ts';
import { parseBody, parseParams, parseQuery } from '../../http/validate.ts';
import { Op } from 'sequelize';
import { Chemical, MordantBatch, Trial, sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { presentChemical } from '../../presenters/reference.ts';
import { presentBatch, presentBatchEvent, presentBatchSummary } from '../../presenters/batches.ts';
import {
  addEvent,
  createBatch,
  dueForCheck,
  figuresFor,
  loadEvents,
  thickenerIds,
  updateBatch,
} from '../../services/batches/index.ts';
import { batchLabelPdf } from '../../pdf/labels.ts';
import { sendPdf } from '../../pdf/send.ts';

export const batchesRouter = Router();
batchesRouter.use(requireUser);

const today = () => new Date().toISOString().slice(0, 10);
const record = (b: MordantBatch) => ({ ownerId: b.madeById });

async function load(req: Request) {
  const { id } = parseParams(idParams, req);
  const batch = await MordantBatch.findByPk(id);
  if (!batch || !can(actorOf(req), 'batch:read', record(batch))) throw notFound('Batch');
  return batch;
}

async function full(req: Request, batch: MordantBatch) {
  const events = await loadEvents(batch.id);
  const [parent, children] = await Promise.all([
    batch.parentId ? MordantBatch.findByPk(batch.parentId, { attributes: ['id', 'code'] }) : null,
    MordantBatch.findAll({
      where: { parentId: batch.id },
      attributes: ['id', 'code', 'name'],
      order: [['code', 'ASC']],
    }),
  ]);
  const chemIds = [...batch.ingredients, ...events.flatMap((e) => e.additions ?? [])]
    .filter((i) => i.kind === 'chemical')
    .map((i) => i.refId);
  const chems = chemIds.length
    ? await Chemical.findAll({ where: { id: { [Op.in]: [...new Set(chemIds)] } }, order: [['name', 'ASC']] })
    : [];
  const trialIds = [...new Set(events.flatMap((e) => (e.trialId ? [e.trialId] : [])))];
  const trials = trialIds.length
    ? await Trial.findAll({ where: { id: { [Op.in]: trialIds } }, attributes: ['id', 'code'] })
    : [];
  return presentBatch(batch, figuresFor(batch, events, await thickenerIds()), events, {
    trialCodes: new Map(trials.map((t) => [t.id, t.code])),
    cautions: chems.map(presentChemical),
    parent: parent ? { id: parent.id, code: parent.code } : null,
    children: children.map((c) => ({ id: c.id, code: c.code, name: c.name })),
    abilities: abilities(actorOf(req), ['batch:update', 'batch-event:create'] as const, record(batch)),
  });
}

batchesRouter.get('/', async (req, res) => {
  const q = parseQuery(batchListQuery, req);
  if (!can(actorOf(req), 'batch:read')) throw forbidden();
  const where = {
    ...(q.status ? { status: q.status } : {}),
    ...(q.kind ? { kind: q.kind } : {}),
    ...(q.due ? dueForCheck(today()) : {}),
  };
  const { rows, count } = await MordantBatch.findAndCountAll({
    where,
    order: [['code', 'ASC']],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  const thick = await thickenerIds();
  const items = await Promise.all(
    rows.map(async (b) => presentBatchSummary(b, figuresFor(b, await loadEvents(b.id), thick))),
  );
  res.json(toPaged(items, count, q.page, q.pageSize));
});

batchesRouter.post('/', async (req, res) => {
  const input = parseBody(batchCreateSchema, req);
  const actor = actorOf(req)!;
  if (!can(actor, 'batch:create')) throw forbidden();
  const batch = await sequelize.transaction((transaction) => createBatch({ actor, transaction, input }));
  res.status(201).json(await full(req, batch));
});

batchesRouter.get('/:id', async (req, res) => {
  res.json(await full(req, await load(req)));
});

batchesRouter.patch('/:id', async (req, res) => {
  const input = parseBody(batchUpdateSchema, req);
  const batch = await load(req);
  const actor = actorOf(req)!;
  if (!can(actor, 'batch:update', record(batch))) throw forbidden();
  await sequelize.transaction((transaction) => updateBatch({ actor, transaction, input, batch }));
  res.json(await full(req, batch));
});

batchesRouter.post('/:id/events', async (req, res) => {
  const input = parseBody(batchEventSchema, req);
  const batch = await load(req);
  const actor = actorOf(req)!;
  if (!can(actor, 'batch-event:create', record(batch))) throw forbidden();
  const { batch: updated, event } = await addEvent({ actor, input, batchId: batch.id });
  res.status(201).json({ event: presentBatchEvent(event), batch: await full(req, updated) });
});

batchesRouter.get('/:id/label.pdf', async (req, res) => {
  const batch = await load(req);
  sendPdf(res, `${batch.code}-label.pdf`, await batchLabelPdf([batch]));
});

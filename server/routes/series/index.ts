import { Router, type Request } from 'express';
import {
  seriesCreateSchema,
  seriesListQuery,
  seriesPreviewSchema,
  seriesUpdateSchema,
} from '../../../shared/schemas/series.ts';
import { idParams, toPaged } from '../../../shared/schemas/common.ts';
import { abilities, actorOf, requireUser } from '../../http/auth.ts';
import { forbidden, notFound, unprocessable } from '../../http/errors.ts';
import { parseBody, parseParams, parseQuery } from '../../http/validate.ts';
import { RecipeStep, Trial, TrialSeries, sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { presentSeries, presentSeriesSummary } from '../../presenters/series.ts';
import { createSeries, createSeriesTrials, updateSeries } from '../../services/series/index.ts';
import { expand } from '../../services/series/plan.ts';
import { withTrialCode } from '../../services/trials/code.ts';
import { loadCards } from '../../pdf/card-data.ts';
import { cardsPdf } from '../../pdf/cards.ts';
import { hazardsFor, labelsPdf } from '../../pdf/labels.ts';
import { sendPdf } from '../../pdf/send.ts';

export const seriesRouter = Router();
seriesRouter.use(requireUser);

const record = (s: TrialSeries) => ({ ownerId: s.ownerId });

async function load(req: Request) {
  const { id } = parseParams(idParams, req);
  const s = await TrialSeries.findByPk(id);
  if (!s || !can(actorOf(req), 'series:read', record(s))) throw notFound('Series');
  return s;
}
const trialsOf = (s: TrialSeries) => Trial.findAll({ where: { seriesId: s.id }, order: [['code', 'ASC']] });
const full = async (req: Request, s: TrialSeries) =>
  presentSeries(s, await trialsOf(s), abilities(actorOf(req), ['series:update', 'trial:create'] as const, record(s)));

seriesRouter.get('/', async (req, res) => {
  const q = parseQuery(seriesListQuery, req);
  const { rows, count } = await TrialSeries.findAndCountAll({
    order: [['code', 'ASC']],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
  });
  res.json(toPaged(rows.map(presentSeriesSummary), count, q.page, q.pageSize));
});

/** Cells a set of factors would make, before anything is saved. */
seriesRouter.post('/preview', async (req, res) => {
  const { factors } = parseBody(seriesPreviewSchema, req);
  if (new Set(factors.map((f) => f.name)).size !== factors.length)
    throw unprocessable('Each factor needs its own name.', { fields: { factors: ['Two factors share a name'] } });
  const cells = expand(factors);
  res.json({ count: cells.length, cells: cells.slice(0, 500) });
});

seriesRouter.post('/', async (req, res) => {
  const input = parseBody(seriesCreateSchema, req);
  const actor = actorOf(req)!;
  if (!can(actor, 'series:create')) throw forbidden();
  const s = await sequelize.transaction((transaction) => createSeries({ actor, transaction, input }));
  res.status(201).json(await full(req, s));
});

seriesRouter.get('/:id', async (req, res) => res.json(await full(req, await load(req))));

seriesRouter.patch('/:id', async (req, res) => {
  const input = parseBody(seriesUpdateSchema, req);
  const s = await load(req);
  const actor = actorOf(req)!;
  if (!can(actor, 'series:update', record(s))) throw forbidden();
  await sequelize.transaction((transaction) => updateSeries({ actor, transaction, input, series: s }));
  res.json(await full(req, s));
});

seriesRouter.post('/:id/trials', async (req, res) => {
  const s = await load(req);
  const actor = actorOf(req)!;
  if (!can(actor, 'series:update', record(s)) || !can(actor, 'trial:create')) throw forbidden();
  const created = await withTrialCode((transaction) => createSeriesTrials({ actor, transaction, series: s }));
  res
    .status(201)
    .json({ created: created.map((t) => ({ id: t.id, code: t.code, cell: t.cell })), series: await full(req, s) });
});

seriesRouter.get('/:id/cards.pdf', async (req, res) => {
  const s = await load(req);
  const trials = await trialsOf(s);
  sendPdf(
    res,
    `${s.code}-cards.pdf`,
    await cardsPdf(`Sample cards ${s.code}`, await loadCards(trials.map((t) => t.id))),
  );
});

seriesRouter.get('/:id/labels.pdf', async (req, res) => {
  const s = await load(req);
  const trials = await Trial.findAll({
    where: { seriesId: s.id },
    include: [{ model: RecipeStep, as: 'steps' }],
    order: [['code', 'ASC']],
  });
  const labels = await Promise.all(
    trials.map(async (t) => {
      const steps = (t as Trial & { steps?: RecipeStep[] }).steps ?? [];
      const chemIds = steps.flatMap((st) => st.ingredients.filter((i) => i.kind === 'chemical').map((i) => i.refId));
      return {
        title: `${t.code} · ${s.code}`,
        lines: [
          Object.entries(t.cell ?? {})
            .map(([k, v]) => `${k}: ${v}`)
            .join(' · '),
          `${t.dryMassG} g dry${s.heldOn ? `, ${s.heldOn}` : ''}`,
          steps.flatMap((st) => st.ingredients.map((i) => i.name)).join(', '),
        ].filter(Boolean),
        hazards: await hazardsFor([...new Set(chemIds)]),
      };
    }),
  );
  sendPdf(res, `${s.code}-labels.pdf`, await labelsPdf(`Swatch labels ${s.code}`, labels));
});

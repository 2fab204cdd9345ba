import { Router } from 'express';
import { Op, type WhereOptions } from 'sequelize';
import {
  chemicalCreateSchema,
  chemicalListQuery,
  chemicalPatchSchema,
  dyestuffCreateSchema,
  dyestuffListQuery,
} from '../../../shared/schemas/reference.ts';
import { idParams, toPaged } from '../../../shared/schemas/common.ts';
import { actorOf, requireUser } from '../../http/auth.ts';
import { forbidden, notFound } from '../../http/errors.ts';
import { parseBody, parseParams, parseQuery } from '../../http/validate.ts';
import { Chemical, Dyestuff, sequelize } from '../../models/index.ts';
import { can } from '../../policies/index.ts';
import { presentChemical, presentDyestuff } from '../../presenters/reference.ts';
import { createChemical, createDyestuff, updateChemical } from '../../services/reference.ts';

// The chemical and dyestuff reference is readable by everyone, signed in or not (`reference:read`).
export const chemicalsRouter = Router();
export const dyestuffsRouter = Router();

const like = (q: string) => ({ [Op.like]: `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` });

chemicalsRouter.get('/', async (req, res) => {
  const query = parseQuery(chemicalListQuery, req);
  if (!can(actorOf(req), 'reference:read')) throw forbidden();
  const where: WhereOptions<Chemical> = {
    ...(query.role ? { role: query.role } : {}),
    ...(query.status ? { status: query.status } : {}),
    ...(query.q ? { [Op.or]: [{ name: like(query.q) }, { formula: like(query.q) }] } : {}),
  };
  const { rows, count } = await Chemical.findAndCountAll({
    where,
    order: [['name', 'ASC']],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  res.json(toPaged(rows.map(presentChemical), count, query.page, query.pageSize));
});

chemicalsRouter.get('/:id', async (req, res) => {
  const { id } = parseParams(idParams, req);
  const chemical = await Chemical.findByPk(id);
  if (!chemical || !can(actorOf(req), 'reference:read')) throw notFound('Chemical');
  res.json(presentChemical(chemical));
});

// Admins keep the reference (hazard data, status, formula); every change is audited.
chemicalsRouter.post('/', requireUser, async (req, res) => {
  const actor = actorOf(req);
  if (!can(actor, 'reference:manage')) throw forbidden();
  const input = parseBody(chemicalCreateSchema, req);
  const chemical = await sequelize.transaction((transaction) => createChemical({ actor, transaction, input }));
  res.status(201).json(presentChemical(chemical));
});

chemicalsRouter.patch('/:id', requireUser, async (req, res) => {
  const { id } = parseParams(idParams, req);
  const patch = parseBody(chemicalPatchSchema, req);
  const actor = actorOf(req);
  const chemical = await Chemical.findByPk(id);
  if (!chemical || !can(actor, 'reference:read')) throw notFound('Chemical');
  if (!can(actor, 'reference:manage')) throw forbidden();
  const updated = await sequelize.transaction((transaction) =>
    updateChemical({ actor, transaction, input: { chemical, patch } }),
  );
  res.json(presentChemical(updated));
});

dyestuffsRouter.get('/', async (req, res) => {
  const query = parseQuery(dyestuffListQuery, req);
  if (!can(actorOf(req), 'reference:read')) throw forbidden();
  const where: WhereOptions<Dyestuff> = query.q
    ? { [Op.or]: [{ name: like(query.q) }, { ciName: like(query.q) }] }
    : {};
  const { rows, count } = await Dyestuff.findAndCountAll({
    where,
    order: [['name', 'ASC']],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
  });
  res.json(toPaged(rows.map(presentDyestuff), count, query.page, query.pageSize));
});

dyestuffsRouter.post('/', requireUser, async (req, res) => {
  const actor = actorOf(req);
  if (!can(actor, 'reference:manage')) throw forbidden();
  const input = parseBody(dyestuffCreateSchema, req);
  const dyestuff = await sequelize.transaction((transaction) => createDyestuff({ actor, transaction, input }));
  res.status(201).json(presentDyestuff(dyestuff));
});

dyestuffsRouter.get('/:id', async (req, res) => {
  const { id } = parseParams(idParams, req);
  const dyestuff = await Dyestuff.findByPk(id);
  if (!dyestuff || !can(actorOf(req), 'reference:read')) throw notFound('Dyestuff');
  res.json(presentDyestuff(dyestuff));
});

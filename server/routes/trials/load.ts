import { Op, type WhereOptions } from 'sequelize';
import type { z } from 'zod';
import type { trialListQuerySchema } from '../../../shared/schemas/trial.ts';
import { toPaged } from '../../../shared/schemas/common.ts';
import { forbidden, notFound } from '../../http/errors.ts';
import {
  Chemical,
  ColourMeasurement,
  Dyestuff,
  MordantBatch,
  Photo,
  Piece,
  RecipeStep,
  Substitution,
  Trial,
  User,
} from '../../models/index.ts';
import { can, type Actor } from '../../policies/index.ts';
import { presentTrial, presentTrialSummary, trialPolicyRecord } from '../../presenters/trial.ts';
import { figuresFor, loadEvents, thickenerIds } from '../../services/batches/index.ts';
import { trialColour } from '../../services/trials/colour.ts';

const withPeople = [
  { model: Piece, as: 'piece', paranoid: false },
  { model: User, as: 'dyer' },
];

/** A trial the actor may read (404 otherwise), with its piece and dyer. */
export async function loadReadableTrial(actor: Actor, id: number) {
  const trial = await Trial.findByPk(id, { include: withPeople });
  if (!trial || !can(actor, 'trial:read', trialPolicyRecord(trial))) throw notFound('Trial');
  return trial as Trial & { piece: Piece | null; dyer: User | null };
}

/** A trial the actor may change: readable, then owned (403 for someone else's). */
export async function loadWritableTrial(actor: Actor, id: number) {
  const trial = await loadReadableTrial(actor, id);
  if (!can(actor, 'trial:update', trialPolicyRecord(trial)))
    throw forbidden('Only the dyer who keeps this trial may change it.');
  return trial;
}

/** Everything the trial page shows, in a handful of queries. */
export async function presentTrialDetail(actor: Actor, trial: Trial & { piece?: Piece | null; dyer?: User | null }) {
  const [steps, substitutions, measurements, photos, colour] = await Promise.all([
    RecipeStep.findAll({ where: { trialId: trial.id }, order: [['position', 'ASC']] }),
    Substitution.findAll({ where: { trialId: trial.id }, order: [['id', 'ASC']] }),
    ColourMeasurement.findAll({ where: { trialId: trial.id }, order: [['id', 'ASC']] }),
    Photo.findAll({ where: { trialId: trial.id }, order: [['id', 'ASC']] }),
    trialColour(trial),
  ]);
  const chemIds = new Set<number>();
  const dyeIds = new Set<number>();
  for (const s of steps) for (const i of s.ingredients) (i.kind === 'chemical' ? chemIds : dyeIds).add(i.refId);
  for (const s of substitutions)
    for (const id of [s.historicalChemicalId, s.modernChemicalId]) if (id != null) chemIds.add(id);
  const batchIds = [...new Set(steps.map((s) => s.batchId).filter((x): x is number => x != null))];
  const confirmerIds = [
    ...new Set(steps.map((s) => s.historicalUseConfirmedById).filter((x): x is number => x != null)),
  ];
  const [chemicals, dyestuffs, batches, confirmers] = await Promise.all([
    Chemical.findAll({ where: { id: [...chemIds] } }),
    Dyestuff.findAll({ where: { id: [...dyeIds] } }),
    MordantBatch.findAll({ where: { id: batchIds } }),
    confirmerIds.length
      ? User.findAll({ where: { id: confirmerIds }, attributes: ['id', 'name'] })
      : Promise.resolve([] as User[]),
  ]);
  // What each bath holds now, from its replayed ledger: the recipe's scaling warns against it.
  const thick = batches.length ? await thickenerIds() : new Set<number>();
  const held = new Map(
    await Promise.all(
      batches.map(async (b) => [b.id, figuresFor(b, await loadEvents(b.id), thick).remainingMl] as const),
    ),
  );
  return presentTrial(trial, actor, {
    steps,
    substitutions,
    measurements,
    photos,
    colour,
    chemicals: new Map(chemicals.map((c) => [c.id, c])),
    dyestuffs: new Map(dyestuffs.map((d) => [d.id, d])),
    batches: new Map(
      batches.map((b) => [
        b.id,
        { id: b.id, code: b.code, name: b.name, status: b.status, remainingMl: held.get(b.id) ?? 0 },
      ]),
    ),
    people: new Map(confirmers.map((u) => [u.id, { id: u.id, name: u.name }])),
  });
}

export async function listTrials(actor: Actor, q: z.output<typeof trialListQuerySchema>) {
  const and: WhereOptions[] = [];
  if (q.status) and.push({ status: q.status });
  if (q.kind) and.push({ kind: q.kind });
  if (q.pieceId) and.push({ pieceId: q.pieceId });
  if (q.dyerId) and.push({ dyerId: q.dyerId });
  if (q.mine === '1' && actor) and.push({ dyerId: actor.id });
  if (q.q) {
    const like = `%${q.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    and.push({
      [Op.or]: [
        { code: { [Op.like]: like } },
        { notes: { [Op.like]: like } },
        { '$piece.accessionNumber$': { [Op.like]: like } },
        { '$piece.title$': { [Op.like]: like } },
      ],
    });
  }
  const { rows, count } = await Trial.findAndCountAll({
    where: { [Op.and]: and },
    include: withPeople,
    order: [
      ['code', 'DESC'],
      ['id', 'DESC'],
    ],
    limit: q.pageSize,
    offset: (q.page - 1) * q.pageSize,
    distinct: true,
  });
  const items = await Promise.all(
    rows.map(async (t) =>
      presentTrialSummary(t as Trial & { piece: Piece | null; dyer: User | null }, actor, await trialColour(t)),
    ),
  );
  return toPaged(items, count, q.page, q.pageSize);
}

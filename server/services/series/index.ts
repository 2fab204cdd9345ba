import type { Transaction } from 'sequelize';
import type { SeriesCreateInput, SeriesUpdateInput } from '../../../shared/schemas/series.ts';
import type { Cell } from '../../../shared/compute/series.ts';
import { conflict, unprocessable } from '../../http/errors.ts';
import { Chemical, Dyestuff, RecipeStep, Trial, TrialSeries } from '../../models/index.ts';
import { nextTrialCode } from '../trials/code.ts';
import { checkPiece, checkTarget } from '../trials/refs.ts';
import { cellKey, cellRecipe, expand, type StoredFactor } from './plan.ts';
import type { SignedInCtx } from '../context.ts';

export const factorsOf = (s: TrialSeries) => s.factors as StoredFactor[];
export const keptCells = (s: TrialSeries) => s.cells as Cell[];

export async function createSeries({ actor, transaction, input }: SignedInCtx<SeriesCreateInput>) {
  const names = input.factors.map((f) => f.name);
  if (new Set(names).size !== names.length)
    throw unprocessable('Each factor needs its own name.', { fields: { factors: ['Two factors share a name'] } });
  if (input.kind === 'workshop' && !input.participants.length)
    throw unprocessable('A workshop needs participant codes.', {
      fields: { participants: ['Add pseudonymous codes such as P-01'] },
    });
  await checkPiece(input.pieceId, transaction);
  await checkTarget(input.pieceId, input, transaction);
  const factors = await resolveRefs(input.factors, transaction);
  const cells = expand(factors);
  if (cells.length > 500) throw unprocessable(`That makes ${cells.length} cells; keep a series to 500 or fewer.`);
  return TrialSeries.create({ ...input, factors, cells, ownerId: actor.id }, { transaction });
}

export async function updateSeries({
  transaction,
  input,
  series,
}: SignedInCtx<SeriesUpdateInput> & { series: TrialSeries }) {
  const { keep, targetPaletteColourId, targetRegionId, targetMeasurementId, ...rest } = input;
  const patch: Partial<TrialSeries['_creationAttributes']> = { ...rest };
  // A new target replaces the old one whichever kind it is; trials already planned keep theirs.
  if (targetPaletteColourId !== undefined || targetRegionId !== undefined || targetMeasurementId !== undefined) {
    const target = {
      targetPaletteColourId: targetPaletteColourId ?? null,
      targetRegionId: targetRegionId ?? null,
      targetMeasurementId: targetMeasurementId ?? null,
    };
    await checkTarget(series.pieceId, target, transaction);
    Object.assign(patch, target);
  }
  if (keep) {
    const all = expand(factorsOf(series));
    const wanted = new Set(keep);
    const unknown = keep.filter((k) => !all.some((c) => cellKey(c) === k));
    if (unknown.length) throw unprocessable('Some kept cells are not in this series.', { unknown });
    patch.cells = all.filter((c) => wanted.has(cellKey(c)));
  }
  return series.update(patch, { transaction });
}

/** The trials one series plans: one per kept cell, and per participant in a workshop. */
export function plannedCells(series: TrialSeries): Cell[] {
  const cells = keptCells(series);
  if (series.kind !== 'workshop' || !series.participants.length) return cells;
  return series.participants.flatMap((p) => cells.map((c) => ({ ...c, participant: p })));
}

/** Create the planned trials of a series in one transaction; cells that already have a trial are skipped. */
export async function createSeriesTrials({
  actor,
  transaction,
  series,
}: Omit<SignedInCtx<unknown>, 'input'> & { series: TrialSeries }) {
  const locked = await TrialSeries.findByPk(series.id, {
    transaction,
    lock: transaction.LOCK.UPDATE,
    rejectOnEmpty: true,
  });
  const existing = await Trial.findAll({ where: { seriesId: locked.id }, attributes: ['cell'], transaction });
  const done = new Set(existing.map((t) => cellKey((t.cell ?? {}) as Cell)));
  const todo = plannedCells(locked).filter((c) => !done.has(cellKey(c)));
  if (!todo.length) throw conflict('Every kept cell of this series already has a trial.');
  if (!locked.dryMassG) throw unprocessable('Set the dry mass per cell before creating trials.');
  const created: Trial[] = [];
  for (const cell of todo) {
    const trial = await Trial.create(
      {
        // Each call sees the codes this transaction has already used.
        code: await nextTrialCode(new Date().getUTCFullYear(), transaction),
        pieceId: locked.pieceId,
        seriesId: locked.id,
        cell,
        targetPaletteColourId: locked.targetPaletteColourId,
        targetRegionId: locked.targetRegionId,
        targetMeasurementId: locked.targetMeasurementId,
        dyerId: actor.id,
        status: 'planned',
        fibre: null,
        weave: null,
        gsm: null,
        dryMassG: locked.dryMassG,
        fastness: null,
        notes: `Planned by series ${locked.code}: ${Object.entries(cell)
          .map(([k, v]) => `${k} ${v}`)
          .join(', ')}`,
        startedOn: null,
      },
      { transaction },
    );
    for (const [pos, step] of cellRecipe(cell, factorsOf(locked)).entries()) {
      await RecipeStep.create(
        {
          trialId: trial.id,
          position: pos + 1,
          operation: step.operation,
          ingredients: step.ingredients,
          liquorRatio: locked.liquorRatio,
          temperatureC: null,
          minutes: null,
          ph: null,
          paste: null,
          batchId: null,
          batchVolumeMl: null,
          notes: null,
        },
        { transaction },
      );
    }
    created.push(trial);
  }
  return created;
}

/** Dyestuffs and chemicals may be named rather than picked by id; names must match the reference list. */
async function resolveRefs(factors: SeriesCreateInput['factors'], transaction: Transaction): Promise<StoredFactor[]> {
  const missing: string[] = [];
  const chem = async (name: string) =>
    (await Chemical.findOne({ where: { name }, attributes: ['id'], transaction }))?.id ?? (missing.push(name), 0);
  const out: StoredFactor[] = [];
  for (const f of factors) {
    let refId = f.refId;
    if (!refId && f.refName && f.role === 'dyestuff')
      refId =
        (await Dyestuff.findOne({ where: { name: f.refName }, attributes: ['id'], transaction }))?.id ??
        (missing.push(f.refName), null);
    if (!refId && f.refName && f.role === 'tannin') refId = (await chem(f.refName)) || null;
    const mordants = f.mordants
      ? await Promise.all(
          f.mordants.map(async (m) => ({
            level: m.level,
            chemicals: await Promise.all(
              m.chemicals.map(async (c) => ({ ...c, refId: c.refId ?? (await chem(c.name)) })),
            ),
          })),
        )
      : undefined;
    const { mordants: _drop, ...rest } = f;
    out.push({ ...rest, refId, ...(mordants ? { mordants } : {}) });
  }
  if (missing.length)
    throw unprocessable(`Not in the reference list: ${missing.join(', ')}.`, {
      fields: { factors: [`Unknown: ${missing.join(', ')}`] },
    });
  // A series plans modern trials, where a historical-only chemical needs a confirmed reason per step
  // (services/trials): a plan of many cells cannot give one, so it is refused here.
  const chemIds = out.flatMap((f) => [
    ...(f.role === 'tannin' && f.refId ? [f.refId] : []),
    ...(f.mordants ?? []).flatMap((m) => m.chemicals.map((c) => c.refId!)),
  ]);
  const historical = chemIds.length
    ? await Chemical.findAll({ where: { id: chemIds, status: 'historical-only' }, attributes: ['name'], transaction })
    : [];
  if (historical.length) {
    const names = [...new Set(historical.map((c) => c.name))].join(', ');
    throw unprocessable(`${names} is for historical recipes only.`, {
      fields: {
        factors: [
          `${names} is for historical recipes only: a series plans modern trials, so choose a modern substitute, or record its use on one trial with the reason`,
        ],
      },
    });
  }
  return out;
}

import { Op, type Transaction } from 'sequelize';
import { conflict, HttpError } from '../../http/errors.ts';
import { BatchEvent, MordantBatch, type RecipeStep } from '../../models/index.ts';
import { eventOrder, thickenerIds } from './index.ts';
import { checkHistory } from './ledger-figures.ts';

/** A step as saved: its draw (bath and volume) and, when it continues a stored step, that step's id. */
export type StepDraw = {
  index: number;
  stepId: number;
  continues: number | null;
  batchId: number | null;
  volumeMl: number | null;
};
type OldDraw = { id: number; batchId: number | null; volumeMl: number | null };

const drawField = (i: number) => `steps.${i}.batchVolumeMl`;

/**
 * Bring the baths' ledgers in line with a trial's recipe: each step that draws from a bath owns one `use`
 * event (linked to the trial and the step). A continued step's event is edited (volume) or moved (another
 * bath); a removed step's event is removed; a new draw is recorded now. Every touched batch row is locked
 * (in id order, so two recipes never wait on each other crosswise), its whole ledger replayed with the
 * change, and the first refusal (overdraw, disposed bath) answered with the ledger's own words beside the
 * step's field, before anything is kept: the caller's transaction rolls back.
 *
 * `closing` is for a trial being deleted: a disposed bath's closed ledger keeps the use (unlinked from the
 * step) instead of refusing the deletion.
 */
export async function syncStepDraws({
  transaction,
  trialId,
  actorId,
  fibreMassG,
  old,
  steps,
  closing = false,
}: {
  transaction: Transaction;
  trialId: number;
  actorId: number | null;
  fibreMassG: number | null;
  old: OldDraw[];
  steps: StepDraw[];
  closing?: boolean;
}) {
  const oldIds = old.map((o) => o.id);
  const events = oldIds.length
    ? await BatchEvent.findAll({ where: { stepId: { [Op.in]: oldIds }, type: 'use' }, transaction })
    : [];
  const eventOf = new Map(events.map((e) => [e.stepId!, e]));
  const oldById = new Map(old.map((o) => [o.id, o]));

  // The plan, per bath: events removed, events whose volume changes, draws to add; and which step caused each.
  const removed = new Set<number>();
  const changed = new Map<number, { volumeMl: number; stepId: number; index: number }>();
  const added: Array<{ batchId: number; volumeMl: number; stepId: number; index: number }> = [];
  const repoint: Array<{ event: BatchEvent; stepId: number }> = [];
  const kept = new Set<number>();
  for (const s of steps) {
    const prev = s.continues != null ? oldById.get(s.continues) : undefined;
    const ev = prev ? eventOf.get(prev.id) : undefined;
    if (ev) kept.add(ev.id);
    if (s.batchId == null || s.volumeMl == null) {
      if (ev) removed.add(ev.id);
      continue;
    }
    if (ev && ev.batchId === s.batchId) {
      if (ev.volumeMl !== s.volumeMl) changed.set(ev.id, { volumeMl: s.volumeMl, stepId: s.stepId, index: s.index });
      repoint.push({ event: ev, stepId: s.stepId });
      continue;
    }
    if (ev) removed.add(ev.id);
    // A draw saved before steps owned their events, unchanged: it was recorded (or not) by hand then; leave it.
    if (!ev && prev && prev.batchId === s.batchId && prev.volumeMl === s.volumeMl) continue;
    added.push({ batchId: s.batchId, volumeMl: s.volumeMl, stepId: s.stepId, index: s.index });
  }
  for (const e of events) if (!kept.has(e.id)) removed.add(e.id);

  const byId = new Map(events.map((e) => [e.id, e]));
  const batchIds = [
    ...new Set([...[...removed, ...changed.keys()].map((id) => byId.get(id)!.batchId), ...added.map((a) => a.batchId)]),
  ].sort((a, b) => a - b);
  if (!batchIds.length) {
    for (const r of repoint)
      if (r.event.stepId !== r.stepId) await r.event.update({ stepId: r.stepId }, { transaction });
    return;
  }
  const thick = await thickenerIds(transaction);
  const now = new Date();
  for (const batchId of batchIds) {
    const batch = await MordantBatch.findByPk(batchId, {
      transaction,
      lock: transaction.LOCK.UPDATE,
      rejectOnEmpty: true,
    });
    const history = await BatchEvent.findAll({ where: { batchId }, order: eventOrder, transaction });
    const adds = added.filter((a) => a.batchId === batchId);
    const touches = history.filter((e) => removed.has(e.id) || changed.has(e.id));
    const blame =
      adds[0]?.index ??
      touches.map((e) => changed.get(e.id)?.index).find((x) => x != null) ??
      steps.find((s) => s.batchId === batchId)?.index;
    const fields = (message: string) => (blame != null ? { fields: { [drawField(blame)]: [message] } } : {});
    if (batch.status === 'disposed') {
      // A disposed bath's ledger is closed: its past uses stand as recorded.
      if (closing && !adds.length && !touches.some((e) => changed.has(e.id))) {
        for (const e of touches) await e.update({ stepId: null }, { transaction });
        for (const e of touches) removed.delete(e.id);
        continue;
      }
      const msg = `${batch.code} has been disposed of; its ledger is closed, so this draw can no longer be changed.`;
      throw conflict(msg, { reason: 'disposed', ...fields(msg) });
    }
    const next = [
      ...history
        .filter((e) => !removed.has(e.id))
        .map((e) => ({
          ...e.get({ plain: true }),
          ...(changed.has(e.id) ? { volumeMl: changed.get(e.id)!.volumeMl } : {}),
        })),
      ...adds.map((a) => ({
        type: 'use' as const,
        volumeMl: a.volumeMl,
        fibreMassG,
        additions: null,
        ph: null,
        result: null,
        route: null,
        ruleFollowed: null,
      })),
    ];
    let ledger;
    try {
      ledger = checkHistory(batch, next, thick);
    } catch (err) {
      if (err instanceof HttpError)
        throw new HttpError(err.status, err.code, `${batch.code}: ${err.message}`, {
          ...(err.details as object),
          ...fields(err.message),
        });
      throw err;
    }
    for (const e of touches) {
      if (removed.has(e.id)) await e.destroy({ transaction });
      else
        await e.update(
          { volumeMl: changed.get(e.id)!.volumeMl, stepId: changed.get(e.id)!.stepId, fibreMassG },
          { transaction },
        );
    }
    for (const a of adds) {
      await BatchEvent.create(
        {
          batchId,
          type: 'use',
          volumeMl: a.volumeMl,
          fibreMassG,
          trialId,
          stepId: a.stepId,
          additions: null,
          ph: null,
          result: null,
          route: null,
          ruleFollowed: null,
          notes: null,
          occurredAt: now,
          createdById: actorId,
        },
        { transaction },
      );
    }
    await batch.update({ status: ledger.state.remainingMl <= 0 ? 'exhausted' : 'active' }, { transaction });
  }
  for (const r of repoint)
    if (!removed.has(r.event.id) && r.event.stepId !== r.stepId)
      await r.event.update({ stepId: r.stepId }, { transaction });
}

/**
 * Lock the baths a recipe save may touch, in id order, before its steps are written: inserting a step
 * that names a bath takes a shared lock on the bath row (its foreign key), and two saves holding that
 * shared lock would deadlock asking for the row's update lock afterwards.
 */
export async function lockBaths(ids: Array<number | null | undefined>, transaction: Transaction) {
  const wanted = [...new Set(ids.filter((x): x is number => x != null))].sort((a, b) => a - b);
  if (wanted.length)
    await MordantBatch.findAll({
      where: { id: { [Op.in]: wanted } },
      order: [['id', 'ASC']],
      transaction,
      lock: transaction.LOCK.UPDATE,
      attributes: ['id'],
    });
}

export const oldDraws = (steps: RecipeStep[]): OldDraw[] =>
  steps.map((s) => ({ id: s.id, batchId: s.batchId, volumeMl: s.batchVolumeMl }));

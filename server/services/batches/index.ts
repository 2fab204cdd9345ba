import { Op, type Transaction } from 'sequelize';
import {
  UPTAKE_DEFAULTS,
  type BatchCreateInput,
  type BatchEventInput,
  type BatchUpdateInput,
} from '../../../shared/schemas/batches.ts';
import { conflict, unprocessable } from '../../http/errors.ts';
import { BatchEvent, Chemical, MordantBatch, Trial, sequelize } from '../../models/index.ts';
import { checkEvent, figures } from './ledger-figures.ts';
import type { SignedInCtx } from '../context.ts';

export const eventOrder: [string, string][] = [
  ['occurredAt', 'ASC'],
  ['id', 'ASC'],
];

export async function loadEvents(batchId: number, transaction?: Transaction) {
  return BatchEvent.findAll({ where: { batchId }, order: eventOrder, transaction });
}

/** Chemicals whose role is thickener: they make up a paste's body, not its mordant charge. */
export async function thickenerIds(transaction?: Transaction) {
  const rows = await Chemical.findAll({ where: { role: 'thickener' }, attributes: ['id'], transaction });
  return new Set(rows.map((r) => r.id));
}

export const figuresFor = (batch: MordantBatch, events: BatchEvent[], thick: ReadonlySet<number>) =>
  figures(batch, events, thick);

export async function createBatch({ actor, transaction, input }: SignedInCtx<BatchCreateInput>) {
  if (input.parentId != null) {
    const parent = await MordantBatch.findByPk(input.parentId, { transaction });
    if (!parent) throw unprocessable('The parent batch does not exist.', { fields: { parentId: ['No such batch'] } });
    if (parent.status === 'disposed')
      throw conflict(`${parent.code} has been disposed of; a dilution cannot be made from it.`);
  }
  // An uptake left empty takes the kind's default (0 for a stock or paste that is only drawn from).
  const uptakePerUse = input.uptakePerUse ?? UPTAKE_DEFAULTS[input.kind];
  return MordantBatch.create({ ...input, uptakePerUse, madeById: actor.id, status: 'active' }, { transaction });
}

export async function updateBatch({
  transaction,
  input,
  batch,
}: SignedInCtx<BatchUpdateInput> & { batch: MordantBatch }) {
  if (batch.status === 'disposed') throw conflict(`${batch.code} has been disposed of and can no longer be changed.`);
  return batch.update(input, { transaction });
}

/**
 * Record one ledger event and its effect on the batch in one transaction.
 * The batch row is locked (SELECT … FOR UPDATE) first, so concurrent draws are
 * serialised and never take more than is left.
 */
export async function addEvent({
  actor,
  input,
  batchId,
}: Omit<SignedInCtx<BatchEventInput>, 'transaction'> & { batchId: number }) {
  return sequelize.transaction(async (transaction) => {
    const batch = await MordantBatch.findByPk(batchId, {
      transaction,
      lock: transaction.LOCK.UPDATE,
      rejectOnEmpty: true,
    });
    if (batch.status === 'disposed')
      throw conflict(`${batch.code} has been disposed of; no further events can be recorded.`, {
        status: batch.status,
      });
    const thick = await thickenerIds(transaction);
    const history = await loadEvents(batch.id, transaction);
    // The shared ledger refuses an overdraw or an event on a disposed batch (409) and an early disposal without a reason (422).
    const after = checkEvent(batch, history, input, thick);

    if (input.type === 'use') {
      if (input.trialCode) {
        const t = await Trial.findOne({ where: { code: input.trialCode }, attributes: ['id'], transaction });
        if (!t)
          throw unprocessable(`There is no trial ${input.trialCode}.`, {
            fields: { trialCode: ['No trial with that code'] },
          });
        input.trialId = t.id;
      } else if (input.trialId != null && !(await Trial.findByPk(input.trialId, { transaction, attributes: ['id'] })))
        throw unprocessable('That trial does not exist.', { fields: { trialId: ['No such trial'] } });
    }

    const notes =
      [input.reason ? `Reason: ${input.reason}` : null, input.notes ?? null].filter(Boolean).join('\n') || null;
    const event = await BatchEvent.create(
      {
        batchId: batch.id,
        type: input.type,
        volumeMl: input.volumeMl ?? null,
        fibreMassG: input.fibreMassG ?? null,
        trialId: input.trialId ?? null,
        additions: input.additions ?? null,
        ph: input.ph ?? null,
        result: input.result ?? null,
        route: input.route ?? null,
        ruleFollowed: input.ruleFollowed ?? null,
        notes,
        occurredAt: input.occurredAt ? new Date(input.occurredAt) : new Date(),
        createdById: actor.id,
      },
      { transaction },
    );
    const status = input.type === 'disposal' ? 'disposed' : after.state.remainingMl <= 0 ? 'exhausted' : 'active';
    await batch.update({ status, ...(input.type === 'ph' ? { ph: input.ph! } : {}) }, { transaction });
    return { batch, event };
  });
}

export const dueForCheck = (today: string) => ({ status: 'active' as const, checkBy: { [Op.lte]: today } });

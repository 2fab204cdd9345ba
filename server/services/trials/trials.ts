import type { Transaction } from 'sequelize';
import type {
  StepsInput,
  SubstitutionInput,
  TrialCreateInput,
  TrialUpdateInput,
} from '../../../shared/schemas/trial.ts';
import {
  stepsSchema,
  substitutionSchema,
  trialCreateSchema,
  trialUpdateSchema,
} from '../../../shared/schemas/trial.ts';
import { badRequest, unprocessable } from '../../http/errors.ts';
import { audit } from '../audit.ts';
import { ColourMeasurement, Photo, RecipeStep, Substitution, Trial } from '../../models/index.ts';
import { removePhotoRows } from '../photos.ts';
import { checkChemical, checkPiece, checkTarget, loadIngredientRefs } from './refs.ts';
import { nextTrialCode } from './code.ts';
import { lockBaths, oldDraws, syncStepDraws } from '../batches/step-draws.ts';
import type { ServiceCtx } from '../context.ts';

/** Create a trial with a server-assigned code; the caller retries on a code clash (withTrialCode). */
export async function createTrial({ actor, transaction, input }: ServiceCtx<TrialCreateInput>) {
  const v = trialCreateSchema.parse(input);
  await checkPiece(v.pieceId, transaction);
  await checkTarget(v.pieceId ?? null, v, transaction);
  const code = await nextTrialCode(new Date().getUTCFullYear(), transaction);
  return Trial.create(
    {
      code,
      pieceId: v.pieceId ?? null,
      seriesId: null,
      cell: null,
      targetPaletteColourId: v.targetPaletteColourId ?? null,
      targetRegionId: v.targetRegionId ?? null,
      targetMeasurementId: v.targetMeasurementId ?? null,
      targetAim: v.targetAim ?? null,
      dyerId: actor?.id ?? null,
      status: v.status,
      kind: v.kind,
      fibre: v.fibre ?? null,
      weave: v.weave ?? null,
      gsm: v.gsm ?? null,
      dryMassG: v.dryMassG,
      dryMassBasis: v.dryMassBasis,
      fastness: v.fastness ?? null,
      notes: v.notes ?? null,
      startedOn: v.startedOn ?? null,
    },
    { transaction },
  );
}

/** Update the fields given; a changed piece clears a target that belonged to the old one. */
export async function updateTrial({ transaction, input }: ServiceCtx<TrialUpdateInput & { trial: Trial }>) {
  const { trial, ...rest } = input;
  const v = trialUpdateSchema.parse(rest);
  const pieceId = v.pieceId === undefined ? trial.pieceId : v.pieceId;
  if (v.pieceId !== undefined && v.pieceId !== trial.pieceId) await checkPiece(v.pieceId, transaction);
  const targetGiven =
    v.targetPaletteColourId !== undefined || v.targetRegionId !== undefined || v.targetMeasurementId !== undefined;
  const targets =
    targetGiven || pieceId !== trial.pieceId
      ? {
          targetPaletteColourId: v.targetPaletteColourId ?? null,
          targetRegionId: v.targetRegionId ?? null,
          targetMeasurementId: v.targetMeasurementId ?? null,
          // A new target is not read as made or as seen unless told so.
          targetAim: v.targetAim ?? null,
        }
      : {};
  await checkTarget(pieceId, { ...trial.get(), ...targets }, transaction);
  const { targetPaletteColourId: _p, targetRegionId: _r, targetMeasurementId: _m, ...fields } = v;
  await trial.update({ ...fields, pieceId, ...targets }, { transaction });
  return trial;
}

export async function deleteTrial({ actor, transaction, input }: ServiceCtx<{ trial: Trial }>) {
  const trialId = input.trial.id;
  await Trial.findByPk(trialId, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id'] });
  const old = await RecipeStep.findAll({ where: { trialId }, transaction });
  // Its steps' draws go with it (a disposed bath keeps its closed ledger as it is).
  await syncStepDraws({
    transaction,
    trialId,
    actorId: actor?.id ?? null,
    fibreMassG: input.trial.dryMassG,
    old: oldDraws(old),
    steps: [],
    closing: true,
  });
  await Substitution.destroy({ where: { trialId }, transaction });
  await RecipeStep.destroy({ where: { trialId }, transaction });
  await ColourMeasurement.destroy({ where: { trialId }, transaction });
  // Its swatch photos go too: rows now, files and tiles once the transaction commits.
  await removePhotoRows(await Photo.findAll({ where: { trialId }, transaction }), transaction);
  await input.trial.destroy({ transaction });
  await audit({ actor, transaction }, 'trial', trialId, 'trial-removed', {
    code: { from: input.trial.code, to: null },
  });
}

/**
 * Replace the ordered recipe in one go. Substitutions keep pointing at the step in
 * the same position; those whose position disappears lose their step link.
 */
export async function replaceSteps({ actor, transaction, input }: ServiceCtx<StepsInput & { trial: Trial }>) {
  const { steps } = stepsSchema.parse({ steps: input.steps });
  const { chemicals, dyestuffs } = await loadIngredientRefs(steps, transaction);
  const historicalOnly = historicalOnlyIn(input.trial, steps, chemicals);
  const trialId = input.trial.id;
  // The trial row, not its steps, is locked: two saves of one recipe queue here, and no gap locks on
  // recipe_steps make saves of different trials deadlock on their inserts.
  await Trial.findByPk(trialId, { transaction, lock: transaction.LOCK.UPDATE, attributes: ['id'] });
  const old = await RecipeStep.findAll({ where: { trialId }, order: [['position', 'ASC']], transaction });
  await lockBaths([...old.map((s) => s.batchId), ...steps.map((s) => s.batchId)], transaction);
  const positionOf = new Map(old.map((s) => [s.id, s.position]));
  const subs = await Substitution.findAll({ where: { trialId }, transaction });
  await Substitution.update({ stepId: null }, { where: { trialId }, transaction });
  await RecipeStep.destroy({ where: { trialId }, transaction });
  const confirmations = confirmHistoricalUse(steps, historicalOnly, old, actor?.id ?? null);
  const created = await RecipeStep.bulkCreate(
    steps.map((s, i) => ({
      trialId,
      position: i + 1,
      operation: s.operation,
      ingredients: s.ingredients.map((ing) => ({
        ...ing,
        name: (ing.kind === 'chemical' ? chemicals.get(ing.refId)?.name : dyestuffs.get(ing.refId)?.name) ?? '',
      })),
      liquorRatio: s.liquorRatio ?? null,
      temperatureC: s.temperatureC ?? null,
      minutes: s.minutes ?? null,
      ph: s.ph ?? null,
      paste: s.paste ?? null,
      batchId: s.batchId ?? null,
      batchVolumeMl: s.batchVolumeMl ?? null,
      notes: s.notes ?? null,
      historicalUseReason: confirmations[i].historicalUseReason,
      historicalUseConfirmedById: confirmations[i].historicalUseConfirmedById,
      historicalUseConfirmedAt: confirmations[i].historicalUseConfirmedAt,
    })),
    { transaction },
  );
  // Each new or changed confirmation is audited with the trial: who, which chemicals, why.
  for (const [i, c] of confirmations.entries()) {
    if (!c.fresh) continue;
    await audit({ actor, transaction }, 'trial', trialId, 'historical-use-confirmed', {
      step: { from: null, to: i + 1 },
      chemicals: { from: null, to: historicalOnly[i].map((h) => h.name) },
      historicalUseReason: { from: c.previousReason, to: c.historicalUseReason },
    });
  }
  // Each step continues the stored step whose id it carries; a request without ids continues by position.
  const oldIds = new Set(old.map((s) => s.id));
  const byIds = steps.some((s) => s.id != null);
  await syncStepDraws({
    transaction,
    trialId,
    actorId: actor?.id ?? null,
    fibreMassG: input.trial.dryMassG,
    old: oldDraws(old),
    steps: steps.map((s, i) => ({
      index: i,
      stepId: created[i].id,
      batchId: s.batchId ?? null,
      volumeMl: s.batchVolumeMl ?? null,
      continues: byIds ? (s.id != null && oldIds.has(s.id) ? s.id : null) : (old[i]?.id ?? null),
    })),
  });
  const byPosition = new Map(created.map((s) => [s.position, s.id]));
  for (const sub of subs) {
    const pos = sub.stepId != null ? positionOf.get(sub.stepId) : undefined;
    const stepId = pos != null ? (byPosition.get(pos) ?? null) : null;
    if (stepId != null) await sub.update({ stepId }, { transaction });
  }
  return created;
}

type StepRow = ReturnType<typeof stepsSchema.parse>['steps'][number];
type ChemRow = { id: number; name: string; status: string };

/** The historical-only chemicals of each step of a modern trial (a historical record uses them freely). */
function historicalOnlyIn(trial: Trial, steps: StepRow[], chemicals: ReadonlyMap<number, ChemRow>): ChemRow[][] {
  return steps.map((s) =>
    trial.kind === 'modern'
      ? [
          ...new Map(
            s.ingredients
              .filter((i) => i.kind === 'chemical')
              .map((i) => chemicals.get(i.refId))
              .filter((c): c is ChemRow => c?.status === 'historical-only')
              .map((c) => [c.id, c]),
          ).values(),
        ]
      : [],
  );
}

/**
 * A step of a modern trial that uses a historical-only chemical is saved only with historicalUseConfirmed
 * and a reason (422 otherwise, beside the step's fields). A confirmation carried over unchanged from the
 * step it continues keeps who confirmed it and when; a new or changed reason is the saver's, now.
 */
function confirmHistoricalUse(
  steps: StepRow[],
  historicalOnly: ChemRow[][],
  old: RecipeStep[],
  actorId: number | null,
) {
  const fields: Record<string, string[]> = {};
  const byId = new Map(old.map((s) => [s.id, s]));
  const out = steps.map((s, i) => {
    const none = {
      historicalUseReason: null,
      historicalUseConfirmedById: null,
      historicalUseConfirmedAt: null,
      fresh: false,
      previousReason: null as string | null,
    };
    if (!historicalOnly[i].length) return none;
    const names = historicalOnly[i].map((c) => c.name).join(', ');
    const reason = s.historicalUseReason?.trim() ?? '';
    if (s.historicalUseConfirmed !== true)
      fields[`steps.${i}.historicalUseConfirmed`] = [
        `${names} is for historical recipes only: confirm its use in this modern trial, or choose a modern substitute`,
      ];
    if (!reason)
      fields[`steps.${i}.historicalUseReason`] = [
        `Say why ${names} is used in this modern trial (for example a documented reconstruction under fume extraction)`,
      ];
    const before =
      (s.id != null ? byId.get(s.id) : undefined) ?? (steps.some((x) => x.id != null) ? undefined : old[i]);
    if (before?.historicalUseConfirmedAt && before.historicalUseReason === reason) {
      return {
        ...none,
        historicalUseReason: reason,
        historicalUseConfirmedById: before.historicalUseConfirmedById,
        historicalUseConfirmedAt: before.historicalUseConfirmedAt,
      };
    }
    return {
      historicalUseReason: reason,
      historicalUseConfirmedById: actorId,
      historicalUseConfirmedAt: new Date(),
      fresh: true,
      previousReason: before?.historicalUseReason ?? null,
    };
  });
  if (Object.keys(fields).length)
    throw unprocessable(
      'A historical-only chemical needs your confirmation and a reason before it is used in a modern trial.',
      { fields },
    );
  return out;
}

async function checkSubstitution(
  trialId: number,
  v: ReturnType<typeof substitutionSchema.parse>,
  transaction: Transaction,
) {
  if (v.stepId != null && !(await RecipeStep.findOne({ where: { id: v.stepId, trialId }, transaction }))) {
    throw badRequest('Some fields are not valid.', { fields: { stepId: ['Choose a step of this trial.'] } });
  }
  await checkChemical('historicalChemicalId', v.historicalChemicalId, transaction);
  await checkChemical('modernChemicalId', v.modernChemicalId, transaction);
}

const substitutionRow = (v: ReturnType<typeof substitutionSchema.parse>) => ({
  stepId: v.stepId ?? null,
  historicalChemicalId: v.historicalChemicalId ?? null,
  historicalPractice: v.historicalPractice ?? null,
  historicalAmountG: v.historicalAmountG ?? null,
  modernChemicalId: v.modernChemicalId ?? null,
  modernPractice: v.modernPractice ?? null,
  modernAmountG: v.modernAmountG ?? null,
  reason: v.reason,
  notes: v.notes ?? null,
});

export async function addSubstitution({ transaction, input }: ServiceCtx<SubstitutionInput & { trial: Trial }>) {
  const { trial, ...rest } = input;
  const v = substitutionSchema.parse(rest);
  await checkSubstitution(trial.id, v, transaction);
  return Substitution.create({ trialId: trial.id, ...substitutionRow(v) }, { transaction });
}

export async function updateSubstitution({
  transaction,
  input,
}: ServiceCtx<SubstitutionInput & { substitution: Substitution }>) {
  const { substitution, ...rest } = input;
  const v = substitutionSchema.parse(rest);
  await checkSubstitution(substitution.trialId, v, transaction);
  return substitution.update(substitutionRow(v), { transaction });
}

export async function removeSubstitution({ actor, transaction, input }: ServiceCtx<{ substitution: Substitution }>) {
  const { substitution } = input;
  await substitution.destroy({ transaction });
  await audit({ actor, transaction }, 'trial', substitution.trialId, 'substitution-removed', {
    substitution: { from: substitutionRow(substitution), to: null },
  });
}

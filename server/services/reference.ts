import type { ChemicalCreate, ChemicalPatch, DyestuffCreate } from '../../shared/schemas/reference.ts';
import { parseFormula } from '../../shared/compute/chemistry.ts';
import { badRequest, conflict } from '../http/errors.ts';
import { AuditEvent, Chemical, Dyestuff } from '../models/index.ts';
import { audit } from './audit.ts';
import type { ServiceCtx } from './context.ts';

const created = (input: Record<string, unknown>) =>
  Object.fromEntries(Object.entries(input).map(([k, to]) => [k, { from: null, to }]));

/** An admin adds a chemical to the reference; a name already in use answers 409, and the addition is audited. */
export async function createChemical({ actor, transaction, input }: ServiceCtx<ChemicalCreate>) {
  if (await Chemical.findOne({ where: { name: input.name }, transaction })) {
    const message = `A chemical named "${input.name}" is already in the reference; edit that one instead.`;
    throw conflict(message, { fields: { name: ['A chemical with this name already exists'] } });
  }
  const chemical = await Chemical.create(input, { transaction });
  await audit({ actor, transaction }, 'chemical', chemical.id, 'create', created(input));
  return chemical;
}

/** An admin adds a dyestuff to the reference; a name already in use answers 409, and the addition is audited. */
export async function createDyestuff({ actor, transaction, input }: ServiceCtx<DyestuffCreate>) {
  if (await Dyestuff.findOne({ where: { name: input.name }, transaction })) {
    const message = `A dyestuff named "${input.name}" is already in the reference.`;
    throw conflict(message, { fields: { name: ['A dyestuff with this name already exists'] } });
  }
  const dyestuff = await Dyestuff.create(input, { transaction });
  await audit({ actor, transaction }, 'dyestuff', dyestuff.id, 'create', created(input));
  return dyestuff;
}

/** Edit a chemical's reference row and record what changed, in one transaction. */
export async function updateChemical({
  actor,
  transaction,
  input,
}: ServiceCtx<{ chemical: Chemical; patch: ChemicalPatch }>) {
  const { chemical, patch } = input;
  const normalised = { ...patch, ...(patch.formula === '' ? { formula: null } : {}) };
  // The row as it will be: a metal must occur in its formula (the schema checks this on create, where both come together).
  const formula = normalised.formula !== undefined ? normalised.formula : chemical.formula;
  const metal = normalised.metal !== undefined ? normalised.metal : chemical.metal;
  if (metal && formula && !parseFormula(formula)[metal]) {
    const message = `The formula has no ${metal}`;
    throw badRequest(message, { fields: { [normalised.metal !== undefined ? 'metal' : 'formula']: [message] } });
  }
  if (
    normalised.name !== undefined &&
    normalised.name !== chemical.name &&
    (await Chemical.findOne({ where: { name: normalised.name }, transaction }))
  ) {
    throw conflict(`A chemical named "${normalised.name}" is already in the reference.`, {
      fields: { name: ['A chemical with this name already exists'] },
    });
  }
  const changes: Record<string, { from: unknown; to: unknown }> = {};
  for (const [key, to] of Object.entries(normalised)) {
    const from = chemical.get(key as keyof ChemicalPatch);
    if (JSON.stringify(from) !== JSON.stringify(to)) changes[key] = { from, to };
  }
  if (Object.keys(changes).length === 0) return chemical;
  await chemical.update(normalised, { transaction });
  await AuditEvent.create(
    { actorId: actor?.id ?? null, entity: 'chemical', entityId: chemical.id, action: 'update', changes },
    { transaction },
  );
  return chemical;
}

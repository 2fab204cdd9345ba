import type { Transaction } from 'sequelize';
import type { ChemicalPatch } from '../../shared/schemas/reference.ts';
import { AuditEvent, type Chemical } from '../models/index.ts';
import type { Actor } from '../policies/index.ts';

/** Edit a chemical's reference row and record what changed, in one transaction. */
export async function updateChemical({ actor, transaction, input }: { actor: Actor; transaction: Transaction; input: { chemical: Chemical; patch: ChemicalPatch } }) {
  const { chemical, patch } = input;
  const normalised = { ...patch, ...(patch.formula === '' ? { formula: null } : {}) };
  const changes: Record<string, { from: unknown; to: unknown }> = {};
  for (const [key, to] of Object.entries(normalised)) {
    const from = chemical.get(key as keyof ChemicalPatch);
    if (JSON.stringify(from) !== JSON.stringify(to)) changes[key] = { from, to };
  }
  if (Object.keys(changes).length === 0) return chemical;
  await chemical.update(normalised, { transaction });
  await AuditEvent.create({ actorId: actor?.id ?? null, entity: 'chemical', entityId: chemical.id, action: 'update', changes }, { transaction });
  return chemical;
}

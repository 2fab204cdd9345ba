import { AuditEvent } from '../models/index.ts';
import type { TxCtx } from './context.ts';

export type Changes = Record<string, { from: unknown; to: unknown }>;

/** Field-by-field differences between a record before and after a change (only fields named in `input`). */
export function diff(before: Record<string, unknown>, input: Record<string, unknown>): Changes {
  const changes: Changes = {};
  for (const [k, to] of Object.entries(input)) {
    if (to === undefined) continue;
    const from = before[k] ?? null;
    if (JSON.stringify(from) !== JSON.stringify(to ?? null)) changes[k] = { from, to: to ?? null };
  }
  return changes;
}

/** One audit row, written in the caller's transaction so it commits or rolls back with the change. */
export function audit(
  { actor, transaction }: TxCtx,
  entity: string,
  entityId: number,
  action: string,
  changes: Changes | null = null,
) {
  return AuditEvent.create({ actorId: actor?.id ?? null, entity, entityId, action, changes }, { transaction });
}

import type { TeamPatchInput } from '../../shared/schemas/team.ts';
import { conflict, notFound } from '../http/errors.ts';
import { Session, User } from '../models/index.ts';
import type { ServiceCtx } from './context.ts';

/**
 * Change a member's role or active flag. The active admins are locked first so two
 * admins demoting each other at once cannot leave the team without one.
 */
export async function updateMember({ actor, transaction, input }: ServiceCtx<TeamPatchInput & { id: number }>) {
  const admins = await User.findAll({
    where: { role: 'admin', active: true },
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  const member = await User.findByPk(input.id, { transaction, lock: transaction.LOCK.UPDATE });
  if (!member) throw notFound('Team member');
  if (actor?.id === member.id && input.active === false)
    throw conflict('You cannot deactivate your own account; ask another admin.', { reason: 'self' });
  const losesAdmin =
    member.role === 'admin' &&
    member.active &&
    ((input.role !== undefined && input.role !== 'admin') || input.active === false);
  if (losesAdmin && admins.filter((a) => a.id !== member.id).length === 0) {
    throw conflict('This is the last active admin; make someone else an admin first.', { reason: 'last_admin' });
  }
  await member.update(
    {
      ...(input.role !== undefined ? { role: input.role } : {}),
      ...(input.active !== undefined ? { active: input.active } : {}),
    },
    { transaction },
  );
  // Sessions end at once; passport's deserialize also refuses an inactive user.
  if (input.active === false) await Session.destroy({ where: { userId: member.id }, transaction });
  return member;
}

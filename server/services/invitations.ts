import { Op, type Transaction } from 'sequelize';
import type { AcceptInvitationInput, InviteInput } from '../../shared/schemas/team.ts';
import { hashPassword } from '../auth/passwords.ts';
import { issueToken, spendToken } from '../auth/tokens.ts';
import { publicUrl } from '../env.ts';
import { conflict, HttpError } from '../http/errors.ts';
import { sendMail } from '../mail/index.ts';
import { invitationLetter } from '../mail/letters.ts';
import { AuthToken, User } from '../models/index.ts';
import type { Actor } from '../policies/index.ts';

type Ctx<I> = { actor: Actor; transaction: Transaction; input: I };

/** Link the e-mail points to; the client page at /join/:token sets name and password. */
export const invitationUrl = (token: string) => `${publicUrl}/join/${token}`;

/**
 * Invite someone: one live link per address (earlier open invitations are spent),
 * mailed inside the transaction so a failed send leaves no usable token behind.
 */
export async function inviteMember({ actor, transaction, input }: Ctx<InviteInput>) {
  if (await User.findOne({ where: { email: input.email }, transaction })) throw conflict('Someone on the team already uses that e-mail address.', { fields: { email: ['Already on the team'] } });
  await AuthToken.update({ usedAt: new Date() }, { where: { purpose: 'invitation', email: input.email, usedAt: { [Op.is]: null } }, transaction });
  const inviter = actor ? await User.findByPk(actor.id, { transaction }) : null;
  const { token, record } = await issueToken({ purpose: 'invitation', email: input.email, role: input.role, createdById: actor?.id ?? null }, transaction);
  try {
    await sendMail(invitationLetter({ to: input.email, role: input.role, inviter: inviter?.name ?? 'An administrator', url: invitationUrl(token), expiresAt: record.expiresAt }));
  } catch (err) {
    console.error('[mail] invitation not sent:', err);
    throw new HttpError(502, 'mail_failed', 'The invitation e-mail could not be sent; nothing was saved. Try again later.');
  }
  return record;
}

/** Accept an invitation: spend the token and create the account in one transaction. */
export async function acceptInvitation({ transaction, input }: Ctx<AcceptInvitationInput & { token: string }>) {
  const record = await spendToken(input.token, 'invitation', transaction);
  if (await User.findOne({ where: { email: record.email }, transaction })) throw conflict('An account with this e-mail address already exists; sign in instead.');
  return User.create({ email: record.email, name: input.name, role: record.role ?? 'researcher', passwordHash: await hashPassword(input.password) }, { transaction });
}

import { Op, type Transaction } from 'sequelize';
import type { AcceptInvitationInput, InviteInput } from '../../shared/schemas/team.ts';
import { hashPassword } from '../auth/passwords.ts';
import { findLiveToken, hashToken, issueToken } from '../auth/tokens.ts';
import { publicUrl } from '../env.ts';
import { logger } from '../log/index.ts';
import { conflict, HttpError, notFound } from '../http/errors.ts';
import { sendMail } from '../mail/index.ts';
import { invitationLetter } from '../mail/letters.ts';
import { AuthToken, User } from '../models/index.ts';
import type { ServiceCtx } from './context.ts';

/** Link the e-mail points to; the client page at /join/:token sets name and password. */
export const invitationUrl = (token: string) => `${publicUrl}/join/${token}`;

/**
 * Invite someone: one live link per address (earlier open invitations are spent),
 * mailed inside the transaction so a failed send leaves no usable token behind.
 */
export async function inviteMember({ actor, transaction, input }: ServiceCtx<InviteInput>) {
  if (await User.findOne({ where: { email: input.email }, transaction }))
    throw conflict('Someone on the team already uses that e-mail address.', {
      fields: { email: ['Already on the team'] },
    });
  await AuthToken.update(
    { usedAt: new Date() },
    { where: { purpose: 'invitation', email: input.email, usedAt: { [Op.is]: null } }, transaction },
  );
  const inviter = actor ? await User.findByPk(actor.id, { transaction }) : null;
  const { token, record } = await issueToken(
    { purpose: 'invitation', email: input.email, role: input.role, createdById: actor?.id ?? null },
    transaction,
  );
  try {
    await sendMail(
      invitationLetter({
        to: input.email,
        role: input.role,
        inviter: inviter?.name ?? 'An administrator',
        url: invitationUrl(token),
        expiresAt: record.expiresAt,
      }),
    );
  } catch (err) {
    logger.error({ err }, '[mail] invitation not sent');
    throw new HttpError(
      502,
      'mail_failed',
      'The invitation e-mail could not be sent; nothing was saved. Try again later.',
    );
  }
  return record;
}

const isoDay = (d: Date) => d.toISOString().slice(0, 10);

/**
 * A live invitation, or a 410 that says why the link no longer works and what to do: the invitee already joined
 * (sign in), a newer invitation replaced it (use the latest e-mail), an admin withdrew it, or it expired.
 */
export async function liveInvitation(plain: string, transaction?: Transaction, lock = false) {
  try {
    return await findLiveToken(plain, 'invitation', transaction, lock);
  } catch (err) {
    if (!(err instanceof HttpError) || err.status !== 410) throw err;
    const record = await AuthToken.findOne({
      where: { tokenHash: hashToken(plain), purpose: 'invitation' },
      transaction,
    });
    if (!record) throw err;
    const joined = await User.findOne({ where: { email: record.email }, transaction });
    if (joined)
      throw new HttpError(
        410,
        'invitation_accepted',
        `This invitation has already been used: ${record.email} is on the team. Sign in with that address.`,
        { reason: 'joined', email: record.email },
      );
    const inviter = record.createdById ? await User.findByPk(record.createdById, { transaction }) : null;
    const ask = inviter ? `Ask ${inviter.name} or another admin` : 'Ask an admin';
    if (record.usedAt) {
      const newer = await AuthToken.count({
        where: { purpose: 'invitation', email: record.email, id: { [Op.gt]: record.id } },
        transaction,
      });
      if (newer)
        throw new HttpError(
          410,
          'invitation_replaced',
          'A newer invitation was sent to this address; use the link in the latest e-mail.',
          { reason: 'replaced' },
        );
      throw new HttpError(
        410,
        'invitation_withdrawn',
        `This invitation was withdrawn. ${ask} if you should still join.`,
        { reason: 'withdrawn' },
      );
    }
    throw new HttpError(
      410,
      'invitation_expired',
      `This invitation expired on ${isoDay(record.expiresAt)}. ${ask} to send a new one.`,
      { reason: 'expired' },
    );
  }
}

/** Invitations not yet accepted or withdrawn (expired ones too, so they can be sent again), newest first. */
export async function pendingInvitations() {
  const rows = await AuthToken.findAll({
    where: { purpose: 'invitation', usedAt: { [Op.is]: null } },
    order: [
      ['createdAt', 'DESC'],
      ['id', 'DESC'],
    ],
  });
  const inviterIds = [...new Set(rows.map((r) => r.createdById).filter((id): id is number => id != null))];
  const inviters = new Map(
    (await User.findAll({ where: { id: inviterIds }, attributes: ['id', 'name'] })).map((u) => [u.id, u.name]),
  );
  return rows.map((r) => ({ record: r, invitedBy: r.createdById ? (inviters.get(r.createdById) ?? null) : null }));
}

async function pending(id: number, transaction: Transaction) {
  const record = await AuthToken.findOne({
    where: { id, purpose: 'invitation', usedAt: { [Op.is]: null } },
    transaction,
    lock: transaction.LOCK.UPDATE,
  });
  if (!record) throw notFound('Pending invitation');
  return record;
}

/** Send a pending invitation again: a new link (7 days from now) by mail; the old link stops working. */
export async function resendInvitation({ actor, transaction, input }: ServiceCtx<{ id: number }>) {
  const record = await pending(input.id, transaction);
  return inviteMember({ actor, transaction, input: { email: record.email, role: record.role ?? 'researcher' } });
}

/** Withdraw a pending invitation: its link stops working and says so. */
export async function revokeInvitation({ transaction, input }: ServiceCtx<{ id: number }>) {
  const record = await pending(input.id, transaction);
  await record.update({ usedAt: new Date() }, { transaction });
  return record;
}

/** Accept an invitation: spend the token and create the account in one transaction. */
export async function acceptInvitation({ transaction, input }: ServiceCtx<AcceptInvitationInput & { token: string }>) {
  const record = await liveInvitation(input.token, transaction, true);
  await record.update({ usedAt: new Date() }, { transaction });
  if (await User.findOne({ where: { email: record.email }, transaction }))
    throw conflict('An account with this e-mail address already exists; sign in instead.');
  return User.create(
    {
      email: record.email,
      name: input.name,
      role: record.role ?? 'researcher',
      passwordHash: await hashPassword(input.password),
    },
    { transaction },
  );
}

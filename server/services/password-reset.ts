import { Op, type Transaction } from 'sequelize';
import type { ResetPasswordInput } from '../../shared/schemas/team.ts';
import { hashPassword } from '../auth/passwords.ts';
import { issueToken, spendToken } from '../auth/tokens.ts';
import { publicUrl } from '../env.ts';
import { notFound } from '../http/errors.ts';
import { sendMail } from '../mail/index.ts';
import { resetLetter } from '../mail/letters.ts';
import { AuthToken, Session, User, sequelize } from '../models/index.ts';

export const resetUrl = (token: string) => `${publicUrl}/reset-password/${token}`;

/**
 * Mail a reset link when the address belongs to an active account; otherwise do nothing.
 * The route answers 202 before this runs, so neither the answer nor its timing tells the two apart.
 */
export async function requestPasswordReset(email: string): Promise<void> {
  const user = await User.findOne({ where: { email } });
  if (!user || !user.active || !user.passwordHash) return;
  const { token, record } = await sequelize.transaction(async (transaction) => {
    await AuthToken.update({ usedAt: new Date() }, { where: { purpose: 'password-reset', userId: user.id, usedAt: { [Op.is]: null } }, transaction });
    return issueToken({ purpose: 'password-reset', email: user.email, userId: user.id }, transaction);
  });
  await sendMail(resetLetter({ to: user.email, name: user.name, url: resetUrl(token), expiresAt: record.expiresAt }));
}

/** Set a new password with a reset token; every session of that user ends. */
export async function resetPassword({ transaction, input }: { transaction: Transaction; input: ResetPasswordInput & { token: string } }) {
  const record = await spendToken(input.token, 'password-reset', transaction);
  const user = record.userId ? await User.findByPk(record.userId, { transaction, lock: transaction.LOCK.UPDATE }) : null;
  if (!user || !user.active) throw notFound('Account');
  await user.update({ passwordHash: await hashPassword(input.password) }, { transaction });
  await Session.destroy({ where: { userId: user.id }, transaction });
  return user;
}

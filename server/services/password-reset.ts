import { Op, type Transaction } from 'sequelize';
import type { ResetPasswordInput } from '../../shared/schemas/team.ts';
import { hashPassword } from '../auth/passwords.ts';
import { findLiveToken, issueToken } from '../auth/tokens.ts';
import { publicUrl } from '../env.ts';
import { HttpError, notFound } from '../http/errors.ts';
import { sendMail } from '../mail/index.ts';
import { resetLetter } from '../mail/letters.ts';
import { AuthToken, Session, User, sequelize } from '../models/index.ts';
import type { ServiceCtx } from './context.ts';

export const resetUrl = (token: string) => `${publicUrl}/reset-password/${token}`;

/**
 * Mail a reset link when the address belongs to an active account; otherwise do nothing.
 * The route answers 202 before this runs, so neither the answer nor its timing tells the two apart.
 */
export async function requestPasswordReset(email: string): Promise<void> {
  const user = await User.findOne({ where: { email } });
  if (!user || !user.active || !user.passwordHash) return;
  const { token, record } = await sequelize.transaction(async (transaction) => {
    await AuthToken.update(
      { usedAt: new Date() },
      { where: { purpose: 'password-reset', userId: user.id, usedAt: { [Op.is]: null } }, transaction },
    );
    return issueToken({ purpose: 'password-reset', email: user.email, userId: user.id }, transaction);
  });
  await sendMail(resetLetter({ to: user.email, name: user.name, url: resetUrl(token), expiresAt: record.expiresAt }));
}

/** A live reset link, or a 404/410 in words that point to signing in or asking for a new link. */
export async function liveResetToken(plain: string, transaction?: Transaction, lock = false) {
  try {
    return await findLiveToken(plain, 'password-reset', transaction, lock);
  } catch (err) {
    if (!(err instanceof HttpError)) throw err;
    if (err.code === 'token_used')
      throw new HttpError(
        410,
        'token_used',
        'This link has already been used (or a newer one was sent). Sign in with your password, or ask for a new link.',
      );
    if (err.code === 'token_expired')
      throw new HttpError(
        410,
        'token_expired',
        'This link has expired: reset links work for 2 hours. Ask for a new one.',
      );
    throw new HttpError(
      404,
      'token_unknown',
      'This link is not valid; it may have been copied incompletely. Ask for a new one.',
    );
  }
}

/** Set a new password with a reset token; every session of that user ends. */
export async function resetPassword({
  transaction,
  input,
}: Omit<ServiceCtx<ResetPasswordInput & { token: string }>, 'actor'>) {
  const record = await liveResetToken(input.token, transaction, true);
  await record.update({ usedAt: new Date() }, { transaction });
  const user = record.userId
    ? await User.findByPk(record.userId, { transaction, lock: transaction.LOCK.UPDATE })
    : null;
  if (!user || !user.active) throw notFound('Account');
  await user.update({ passwordHash: await hashPassword(input.password) }, { transaction });
  await Session.destroy({ where: { userId: user.id }, transaction });
  return user;
}

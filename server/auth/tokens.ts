import { createHash, randomBytes } from 'node:crypto';
import type { Transaction } from 'sequelize';
import { TOKEN_TTL_MS } from '../../shared/schemas/team.ts';
import type { Role } from '../../shared/roles.ts';
import { HttpError } from '../http/errors.ts';
import { AuthToken, type TokenPurpose } from '../models/auth-token.ts';

export const hashToken = (plain: string) => createHash('sha256').update(plain).digest('hex');

type Issue = {
  purpose: TokenPurpose;
  email: string;
  role?: Role | null;
  userId?: number | null;
  createdById?: number | null;
  now?: Date;
};

/** Create a one-time token; the plain value is returned once (for the e-mail) and only its hash is stored. */
export async function issueToken(
  input: Issue,
  transaction?: Transaction,
): Promise<{ token: string; record: AuthToken }> {
  const token = randomBytes(32).toString('base64url');
  const now = input.now ?? new Date();
  const record = await AuthToken.create(
    {
      purpose: input.purpose,
      tokenHash: hashToken(token),
      email: input.email,
      role: input.role ?? null,
      userId: input.userId ?? null,
      createdById: input.createdById ?? null,
      expiresAt: new Date(now.getTime() + TOKEN_TTL_MS[input.purpose]),
    },
    { transaction },
  );
  return { token, record };
}

const unknownToken = () => new HttpError(404, 'token_unknown', 'This link is not valid. Ask for a new one.');

/** Find a live token of one purpose without spending it (for showing the acceptance page). */
export async function findLiveToken(
  plain: string,
  purpose: TokenPurpose,
  transaction?: Transaction,
  lock = false,
): Promise<AuthToken> {
  const record = await AuthToken.findOne({
    where: { tokenHash: hashToken(plain), purpose },
    transaction,
    lock: lock && transaction ? transaction.LOCK.UPDATE : undefined,
  });
  if (!record) throw unknownToken();
  if (record.usedAt) throw new HttpError(410, 'token_used', 'This link has already been used. Ask for a new one.');
  if (record.expiresAt.getTime() <= Date.now())
    throw new HttpError(410, 'token_expired', 'This link has expired. Ask for a new one.');
  return record;
}

/** Spend a token inside the caller's transaction; the row lock makes a second use wait and then fail. */
export async function spendToken(plain: string, purpose: TokenPurpose, transaction: Transaction): Promise<AuthToken> {
  const record = await findLiveToken(plain, purpose, transaction, true);
  await record.update({ usedAt: new Date() }, { transaction });
  return record;
}

import { QueryTypes, UniqueConstraintError, type Transaction } from 'sequelize';
import { sequelize } from '../../models/index.ts';

/** The next free code of the year, T-YYYY-NNN (NNN grows past 999 if it must). */
export async function nextTrialCode(year: number, transaction: Transaction): Promise<string> {
  const prefix = `T-${year}-`;
  const [row] = await sequelize.query<{ n: number | null }>(
    'SELECT MAX(CAST(SUBSTRING(code, :from) AS UNSIGNED)) AS n FROM trials WHERE code LIKE :like',
    { replacements: { from: prefix.length + 1, like: `${prefix}%` }, type: QueryTypes.SELECT, transaction },
  );
  return `${prefix}${String(Number(row?.n ?? 0) + 1).padStart(3, '0')}`;
}

const isCodeClash = (err: unknown) =>
  err instanceof UniqueConstraintError || (err as { parent?: { errno?: number } })?.parent?.errno === 1213; // 1213: deadlock, retried too

/**
 * Run a whole transaction that assigns a trial code, retrying when a concurrent
 * request took the same number first (the unique index on trials.code decides).
 */
export async function withTrialCode<T>(work: (transaction: Transaction) => Promise<T>, attempts = 6): Promise<T> {
  for (let i = 1; ; i++) {
    try {
      return await sequelize.transaction(work);
    } catch (err) {
      if (i >= attempts || !isCodeClash(err)) throw err;
    }
  }
}

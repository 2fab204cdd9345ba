import { Op, type Transaction } from 'sequelize';
import { Trial } from '../models/index.ts';

/**
 * Next trial codes T-YYYY-NNN for the year. The highest existing code is read
 * with a locking read, so two transactions allocating at once are serialised.
 */
export async function allocateTrialCodes(count: number, transaction: Transaction, year = new Date().getUTCFullYear()) {
  const prefix = `T-${year}-`;
  const last = await Trial.findOne({ where: { code: { [Op.like]: `${prefix}%` } }, order: [['code', 'DESC']], attributes: ['code'], transaction, lock: transaction.LOCK.UPDATE });
  const start = last ? Number.parseInt(last.code.slice(prefix.length), 10) : 0;
  return Array.from({ length: count }, (_, i) => `${prefix}${String(start + 1 + i).padStart(3, '0')}`);
}

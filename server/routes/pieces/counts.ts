import { QueryTypes } from 'sequelize';
import { logger } from '../../log/index.ts';
import { sequelize } from '../../models/index.ts';

/**
 * How many pieces there are per (status, deleted), from piece_counts (migration 0025): triggers on `pieces` append a
 * +1/-1 row for every insert, delete, publication change, soft delete and restore, in the writing transaction, so a
 * reader's snapshot sees exactly the pieces it would count. Reading sums a few rows instead of walking 166,667 index
 * entries with COUNT(*).
 */
// Deltas are folded into one row per key once there are this many (a bulk import adds one per piece).
const COMPACT_AFTER = 64;
const COMPACT_BATCH = 20_000;

let compacting: Promise<void> | null = null;

/** SQL for the number of pieces with one of `statuses` (all statuses when null), soft-deleted or not. */
export const pieceTotalSql = (statuses: readonly string[] | null, deleted: boolean) =>
  `(SELECT COALESCE(SUM(n), 0) FROM piece_counts WHERE deleted = ${deleted ? 1 : 0}${
    statuses ? ` AND status IN (${statuses.map((s) => sequelize.escape(s)).join(', ')})` : ''
  })`;
/** SQL for how many rows piece_counts holds (deltas not yet folded). */
export const pieceDeltasSql = '(SELECT COUNT(*) FROM piece_counts)';

export async function pieceTotal(statuses: readonly string[] | null, deleted: boolean): Promise<number> {
  const [row] = await sequelize.query<{ total: number; deltas: number }>(
    `SELECT ${pieceTotalSql(statuses, deleted)} AS total, ${pieceDeltasSql} AS deltas`,
    { type: QueryTypes.SELECT },
  );
  foldCountsIfMany(Number(row.deltas));
  return Number(row.total);
}

/** Start folding the deltas (once per process at a time) when there are many. */
export function foldCountsIfMany(deltas: number) {
  if (deltas <= COMPACT_AFTER || compacting) return;
  compacting = compactPieceCounts()
    .catch((err) => logger.warn({ err }, '[pieces] folding piece_counts failed (retried on a later read)'))
    .finally(() => (compacting = null));
}

/**
 * Fold committed delta rows into one row per key, in one short transaction. Rows of transactions still open are
 * locked by them and skipped (SKIP LOCKED, MariaDB 10.6+): they stay as deltas and are folded on a later pass, so a
 * count is never lost or doubled; readers see the rows before or after the fold, never half of it.
 */
export async function compactPieceCounts(): Promise<void> {
  await sequelize.transaction(async (transaction) => {
    const rows = await sequelize.query<{ id: number; status: string; deleted: number; n: number }>(
      `SELECT id, status, deleted, n FROM piece_counts ORDER BY id LIMIT ${COMPACT_BATCH} FOR UPDATE SKIP LOCKED`,
      { transaction, type: QueryTypes.SELECT },
    );
    if (rows.length < 2) return;
    const sums = new Map<string, { status: string; deleted: boolean; n: number }>();
    for (const r of rows) {
      const key = `${r.status}\u0000${Number(r.deleted)}`;
      const s = sums.get(key) ?? { status: r.status, deleted: Boolean(Number(r.deleted)), n: 0 };
      s.n += Number(r.n);
      sums.set(key, s);
    }
    await sequelize.query('DELETE FROM piece_counts WHERE id IN (?)', {
      replacements: [rows.map((r) => r.id)],
      transaction,
    });
    const kept = [...sums.values()].filter((s) => s.n !== 0);
    if (kept.length)
      await sequelize.query(
        `INSERT INTO piece_counts (status, deleted, n) VALUES ${kept.map(() => '(?, ?, ?)').join(', ')}`,
        { replacements: kept.flatMap((s) => [s.status, s.deleted, s.n]), transaction },
      );
  });
}

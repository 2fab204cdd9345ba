import { afterAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { Piece, sequelize } from '../../server/models/index.ts';
import { makePiece } from '../../server/seed/factories.ts';
import { compactPieceCounts, pieceTotal } from '../../server/routes/pieces/counts.ts';

afterAll(() => sequelize.close());

type Row = { status: string; deleted: number; n: number };
const key = (r: Row) => `${r.status}/${Number(r.deleted)}`;

/** piece_counts' sums and a COUNT(*) of pieces, read in one snapshot (other suites write pieces meanwhile). */
async function both() {
  return sequelize.transaction(async (transaction) => {
    await sequelize.query('SELECT 1 FROM piece_counts LIMIT 1', { transaction }); // opens the snapshot
    const kept = await sequelize.query<Row>(
      'SELECT status, deleted, SUM(n) AS n FROM piece_counts GROUP BY status, deleted HAVING SUM(n) <> 0',
      { type: QueryTypes.SELECT, transaction },
    );
    const counted = await sequelize.query<Row>(
      'SELECT status, deletedAt IS NOT NULL AS deleted, COUNT(*) AS n FROM pieces GROUP BY status, deletedAt IS NOT NULL',
      { type: QueryTypes.SELECT, transaction },
    );
    const norm = (rows: Row[]) => Object.fromEntries(rows.map((r) => [key(r), Number(r.n)]).sort());
    return { kept: norm(kept), counted: norm(counted) };
  });
}

describe('piece_counts (migration 0025): the archive list total without COUNT(*)', () => {
  it('follows creation, publication, soft deletion, restore and hard deletion through the triggers', async () => {
    const a = await makePiece({ status: 'draft' });
    const b = await makePiece({ status: 'published' });
    let s = await both();
    expect(s.kept).toEqual(s.counted);
    await a.update({ status: 'published' });
    await b.destroy(); // soft
    s = await both();
    expect(s.kept).toEqual(s.counted);
    await b.restore();
    await a.update({ title: 'Only the title changes' });
    s = await both();
    expect(s.kept).toEqual(s.counted);
    await Piece.update({ status: 'draft' }, { where: { id: [a.id, b.id] } });
    await a.destroy({ force: true });
    s = await both();
    expect(s.kept).toEqual(s.counted);
  });

  it('forgets a rolled-back write', async () => {
    const before = await both();
    await expect(
      sequelize.transaction(async (transaction) => {
        await makePiece({ status: 'published' }, transaction);
        throw new Error('roll back');
      }),
    ).rejects.toThrow('roll back');
    const after = await both();
    expect(after.kept).toEqual(after.counted);
    expect(Object.keys(after.kept).sort()).toEqual(Object.keys(before.kept).sort());
  });

  it('folds the deltas into one row per key without changing any total', async () => {
    for (let i = 0; i < 5; i++) await makePiece({ status: i % 2 ? 'published' : 'draft' });
    await compactPieceCounts();
    const s = await both();
    expect(s.kept).toEqual(s.counted);
    const [{ deltas }] = await sequelize.query<{ deltas: number }>('SELECT COUNT(*) AS deltas FROM piece_counts', {
      type: QueryTypes.SELECT,
    });
    // Four keys at most, plus whatever other suites wrote since the fold.
    expect(Number(deltas)).toBeLessThan(40);
    const [{ n }] = await sequelize.query<{ n: number }>(
      "SELECT COUNT(*) AS n FROM pieces WHERE status = 'published' AND deletedAt IS NULL",
      { type: QueryTypes.SELECT },
    );
    // Other suites may write between the two reads; both are exact at their moment.
    expect(Math.abs((await pieceTotal(['published'], false)) - Number(n))).toBeLessThan(20);
  });
});

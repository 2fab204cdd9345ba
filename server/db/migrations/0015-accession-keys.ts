import { DataTypes, QueryTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import { accessionKey, accessionSortKey } from '../../../shared/accession.ts';
import type { MigrationContext } from '../migrator.ts';

// Accession numbers in any institution's scheme: uniqueness ignores case and spaces (a key column with its own
// unique index), and the archive sorts by a natural-order key (binary collation, so the database orders it as
// the search does). Both are derived in shared/accession.ts, so existing rows are filled from there.
const BATCH = 2000;

export const up: MigrationFn<MigrationContext> = async ({ context: { sequelize } }) => {
  const qi = sequelize.getQueryInterface();
  await qi.addColumn('pieces', 'accessionKey', { type: DataTypes.STRING(40), allowNull: true });
  await qi.addColumn('pieces', 'accessionSort', { type: DataTypes.STRING(120, true), allowNull: true });
  for (let after = 0; ;) {
    const rows = await sequelize.query<{ id: number; accessionNumber: string }>(
      'SELECT id, accessionNumber FROM pieces WHERE id > ? ORDER BY id LIMIT ?',
      {
        replacements: [after, BATCH],
        type: QueryTypes.SELECT,
      },
    );
    if (!rows.length) break;
    after = rows[rows.length - 1].id;
    await sequelize.query(
      `UPDATE pieces SET accessionKey = CASE id ${rows.map(() => 'WHEN ? THEN ?').join(' ')} END,
         accessionSort = CASE id ${rows.map(() => 'WHEN ? THEN ?').join(' ')} END WHERE id IN (?)`,
      {
        replacements: [
          ...rows.flatMap((r) => [r.id, accessionKey(r.accessionNumber)]),
          ...rows.flatMap((r) => [r.id, accessionSortKey(r.accessionNumber)]),
          rows.map((r) => r.id),
        ],
      },
    );
  }
  // Earlier imports allowed spaces, so two numbers may differ only by them: say which, rather than fail on the index.
  const clashes = await sequelize.query<{ numbers: string }>(
    "SELECT GROUP_CONCAT(accessionNumber SEPARATOR ' / ') AS numbers FROM pieces GROUP BY accessionKey HAVING COUNT(*) > 1",
    { type: QueryTypes.SELECT },
  );
  if (clashes.length)
    throw new Error(
      `These accession numbers differ only in case or spaces; renumber one of each first: ${clashes.map((c) => c.numbers).join('; ')}`,
    );
  await qi.changeColumn('pieces', 'accessionKey', { type: DataTypes.STRING(40), allowNull: false });
  await qi.changeColumn('pieces', 'accessionSort', { type: DataTypes.STRING(120, true), allowNull: false });
  await qi.addIndex('pieces', ['accessionKey'], { unique: true, name: 'pieces_accession_key' });
  await qi.addIndex('pieces', ['accessionSort', 'id'], { name: 'pieces_accession_sort' });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { sequelize } }) => {
  const qi = sequelize.getQueryInterface();
  await qi.removeColumn('pieces', 'accessionSort');
  await qi.removeColumn('pieces', 'accessionKey');
};

import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

/**
 * The archive list under load (issue 16, point 9).
 *
 * 1. piece_counts: how many pieces there are per (status, deleted), kept by triggers on `pieces` in the writing
 *    transaction, so the list's total without text or facet filters is a sum over a few rows instead of a COUNT(*)
 *    over 166,667 index entries (InnoDB keeps no row count: every COUNT(*) walks an index). Triggers see every
 *    writer (services, imports, the CLI, raw SQL); TRUNCATE does not fire them (nothing truncates `pieces`). Each
 *    change appends a delta row (+1/-1) rather than updating one counter row, so concurrent writers never wait on one
 *    another; server/routes/pieces/counts.ts folds the deltas back into one row per key now and then.
 *    With binary logging on, creating triggers needs SUPER or log_bin_trust_function_creators=1 (MariaDB docs,
 *    "Binary Logging of Stored Routines").
 * 2. Two indexes per sort order of the list (ascending, and descending with id still ascending: the list breaks ties
 *    by id ascending either way), each ending in (id, status, deletedAt): the page's ids are read from the index
 *    alone, in order (visibility filtered there, no row look-ups for the rows an OFFSET skips, no filesort), then the
 *    25 rows by id. Descending key parts are used from MariaDB 10.8 (earlier versions accept and ignore them).
 */
const SORTS = ['accessionSort', 'title', 'objectName', 'earliestYear', 'updatedAt', 'createdAt'] as const;
const indexName = (col: string, desc = false) => `pieces_list_${col}${desc ? '_desc' : ''}`;

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await qi.createTable(
    'piece_counts',
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      status: { type: DataTypes.STRING(16), allowNull: false },
      deleted: { type: DataTypes.BOOLEAN, allowNull: false },
      n: { type: DataTypes.INTEGER, allowNull: false },
    },
    { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' },
  );
  await qi.addIndex('piece_counts', ['status', 'deleted', 'n'], { name: 'piece_counts_key' });
  await sequelize.query(`CREATE TRIGGER pieces_count_insert AFTER INSERT ON pieces FOR EACH ROW
    INSERT INTO piece_counts (status, deleted, n) VALUES (NEW.status, NEW.deletedAt IS NOT NULL, 1)`);
  await sequelize.query(`CREATE TRIGGER pieces_count_delete AFTER DELETE ON pieces FOR EACH ROW
    INSERT INTO piece_counts (status, deleted, n) VALUES (OLD.status, OLD.deletedAt IS NOT NULL, -1)`);
  await sequelize.query(`CREATE TRIGGER pieces_count_update AFTER UPDATE ON pieces FOR EACH ROW
    IF NOT (NEW.status <=> OLD.status) OR (NEW.deletedAt IS NULL) <> (OLD.deletedAt IS NULL) THEN
      INSERT INTO piece_counts (status, deleted, n)
        VALUES (OLD.status, OLD.deletedAt IS NOT NULL, -1), (NEW.status, NEW.deletedAt IS NOT NULL, 1);
    END IF`);
  // Counted once the triggers are in place; like every migration this runs at start-up, before the server writes.
  await sequelize.query(`INSERT INTO piece_counts (status, deleted, n)
    SELECT status, deletedAt IS NOT NULL, COUNT(*) FROM pieces GROUP BY status, deletedAt IS NOT NULL`);
  for (const col of SORTS) {
    await qi.addIndex('pieces', [col, 'id', 'status', 'deletedAt'], { name: indexName(col) });
    await qi.addIndex('pieces', {
      name: indexName(col, true),
      fields: [{ name: col, order: 'DESC' }, 'id', 'status', 'deletedAt'],
    });
  }
  // Superseded by pieces_list_accessionSort, which starts with the same columns.
  await qi.removeIndex('pieces', 'pieces_accession_sort');
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await qi.addIndex('pieces', ['accessionSort', 'id'], { name: 'pieces_accession_sort' });
  for (const col of SORTS) {
    await qi.removeIndex('pieces', indexName(col));
    await qi.removeIndex('pieces', indexName(col, true));
  }
  for (const t of ['pieces_count_insert', 'pieces_count_delete', 'pieces_count_update'])
    await sequelize.query(`DROP TRIGGER IF EXISTS ${t}`);
  await qi.dropTable('piece_counts');
};

import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// Curatorial fields of a piece (issue 19): makers [{ name, role, dates }] and marks [{ text, kind, place }] as JSON
// lists, pattern name, storage location (staff only) and the object's and images' rights URIs (shared/rights.ts).
const TEXT_COLUMNS = [
  ['patternName', 160],
  ['storageLocation', 160],
  ['objectRights', 255],
  ['imageRights', 255],
] as const;
const LIST_COLUMNS = ['makers', 'marks'] as const;

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  for (const [c, n] of TEXT_COLUMNS) await qi.addColumn('pieces', c, { type: DataTypes.STRING(n), allowNull: true });
  // The lists default to an empty list in the database too (MariaDB takes a literal default on JSON since 10.2), so
  // existing rows get one and a write that names only the older columns still works.
  for (const c of LIST_COLUMNS)
    await qi.sequelize.query(`ALTER TABLE pieces ADD COLUMN \`${c}\` JSON NOT NULL DEFAULT '[]'`);
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  for (const c of LIST_COLUMNS) await qi.removeColumn('pieces', c);
  for (const [c] of TEXT_COLUMNS) await qi.removeColumn('pieces', c);
};

import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// The checked rows of a CSV import dry run (server/import/preview-store.ts), kept in MariaDB so that any app
// server can answer the next page of a preview another one made, and no process holds a 150,000-row preview in
// memory. A preview belongs to the user who made it and is removed a day after (expiresAt); its rows go with it.
// Per row: seq (0-based, file order), invalidSeq (0-based among rows with errors, NULL for a valid row) and
// errorEnd (how many errors the rows up to and including this one have) let each kind of page be read by range.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.createTable(
    'import_previews',
    {
      id: { type: DataTypes.CHAR(32), primaryKey: true, allowNull: false },
      createdById: {
        type: DataTypes.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: 'users', key: 'id' },
        onDelete: 'CASCADE',
      },
      rowCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      valid: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      invalid: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      errorCount: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      fileErrors: { type: DataTypes.TEXT('long'), allowNull: true },
      complete: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      expiresAt: { type: DataTypes.DATE(3), allowNull: false },
    },
    { engine: 'InnoDB', charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' },
  );
  await qi.addIndex('import_previews', ['expiresAt']);
  await qi.createTable(
    'import_preview_rows',
    {
      previewId: {
        type: DataTypes.CHAR(32),
        primaryKey: true,
        allowNull: false,
        references: { model: 'import_previews', key: 'id' },
        onDelete: 'CASCADE',
      },
      seq: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true, allowNull: false },
      invalidSeq: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      errorEnd: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      line: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      accessionNumber: { type: DataTypes.TEXT, allowNull: false },
      title: { type: DataTypes.TEXT, allowNull: false },
      errors: { type: DataTypes.TEXT('medium'), allowNull: true },
    },
    { engine: 'InnoDB', charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' },
  );
  await qi.addIndex('import_preview_rows', ['previewId', 'invalidSeq'], { name: 'import_preview_rows_invalid' });
  await qi.addIndex('import_preview_rows', ['previewId', 'errorEnd'], { name: 'import_preview_rows_errors' });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.dropTable('import_preview_rows');
  await qi.dropTable('import_previews');
};

import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// Admin-tunable values (e.g. the colour verdict bands), one JSON value per key with its source.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.createTable(
    'app_settings',
    {
      key: { type: DataTypes.STRING(80), primaryKey: true, allowNull: false },
      value: { type: DataTypes.JSON, allowNull: false },
      source: { type: DataTypes.STRING(255), allowNull: false },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      updatedAt: { type: DataTypes.DATE(3), allowNull: false },
    },
    { engine: 'InnoDB', charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' },
  );
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.dropTable('app_settings');
};

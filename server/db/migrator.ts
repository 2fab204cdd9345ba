import { Umzug, SequelizeStorage } from 'umzug';
import { DataTypes, type QueryInterface, type Sequelize } from 'sequelize';
import { migrations } from './migrations/index.ts';

export type MigrationContext = { queryInterface: QueryInterface; sequelize: Sequelize };

export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: migrations.map((m) => ({ name: m.name, up: m.up, down: m.down })),
    context: { queryInterface: sequelize.getQueryInterface(), sequelize },
    storage: new SequelizeStorage({ model: migrationModel(sequelize) }),
    logger: undefined,
  });
}

// Umzug's own table, defined here so it is utf8mb4 like every other table.
function migrationModel(sequelize: Sequelize) {
  return (
    sequelize.models.SchemaMigration ??
    sequelize.define(
      'SchemaMigration',
      { name: { type: DataTypes.STRING(190), allowNull: false, unique: true, primaryKey: true } },
      { tableName: 'schema_migrations', timestamps: false, charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' },
    )
  );
}

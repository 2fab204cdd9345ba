import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// The records behind a piece's claims (issue 19): analyses with their findings and report PDF, dated condition
// reports, and display periods (the light dose is computed from them, shared/compute/light-dose.ts).
const TABLE = { engine: 'InnoDB', charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' };
const pk = { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false };
const piece = {
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull: false,
  references: { model: 'pieces', key: 'id' },
  onDelete: 'CASCADE',
};
const user = {
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull: true,
  references: { model: 'users', key: 'id' },
  onDelete: 'SET NULL',
};
const stamps = {
  createdAt: { type: DataTypes.DATE(3), allowNull: false },
  updatedAt: { type: DataTypes.DATE(3), allowNull: false },
};

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.createTable(
    'analyses',
    {
      id: pk,
      pieceId: piece,
      method: { type: DataTypes.STRING(40), allowNull: false },
      regionId: {
        type: DataTypes.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: 'regions', key: 'id' },
        onDelete: 'SET NULL',
      },
      site: { type: DataTypes.STRING(500), allowNull: true },
      laboratory: { type: DataTypes.STRING(160), allowNull: true },
      analyst: { type: DataTypes.STRING(160), allowNull: true },
      analysedOn: { type: DataTypes.DATEONLY, allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: true },
      findings: { type: DataTypes.JSON, allowNull: false },
      reportSha256: { type: DataTypes.CHAR(64), allowNull: true },
      reportBytes: { type: DataTypes.BIGINT, allowNull: true },
      reportName: { type: DataTypes.STRING(255), allowNull: true },
      createdById: user,
      ...stamps,
    },
    TABLE,
  );
  await qi.addIndex('analyses', ['pieceId', 'analysedOn']);
  await qi.addIndex('analyses', ['method']);
  await qi.createTable(
    'condition_reports',
    {
      id: pk,
      pieceId: piece,
      assessedOn: { type: DataTypes.DATEONLY, allowNull: false },
      assessor: { type: DataTypes.STRING(160), allowNull: false },
      state: { type: DataTypes.STRING(120), allowNull: false },
      notes: { type: DataTypes.TEXT, allowNull: true },
      photoIds: { type: DataTypes.JSON, allowNull: false },
      regionIds: { type: DataTypes.JSON, allowNull: false },
      createdById: user,
      ...stamps,
    },
    TABLE,
  );
  await qi.addIndex('condition_reports', ['pieceId', 'assessedOn']);
  await qi.createTable(
    'display_periods',
    {
      id: pk,
      pieceId: piece,
      fromDate: { type: DataTypes.DATEONLY, allowNull: false },
      toDate: { type: DataTypes.DATEONLY, allowNull: false },
      lux: { type: DataTypes.DOUBLE, allowNull: false },
      hoursPerDay: { type: DataTypes.DOUBLE, allowNull: false },
      uvMicrowattsPerLumen: { type: DataTypes.DOUBLE, allowNull: true },
      place: { type: DataTypes.STRING(160), allowNull: true },
      createdById: user,
      ...stamps,
    },
    TABLE,
  );
  await qi.addIndex('display_periods', ['pieceId', 'fromDate']);
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.dropTable('display_periods');
  await qi.dropTable('condition_reports');
  await qi.dropTable('analyses');
};

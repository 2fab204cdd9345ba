import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// A fading pair: on one piece, a faded area and a protected one (a fold, a seam allowance, the back of a hem),
// each side a region of one of the piece's photos or a reading. Removing the region or reading removes the pair
// (ON DELETE CASCADE): a pair with a side missing means nothing.
const SIDE = (table: string) => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull: true,
  references: { model: table, key: 'id' },
  onDelete: 'CASCADE',
  onUpdate: 'CASCADE',
});

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.createTable(
    'fading_pairs',
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      pieceId: { ...SIDE('pieces'), allowNull: false },
      label: { type: DataTypes.STRING(160), allowNull: true },
      fadedRegionId: SIDE('regions'),
      fadedMeasurementId: SIDE('colour_measurements'),
      protectedRegionId: SIDE('regions'),
      protectedMeasurementId: SIDE('colour_measurements'),
      createdById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      updatedAt: { type: DataTypes.DATE(3), allowNull: false },
    },
    { engine: 'InnoDB', charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' },
  );
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.dropTable('fading_pairs');
};

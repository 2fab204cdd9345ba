import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// A photo may carry a colour chart (its four corners, the reference values and the fitted correction with
// per-patch errors: photos.chart, JSON), and its palettes a third variant computed through that correction
// ('calibrated'). Down drops the calibrated rows first so the narrower ENUM holds every remaining row.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.addColumn('photos', 'chart', { type: DataTypes.JSON, allowNull: true });
  await qi.changeColumn('palette_colours', 'variant', {
    type: DataTypes.ENUM('raw', 'corrected', 'calibrated'),
    allowNull: false,
    defaultValue: 'raw',
  });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await sequelize.query("DELETE FROM palette_colours WHERE variant = 'calibrated'");
  await qi.changeColumn('palette_colours', 'variant', {
    type: DataTypes.ENUM('raw', 'corrected'),
    allowNull: false,
    defaultValue: 'raw',
  });
  await qi.removeColumn('photos', 'chart');
};

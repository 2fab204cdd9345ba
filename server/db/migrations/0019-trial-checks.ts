import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// A trial's dry mass says whether it was weighed air-dry (commercial) or oven-dry, so % owf means the
// same across trials; a modern recipe step that uses a historical-only chemical records who confirmed
// it, when and why.
const STEP_COLUMNS = ['historicalUseReason', 'historicalUseConfirmedById', 'historicalUseConfirmedAt'] as const;

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.addColumn('trials', 'dryMassBasis', {
    type: DataTypes.ENUM('air-dry', 'oven-dry'),
    allowNull: false,
    defaultValue: 'air-dry',
  });
  await qi.addColumn('recipe_steps', 'historicalUseReason', { type: DataTypes.TEXT, allowNull: true });
  await qi.addColumn('recipe_steps', 'historicalUseConfirmedById', {
    type: DataTypes.INTEGER.UNSIGNED,
    allowNull: true,
  });
  await qi.addColumn('recipe_steps', 'historicalUseConfirmedAt', { type: DataTypes.DATE(3), allowNull: true });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  for (const c of STEP_COLUMNS) await qi.removeColumn('recipe_steps', c);
  await qi.removeColumn('trials', 'dryMassBasis');
};

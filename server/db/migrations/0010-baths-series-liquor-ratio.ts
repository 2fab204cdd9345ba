import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// A series plans every cell at one liquor ratio; the materials list needs it for water volumes.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.addColumn('trial_series', 'liquorRatio', { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 30 });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.removeColumn('trial_series', 'liquorRatio');
};

import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// A series may aim at one colour of its piece (a palette colour, a region or a measurement);
// the trials it plans take that target, so every card of the series shows ΔE00 to the same colour.
const COLUMNS = ['targetPaletteColourId', 'targetRegionId', 'targetMeasurementId'] as const;

export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  for (const c of COLUMNS) await qi.addColumn('trial_series', c, { type: DataTypes.INTEGER.UNSIGNED, allowNull: true });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  for (const c of COLUMNS) await qi.removeColumn('trial_series', c);
};

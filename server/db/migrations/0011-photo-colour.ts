import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// Each photo records how its colours were read (embedded profile or none, bit depth, colour space),
// and a palette colour whether its background flag was set by hand, so a recompute keeps it.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.addColumn('photos', 'colour', { type: DataTypes.JSON, allowNull: true });
  await qi.addColumn('palette_colours', 'backgroundManual', {
    type: DataTypes.BOOLEAN,
    allowNull: false,
    defaultValue: false,
  });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.removeColumn('palette_colours', 'backgroundManual');
  await qi.removeColumn('photos', 'colour');
};

import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// A reading may carry its reflectance spectrum ({ startNm, intervalNm, values } with values as
// fractions 0–1; shared/colour/spectral.ts). Its L*a*b* columns then hold the values computed for
// the reading's own illuminant and observer, and comparisons compute it afresh for the target's.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.addColumn('colour_measurements', 'spectrum', { type: DataTypes.JSON, allowNull: true });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.removeColumn('colour_measurements', 'spectrum');
};

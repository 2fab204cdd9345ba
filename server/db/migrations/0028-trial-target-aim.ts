import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// What a trial aims at when its target is one side of a fading pair: the piece as made (the protected
// area) or as seen (the faded one). Null when the target is not read either way.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.addColumn('trials', 'targetAim', { type: DataTypes.ENUM('as-made', 'as-seen'), allowNull: true });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.removeColumn('trials', 'targetAim');
};

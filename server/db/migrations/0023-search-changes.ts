import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// The search change log: every write that affects search appends a row here in the same transaction
// (server/search/hooks.ts); every app server applies the rows in id order to its in-process indexes
// (server/search/follow.ts). kind: piece | trial | photo; entityId: that row's id. Rows are pruned after a day.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.createTable('search_changes', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    kind: { type: DataTypes.STRING(16), allowNull: false },
    entityId: { type: DataTypes.INTEGER, allowNull: false },
    createdAt: {
      type: DataTypes.DATE(3),
      allowNull: false,
      defaultValue: qi.sequelize.literal('CURRENT_TIMESTAMP(3)'),
    },
  });
  await qi.addIndex('search_changes', ['createdAt'], { name: 'search_changes_created' });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.dropTable('search_changes');
};

import { DataTypes, QueryTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// A recipe step that draws from a bath owns the bath's `use` event (batch_events.stepId), so the draw is
// entered once. No foreign key: the recipe is replaced as a whole, and the service re-points the link to
// the new step row inside the same transaction. Existing draws are linked where the ledger already holds
// a use of the same trial, bath and volume (the draw entered twice before).
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi, sequelize } }) => {
  await qi.addColumn('batch_events', 'stepId', { type: DataTypes.INTEGER.UNSIGNED, allowNull: true });
  await qi.addIndex('batch_events', ['stepId'], { name: 'batch_events_step' });
  const steps = await sequelize.query<{ id: number; trialId: number; batchId: number; batchVolumeMl: number }>(
    'SELECT id, trialId, batchId, batchVolumeMl FROM recipe_steps WHERE batchId IS NOT NULL AND batchVolumeMl IS NOT NULL ORDER BY id',
    { type: QueryTypes.SELECT },
  );
  for (const s of steps) {
    await sequelize.query(
      "UPDATE batch_events SET stepId = ? WHERE type = 'use' AND stepId IS NULL AND trialId = ? AND batchId = ? AND volumeMl = ? ORDER BY id LIMIT 1",
      { replacements: [s.id, s.trialId, s.batchId, s.batchVolumeMl] },
    );
  }
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.removeIndex('batch_events', 'batch_events_step');
  await qi.removeColumn('batch_events', 'stepId');
};

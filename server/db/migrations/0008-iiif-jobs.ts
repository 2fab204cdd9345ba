import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// Background work (tiling, fixity checks) kept in MariaDB so it survives a restart
// and any app server can claim it with SELECT … FOR UPDATE SKIP LOCKED.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface } }) => {
  await queryInterface.createTable(
    'jobs',
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
      type: { type: DataTypes.STRING(40), allowNull: false },
      payload: { type: DataTypes.JSON, allowNull: false },
      // Which record the job is about, so status lookups need no JSON path query.
      subjectType: { type: DataTypes.STRING(20), allowNull: true },
      subjectId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      state: { type: DataTypes.ENUM('queued', 'running', 'done', 'failed'), allowNull: false, defaultValue: 'queued' },
      progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      maxAttempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 3 },
      error: { type: DataTypes.TEXT, allowNull: true },
      result: { type: DataTypes.JSON, allowNull: true },
      lockedBy: { type: DataTypes.STRING(80), allowNull: true },
      lockedAt: { type: DataTypes.DATE(3), allowNull: true },
      runAfter: { type: DataTypes.DATE(3), allowNull: false },
      startedAt: { type: DataTypes.DATE(3), allowNull: true },
      finishedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdById: {
        type: DataTypes.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: 'users', key: 'id' },
        onDelete: 'SET NULL',
        onUpdate: 'CASCADE',
      },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      updatedAt: { type: DataTypes.DATE(3), allowNull: false },
    },
    { engine: 'InnoDB', charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' },
  );
  // The claim query scans queued jobs by runAfter; the stale sweep scans running jobs by lockedAt.
  await queryInterface.addIndex('jobs', ['state', 'runAfter', 'id'], { name: 'jobs_claim' });
  await queryInterface.addIndex('jobs', ['state', 'lockedAt'], { name: 'jobs_stale' });
  await queryInterface.addIndex('jobs', ['subjectType', 'subjectId', 'type'], { name: 'jobs_subject' });
  await queryInterface.addIndex('jobs', ['type', 'state', 'finishedAt'], { name: 'jobs_type_state' });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface } }) => {
  await queryInterface.dropTable('jobs');
};

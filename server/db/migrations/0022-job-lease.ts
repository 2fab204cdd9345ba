import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// A running job holds a lease: jobs.leaseUntil is set on claim and pushed forward by the worker's heartbeat
// (lockedAt doubles as the time of the last heartbeat). A job whose lease ran out belongs to a dead worker and is
// queued again (server/jobs/queue.ts requeueExpired). Rows running before this migration keep a NULL lease and are
// judged by lockedAt as before.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.addColumn('jobs', 'leaseUntil', { type: DataTypes.DATE(3), allowNull: true });
  await qi.addIndex('jobs', ['state', 'leaseUntil'], { name: 'jobs_state_lease' });
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.removeIndex('jobs', 'jobs_state_lease');
  await qi.removeColumn('jobs', 'leaseUntil');
};

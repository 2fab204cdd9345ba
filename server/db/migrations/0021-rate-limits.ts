import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// Sign-in and password-reset counters shared by every app server (server/auth/rate-limit-store.ts). One row per
// limiter and client key; the key is kept only as a SHA-256 (an IP address or e-mail address is never stored as
// such). resetAt is when the current window ends; rows whose window ended are swept.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.createTable(
    'rate_limits',
    {
      keyHash: { type: DataTypes.CHAR(64), primaryKey: true, allowNull: false },
      hits: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      resetAt: { type: DataTypes.DATE(3), allowNull: false },
    },
    { engine: 'InnoDB', charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' },
  );
  await qi.addIndex('rate_limits', ['resetAt']);
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.dropTable('rate_limits');
};

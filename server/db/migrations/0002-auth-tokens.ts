import { DataTypes } from 'sequelize';
import type { MigrationFn } from 'umzug';
import type { MigrationContext } from '../migrator.ts';

// One-time tokens for invitations and password resets; only a SHA-256 of the token is kept.
export const up: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.createTable(
    'auth_tokens',
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
      purpose: { type: DataTypes.ENUM('invitation', 'password-reset'), allowNull: false },
      tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
      email: { type: DataTypes.STRING(254), allowNull: false },
      role: { type: DataTypes.ENUM('admin', 'curator', 'researcher', 'dyer'), allowNull: true },
      userId: {
        type: DataTypes.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: 'users', key: 'id' },
        onDelete: 'CASCADE',
        onUpdate: 'CASCADE',
      },
      createdById: {
        type: DataTypes.INTEGER.UNSIGNED,
        allowNull: true,
        references: { model: 'users', key: 'id' },
        onDelete: 'SET NULL',
        onUpdate: 'CASCADE',
      },
      expiresAt: { type: DataTypes.DATE(3), allowNull: false },
      usedAt: { type: DataTypes.DATE(3), allowNull: true },
      createdAt: { type: DataTypes.DATE(3), allowNull: false },
      updatedAt: { type: DataTypes.DATE(3), allowNull: false },
    },
    { engine: 'InnoDB', charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci' },
  );
  await qi.addIndex('auth_tokens', ['email', 'purpose']);
};

export const down: MigrationFn<MigrationContext> = async ({ context: { queryInterface: qi } }) => {
  await qi.dropTable('auth_tokens');
};

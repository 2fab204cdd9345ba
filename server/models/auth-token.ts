import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';
import type { Role } from '../../shared/roles.ts';

export type TokenPurpose = 'invitation' | 'password-reset';

/** A one-time invitation or password-reset token; only its SHA-256 is stored. */
export class AuthToken extends Model<InferAttributes<AuthToken>, InferCreationAttributes<AuthToken>> {
  declare id: CreationOptional<number>;
  declare purpose: TokenPurpose;
  declare tokenHash: string;
  declare email: string;
  declare role: Role | null;
  declare userId: number | null;
  declare createdById: number | null;
  declare expiresAt: Date;
  declare usedAt: Date | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    AuthToken.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        purpose: { type: DataTypes.ENUM('invitation', 'password-reset'), allowNull: false },
        tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
        email: { type: DataTypes.STRING(254), allowNull: false },
        role: { type: DataTypes.ENUM('admin', 'curator', 'researcher', 'dyer'), allowNull: true },
        userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        createdById: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        expiresAt: { type: DataTypes.DATE(3), allowNull: false },
        usedAt: { type: DataTypes.DATE(3), allowNull: true },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'auth_tokens' },
    );
  }
}

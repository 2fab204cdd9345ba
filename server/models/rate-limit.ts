import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One rate-limit counter shared by every app server: hits in the window that ends at resetAt (key kept as SHA-256). */
export class RateLimit extends Model<InferAttributes<RateLimit>, InferCreationAttributes<RateLimit>> {
  declare keyHash: string;
  declare hits: number;
  declare resetAt: Date;

  static initModel(sequelize: Sequelize) {
    RateLimit.init(
      {
        keyHash: { type: DataTypes.CHAR(64), primaryKey: true },
        hits: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
        resetAt: { type: DataTypes.DATE(3), allowNull: false },
      },
      { sequelize, tableName: 'rate_limits', timestamps: false },
    );
  }
}

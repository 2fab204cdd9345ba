import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** One admin-tunable value, stored as JSON under a dotted key, with where its default came from. */
export class AppSetting extends Model<InferAttributes<AppSetting>, InferCreationAttributes<AppSetting>> {
  declare key: string;
  declare value: unknown;
  declare source: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    AppSetting.init(
      {
        key: { type: DataTypes.STRING(80), primaryKey: true },
        value: { type: DataTypes.JSON, allowNull: false },
        source: { type: DataTypes.STRING(255), allowNull: false },
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'app_settings' },
    );
  }
}

import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** express-session rows (connect-session-sequelize); userId lets a deactivation end a user's sessions at once. */
export class Session extends Model<InferAttributes<Session>, InferCreationAttributes<Session>> {
  declare sid: string;
  declare userId: number | null;
  declare expires: Date | null;
  declare data: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    Session.init(
      {
        sid: { type: DataTypes.STRING(64), primaryKey: true },
        userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
        expires: DataTypes.DATE,
        data: DataTypes.TEXT,
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'sessions', modelName: 'Session' },
    );
  }
}

import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A faded area of a piece paired with a protected one; each side a region or a reading (migration 0029). */
export class FadingPair extends Model<InferAttributes<FadingPair>, InferCreationAttributes<FadingPair>> {
  declare id: CreationOptional<number>;
  declare pieceId: number;
  declare label: string | null;
  declare fadedRegionId: number | null;
  declare fadedMeasurementId: number | null;
  declare protectedRegionId: number | null;
  declare protectedMeasurementId: number | null;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;

  static initModel(sequelize: Sequelize) {
    const fk = () => ({ type: DataTypes.INTEGER.UNSIGNED, allowNull: true });
    FadingPair.init(
      {
        id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
        pieceId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
        label: { type: DataTypes.STRING(160), allowNull: true },
        fadedRegionId: fk(),
        fadedMeasurementId: fk(),
        protectedRegionId: fk(),
        protectedMeasurementId: fk(),
        createdById: fk(),
        createdAt: DataTypes.DATE(3),
        updatedAt: DataTypes.DATE(3),
      },
      { sequelize, tableName: 'fading_pairs' },
    );
  }
}

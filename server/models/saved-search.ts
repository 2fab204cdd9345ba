import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A search saved by name by one user (migration 0033): the /search page's query string, without the "?". */
export class SavedSearch extends Model<InferAttributes<SavedSearch>, InferCreationAttributes<SavedSearch>> {
  declare id: CreationOptional<number>;
  declare userId: number;
  declare name: string;
  declare query: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initSavedSearchModel(sequelize: Sequelize) {
  SavedSearch.init(
    {
      id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
      userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      name: { type: DataTypes.STRING(120), allowNull: false },
      query: { type: DataTypes.STRING(2000), allowNull: false },
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'saved_searches' },
  );
}

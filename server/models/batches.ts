import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export type BatchKind = 'mordant-bath' | 'print-paste' | 'dye-bath' | 'vat' | 'stock';
export type BatchStatus = 'active' | 'exhausted' | 'disposed';
export type BatchEventType = 'use' | 'top-up' | 'water' | 'test-strip' | 'ph' | 'disposal';
export type BatchIngredient = { kind: 'dyestuff' | 'chemical'; refId: number; name: string; grams: number };

export class MordantBatch extends Model<InferAttributes<MordantBatch>, InferCreationAttributes<MordantBatch>> {
  declare id: CreationOptional<number>;
  declare code: string;
  declare kind: BatchKind;
  declare name: string;
  declare ingredients: BatchIngredient[];
  declare volumeMl: number;
  declare thickenerGPerL: number | null;
  declare ph: number | null;
  declare madeOn: string;
  declare madeById: number | null;
  declare checkBy: string | null;
  declare status: CreationOptional<BatchStatus>;
  declare parentId: number | null;
  declare uptakePerUse: CreationOptional<number>;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class BatchEvent extends Model<InferAttributes<BatchEvent>, InferCreationAttributes<BatchEvent>> {
  declare id: CreationOptional<number>;
  declare batchId: number;
  declare type: BatchEventType;
  declare volumeMl: number | null;
  declare fibreMassG: number | null;
  declare trialId: number | null;
  /** The recipe step this use belongs to: the step owns the draw (edited and removed with it). */
  declare stepId: CreationOptional<number | null>;
  declare additions: BatchIngredient[] | null;
  declare ph: number | null;
  declare result: string | null;
  declare route: string | null;
  declare ruleFollowed: string | null;
  declare notes: string | null;
  declare occurredAt: Date;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const pk = () => ({ type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true });
const fk = () => ({ type: DataTypes.INTEGER.UNSIGNED, allowNull: true });
const stamps = () => ({ createdAt: DataTypes.DATE(3), updatedAt: DataTypes.DATE(3) });

export function initBatchModels(sequelize: Sequelize) {
  MordantBatch.init(
    {
      id: pk(),
      code: { type: DataTypes.STRING(20), allowNull: false, unique: true },
      kind: { type: DataTypes.ENUM('mordant-bath', 'print-paste', 'dye-bath', 'vat', 'stock'), allowNull: false },
      name: { type: DataTypes.STRING(160), allowNull: false },
      ingredients: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      volumeMl: { type: DataTypes.DOUBLE, allowNull: false },
      thickenerGPerL: DataTypes.DOUBLE,
      ph: { type: DataTypes.DECIMAL(4, 2), allowNull: true },
      madeOn: { type: DataTypes.DATEONLY, allowNull: false },
      madeById: fk(),
      checkBy: DataTypes.DATEONLY,
      status: { type: DataTypes.ENUM('active', 'exhausted', 'disposed'), allowNull: false, defaultValue: 'active' },
      parentId: fk(),
      uptakePerUse: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0.1 },
      notes: DataTypes.TEXT,
      ...stamps(),
    },
    { sequelize, tableName: 'mordant_batches' },
  );
  BatchEvent.init(
    {
      id: pk(),
      batchId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      type: { type: DataTypes.ENUM('use', 'top-up', 'water', 'test-strip', 'ph', 'disposal'), allowNull: false },
      volumeMl: DataTypes.DOUBLE,
      fibreMassG: DataTypes.DOUBLE,
      trialId: fk(),
      stepId: fk(),
      additions: DataTypes.JSON,
      ph: { type: DataTypes.DECIMAL(4, 2), allowNull: true },
      result: DataTypes.STRING(255),
      route: DataTypes.STRING(255),
      ruleFollowed: DataTypes.STRING(255),
      notes: DataTypes.TEXT,
      occurredAt: { type: DataTypes.DATE(3), allowNull: false },
      createdById: fk(),
      ...stamps(),
    },
    { sequelize, tableName: 'batch_events' },
  );
}

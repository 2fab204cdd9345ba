import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

/** A fading pair's side a trial aims at: the piece as made (protected area) or as seen (faded). */
export type TargetAim = 'as-made' | 'as-seen';
export type TrialStatus = 'planned' | 'in-progress' | 'finished' | 'abandoned';
export type Operation =
  'scour' | 'tannin' | 'mordant-bath' | 'print-paste' | 'dye-bath' | 'vat' | 'overdye' | 'after-treatment' | 'rinse';
export type Ingredient = {
  kind: 'dyestuff' | 'chemical';
  refId: number;
  name: string;
  amount: number;
  basis: 'owf' | 'g/L' | 'g';
};

export class Trial extends Model<InferAttributes<Trial>, InferCreationAttributes<Trial>> {
  declare id: CreationOptional<number>;
  declare code: string;
  declare pieceId: number | null;
  declare seriesId: number | null;
  declare cell: Record<string, string> | null;
  declare targetPaletteColourId: number | null;
  declare targetRegionId: number | null;
  declare targetMeasurementId: number | null;
  declare targetAim: CreationOptional<TargetAim | null>;
  declare dyerId: number | null;
  declare status: CreationOptional<TrialStatus>;
  declare kind: CreationOptional<'modern' | 'historical'>;
  declare fibre: string | null;
  declare weave: string | null;
  declare gsm: number | null;
  declare dryMassG: number;
  declare dryMassBasis: CreationOptional<'air-dry' | 'oven-dry'>;
  declare fastness: Record<string, unknown> | null;
  declare notes: string | null;
  declare startedOn: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class RecipeStep extends Model<InferAttributes<RecipeStep>, InferCreationAttributes<RecipeStep>> {
  declare id: CreationOptional<number>;
  declare trialId: number;
  declare position: number;
  declare operation: Operation;
  declare ingredients: Ingredient[];
  declare liquorRatio: number | null;
  declare temperatureC: number | null;
  declare minutes: number | null;
  declare ph: number | null;
  declare paste: Record<string, unknown> | null;
  declare batchId: number | null;
  declare batchVolumeMl: number | null;
  declare notes: string | null;
  /** A historical-only chemical in a modern trial: why, who confirmed it and when. */
  declare historicalUseReason: CreationOptional<string | null>;
  declare historicalUseConfirmedById: CreationOptional<number | null>;
  declare historicalUseConfirmedAt: CreationOptional<Date | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export type SubstitutionReason = 'toxicity' | 'regulation' | 'availability' | 'waste';

export class Substitution extends Model<InferAttributes<Substitution>, InferCreationAttributes<Substitution>> {
  declare id: CreationOptional<number>;
  declare trialId: number;
  declare stepId: number | null;
  declare historicalChemicalId: number | null;
  declare historicalPractice: string | null;
  declare historicalAmountG: number | null;
  declare modernChemicalId: number | null;
  declare modernPractice: string | null;
  declare modernAmountG: number | null;
  declare reason: SubstitutionReason;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class TrialSeries extends Model<InferAttributes<TrialSeries>, InferCreationAttributes<TrialSeries>> {
  declare id: CreationOptional<number>;
  declare code: string;
  declare title: string;
  declare kind: CreationOptional<'series' | 'workshop'>;
  declare pieceId: number | null;
  declare targetPaletteColourId: CreationOptional<number | null>;
  declare targetRegionId: CreationOptional<number | null>;
  declare targetMeasurementId: CreationOptional<number | null>;
  declare factors: Array<{ name: string; levels: string[] }>;
  declare cells: Array<Record<string, unknown>>;
  declare participants: string[];
  declare dryMassG: number | null;
  declare deadVolumePct: CreationOptional<number>;
  declare liquorRatio: CreationOptional<number>;
  declare ownerId: number | null;
  declare heldOn: string | null;
  declare notes: string | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const pk = () => ({ type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true });
const fk = () => ({ type: DataTypes.INTEGER.UNSIGNED, allowNull: true });
const stamps = () => ({ createdAt: DataTypes.DATE(3), updatedAt: DataTypes.DATE(3) });
// DECIMAL(4,2) pH arrives as a number through decimalAsNumber.
const ph = () => ({ type: DataTypes.DECIMAL(4, 2), allowNull: true });

export function initTrialModels(sequelize: Sequelize) {
  Trial.init(
    {
      id: pk(),
      code: { type: DataTypes.STRING(16), allowNull: false, unique: true },
      pieceId: fk(),
      seriesId: fk(),
      cell: DataTypes.JSON,
      targetPaletteColourId: fk(),
      targetRegionId: fk(),
      targetMeasurementId: fk(),
      targetAim: { type: DataTypes.ENUM('as-made', 'as-seen'), allowNull: true },
      dyerId: fk(),
      status: {
        type: DataTypes.ENUM('planned', 'in-progress', 'finished', 'abandoned'),
        allowNull: false,
        defaultValue: 'planned',
      },
      kind: { type: DataTypes.ENUM('modern', 'historical'), allowNull: false, defaultValue: 'modern' },
      fibre: DataTypes.STRING(80),
      weave: DataTypes.STRING(80),
      gsm: DataTypes.DOUBLE,
      dryMassG: { type: DataTypes.DOUBLE, allowNull: false },
      dryMassBasis: { type: DataTypes.ENUM('air-dry', 'oven-dry'), allowNull: false, defaultValue: 'air-dry' },
      fastness: DataTypes.JSON,
      notes: DataTypes.TEXT,
      startedOn: DataTypes.DATEONLY,
      ...stamps(),
    },
    { sequelize, tableName: 'trials' },
  );
  RecipeStep.init(
    {
      id: pk(),
      trialId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      position: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
      operation: {
        type: DataTypes.ENUM(
          'scour',
          'tannin',
          'mordant-bath',
          'print-paste',
          'dye-bath',
          'vat',
          'overdye',
          'after-treatment',
          'rinse',
        ),
        allowNull: false,
      },
      ingredients: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      liquorRatio: DataTypes.DOUBLE,
      temperatureC: DataTypes.DOUBLE,
      minutes: DataTypes.DOUBLE,
      ph: ph(),
      paste: DataTypes.JSON,
      batchId: fk(),
      batchVolumeMl: DataTypes.DOUBLE,
      notes: DataTypes.TEXT,
      historicalUseReason: DataTypes.TEXT,
      historicalUseConfirmedById: fk(),
      historicalUseConfirmedAt: DataTypes.DATE(3),
      ...stamps(),
    },
    { sequelize, tableName: 'recipe_steps' },
  );
  Substitution.init(
    {
      id: pk(),
      trialId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      stepId: fk(),
      historicalChemicalId: fk(),
      historicalPractice: DataTypes.STRING(255),
      historicalAmountG: DataTypes.DOUBLE,
      modernChemicalId: fk(),
      modernPractice: DataTypes.STRING(255),
      modernAmountG: DataTypes.DOUBLE,
      reason: { type: DataTypes.ENUM('toxicity', 'regulation', 'availability', 'waste'), allowNull: false },
      notes: DataTypes.TEXT,
      ...stamps(),
    },
    { sequelize, tableName: 'substitutions' },
  );
  TrialSeries.init(
    {
      id: pk(),
      code: { type: DataTypes.STRING(20), allowNull: false, unique: true },
      title: { type: DataTypes.STRING(200), allowNull: false },
      kind: { type: DataTypes.ENUM('series', 'workshop'), allowNull: false, defaultValue: 'series' },
      pieceId: fk(),
      targetPaletteColourId: fk(),
      targetRegionId: fk(),
      targetMeasurementId: fk(),
      factors: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      cells: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      participants: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      dryMassG: DataTypes.DOUBLE,
      deadVolumePct: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 10 },
      liquorRatio: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 30 },
      ownerId: fk(),
      heldOn: DataTypes.DATEONLY,
      notes: DataTypes.TEXT,
      ...stamps(),
    },
    { sequelize, tableName: 'trial_series' },
  );
}

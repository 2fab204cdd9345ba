import type { HazardBasis } from '../../shared/schemas/reference.ts';
import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export type Vocabulary = 'fibre' | 'weave' | 'technique';

export class VocabularyTerm extends Model<InferAttributes<VocabularyTerm>, InferCreationAttributes<VocabularyTerm>> {
  declare id: CreationOptional<number>;
  declare vocabulary: Vocabulary;
  declare term: string;
  declare note: string | null;
  declare source: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class Dyestuff extends Model<InferAttributes<Dyestuff>, InferCreationAttributes<Dyestuff>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare ciName: string | null;
  declare colorants: string | null;
  declare species: string | null;
  declare dyeClass: string | null;
  declare source: string;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export type ChemicalRole = 'mordant' | 'assistant' | 'reducer' | 'alkali' | 'acid' | 'tannin' | 'thickener';
export type ChemicalStatus = 'permitted' | 'restricted' | 'historical-only';

export class Chemical extends Model<InferAttributes<Chemical>, InferCreationAttributes<Chemical>> {
  declare id: CreationOptional<number>;
  declare name: string;
  declare role: ChemicalRole;
  declare formula: string | null;
  declare metal: string | null;
  declare status: ChemicalStatus;
  declare signalWord: 'Danger' | 'Warning' | null;
  declare hStatements: string[];
  declare ppe: string | null;
  declare caution: string | null;
  declare source: string;
  declare hazardSource: string | null;
  /** 'harmonised' (EU CLP Annex VI) | 'supplier' | 'memory'; see HAZARD_BASES in shared/schemas/reference.ts. */
  declare hazardBasis: CreationOptional<HazardBasis | null>;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const pk = () => ({ type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true });
const stamps = () => ({ createdAt: DataTypes.DATE(3), updatedAt: DataTypes.DATE(3) });

export function initReferenceModels(sequelize: Sequelize) {
  VocabularyTerm.init(
    {
      id: pk(),
      vocabulary: { type: DataTypes.ENUM('fibre', 'weave', 'technique'), allowNull: false },
      term: { type: DataTypes.STRING(120), allowNull: false },
      note: DataTypes.TEXT,
      source: { type: DataTypes.STRING(255), allowNull: false },
      ...stamps(),
    },
    { sequelize, tableName: 'vocabulary_terms' },
  );
  Dyestuff.init(
    {
      id: pk(),
      name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
      ciName: DataTypes.STRING(60),
      colorants: DataTypes.STRING(255),
      species: DataTypes.STRING(255),
      dyeClass: DataTypes.STRING(60),
      source: { type: DataTypes.STRING(255), allowNull: false },
      ...stamps(),
    },
    { sequelize, tableName: 'dyestuffs' },
  );
  Chemical.init(
    {
      id: pk(),
      name: { type: DataTypes.STRING(120), allowNull: false, unique: true },
      role: {
        type: DataTypes.ENUM('mordant', 'assistant', 'reducer', 'alkali', 'acid', 'tannin', 'thickener'),
        allowNull: false,
      },
      formula: DataTypes.STRING(80),
      metal: DataTypes.STRING(4),
      status: { type: DataTypes.ENUM('permitted', 'restricted', 'historical-only'), allowNull: false },
      signalWord: DataTypes.ENUM('Danger', 'Warning'),
      hStatements: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      ppe: DataTypes.STRING(255),
      caution: DataTypes.TEXT,
      source: { type: DataTypes.STRING(255), allowNull: false },
      hazardSource: DataTypes.STRING(255),
      hazardBasis: { type: DataTypes.ENUM('harmonised', 'supplier', 'memory'), allowNull: true, defaultValue: null },
      ...stamps(),
    },
    { sequelize, tableName: 'chemicals' },
  );
}

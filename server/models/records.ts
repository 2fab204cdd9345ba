import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export type AnalysisFinding = {
  substance: string;
  confidence: 'confirmed' | 'probable' | 'possible' | 'not-found';
};

/** An analysis of a piece: method, sample or site, laboratory, findings and the report PDF (hashed like a master). */
export class Analysis extends Model<InferAttributes<Analysis>, InferCreationAttributes<Analysis>> {
  declare id: CreationOptional<number>;
  declare pieceId: number;
  declare method: string;
  declare regionId: number | null;
  declare site: string | null;
  declare laboratory: string | null;
  declare analyst: string | null;
  declare analysedOn: string;
  declare notes: string | null;
  declare findings: AnalysisFinding[];
  declare reportSha256: string | null;
  declare reportBytes: number | null;
  declare reportName: string | null;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class ConditionReport extends Model<InferAttributes<ConditionReport>, InferCreationAttributes<ConditionReport>> {
  declare id: CreationOptional<number>;
  declare pieceId: number;
  declare assessedOn: string;
  declare assessor: string;
  declare state: string;
  declare notes: string | null;
  declare photoIds: number[];
  declare regionIds: number[];
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export class DisplayPeriod extends Model<InferAttributes<DisplayPeriod>, InferCreationAttributes<DisplayPeriod>> {
  declare id: CreationOptional<number>;
  declare pieceId: number;
  declare fromDate: string;
  declare toDate: string;
  declare lux: number;
  declare hoursPerDay: number;
  declare uvMicrowattsPerLumen: number | null;
  declare place: string | null;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

const pk = () => ({ type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true });
const pieceFk = () => ({ type: DataTypes.INTEGER.UNSIGNED, allowNull: false });
const fk = () => ({ type: DataTypes.INTEGER.UNSIGNED, allowNull: true });
const stamps = () => ({ createdAt: DataTypes.DATE(3), updatedAt: DataTypes.DATE(3) });

export function initRecordModels(sequelize: Sequelize) {
  Analysis.init(
    {
      id: pk(),
      pieceId: pieceFk(),
      method: { type: DataTypes.STRING(40), allowNull: false },
      regionId: fk(),
      site: DataTypes.STRING(500),
      laboratory: DataTypes.STRING(160),
      analyst: DataTypes.STRING(160),
      analysedOn: { type: DataTypes.DATEONLY, allowNull: false },
      notes: DataTypes.TEXT,
      findings: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      reportSha256: DataTypes.CHAR(64),
      reportBytes: DataTypes.BIGINT,
      reportName: DataTypes.STRING(255),
      createdById: fk(),
      ...stamps(),
    },
    { sequelize, tableName: 'analyses' },
  );
  ConditionReport.init(
    {
      id: pk(),
      pieceId: pieceFk(),
      assessedOn: { type: DataTypes.DATEONLY, allowNull: false },
      assessor: { type: DataTypes.STRING(160), allowNull: false },
      state: { type: DataTypes.STRING(120), allowNull: false },
      notes: DataTypes.TEXT,
      photoIds: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      regionIds: { type: DataTypes.JSON, allowNull: false, defaultValue: [] },
      createdById: fk(),
      ...stamps(),
    },
    { sequelize, tableName: 'condition_reports' },
  );
  DisplayPeriod.init(
    {
      id: pk(),
      pieceId: pieceFk(),
      fromDate: { type: DataTypes.DATEONLY, allowNull: false },
      toDate: { type: DataTypes.DATEONLY, allowNull: false },
      lux: { type: DataTypes.DOUBLE, allowNull: false },
      hoursPerDay: { type: DataTypes.DOUBLE, allowNull: false },
      uvMicrowattsPerLumen: DataTypes.DOUBLE,
      place: DataTypes.STRING(160),
      createdById: fk(),
      ...stamps(),
    },
    { sequelize, tableName: 'display_periods' },
  );
}

import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export type JobState = 'queued' | 'running' | 'done' | 'failed';

export class Job extends Model<InferAttributes<Job>, InferCreationAttributes<Job>> {
  declare id: CreationOptional<number>;
  declare type: string;
  declare payload: Record<string, unknown>;
  declare subjectType: string | null;
  declare subjectId: number | null;
  declare state: CreationOptional<JobState>;
  declare progress: CreationOptional<number>;
  declare attempts: CreationOptional<number>;
  declare maxAttempts: CreationOptional<number>;
  declare error: string | null;
  declare result: Record<string, unknown> | null;
  declare lockedBy: string | null;
  declare lockedAt: Date | null;
  /** Until when the worker in lockedBy holds the job; its heartbeat pushes this forward (migration 0022). */
  declare leaseUntil: CreationOptional<Date | null>;
  declare runAfter: Date;
  declare startedAt: Date | null;
  declare finishedAt: Date | null;
  declare createdById: number | null;
  declare createdAt: CreationOptional<Date>;
  declare updatedAt: CreationOptional<Date>;
}

export function initJobModel(sequelize: Sequelize) {
  Job.init(
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      type: { type: DataTypes.STRING(40), allowNull: false },
      payload: { type: DataTypes.JSON, allowNull: false },
      subjectType: DataTypes.STRING(20),
      subjectId: DataTypes.INTEGER.UNSIGNED,
      state: { type: DataTypes.ENUM('queued', 'running', 'done', 'failed'), allowNull: false, defaultValue: 'queued' },
      progress: { type: DataTypes.DOUBLE, allowNull: false, defaultValue: 0 },
      attempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
      maxAttempts: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 3 },
      error: DataTypes.TEXT,
      result: DataTypes.JSON,
      lockedBy: DataTypes.STRING(80),
      lockedAt: DataTypes.DATE(3),
      leaseUntil: DataTypes.DATE(3),
      runAfter: { type: DataTypes.DATE(3), allowNull: false },
      startedAt: DataTypes.DATE(3),
      finishedAt: DataTypes.DATE(3),
      createdById: DataTypes.INTEGER.UNSIGNED,
      createdAt: DataTypes.DATE(3),
      updatedAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'jobs' },
  );
}

import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type Sequelize,
} from 'sequelize';

export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<number>;
  declare actorId: number | null;
  declare entity: string;
  declare entityId: number;
  declare action: string;
  declare changes: Record<string, { from: unknown; to: unknown }> | null;
  declare createdAt: CreationOptional<Date>;
}

export function initAuditModel(sequelize: Sequelize) {
  AuditEvent.init(
    {
      id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
      actorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
      entity: { type: DataTypes.STRING(40), allowNull: false },
      entityId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
      action: { type: DataTypes.STRING(40), allowNull: false },
      changes: DataTypes.JSON,
      createdAt: DataTypes.DATE(3),
    },
    { sequelize, tableName: 'audit_events', updatedAt: false },
  );
}

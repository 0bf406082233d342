import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize'
import { sequelize } from '../index'

/** Append-only: the database refuses UPDATE, DELETE and TRUNCATE on this table (migration 0001). */
export class AuditEvent extends Model<InferAttributes<AuditEvent>, InferCreationAttributes<AuditEvent>> {
  declare id: CreationOptional<string>
  declare at: CreationOptional<Date>
  declare actorId: number | null
  declare actorEmail: string | null
  declare action: string
  declare entityType: string
  declare entityId: string
  declare lotId: number | null
  declare before: unknown
  declare after: unknown
  declare note: CreationOptional<string>
}

AuditEvent.init(
  {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    at: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    actorId: { type: DataTypes.INTEGER, allowNull: true },
    actorEmail: { type: DataTypes.TEXT, allowNull: true },
    action: { type: DataTypes.TEXT, allowNull: false },
    entityType: { type: DataTypes.TEXT, allowNull: false },
    entityId: { type: DataTypes.TEXT, allowNull: false },
    lotId: { type: DataTypes.INTEGER, allowNull: true },
    before: { type: DataTypes.JSONB, allowNull: true },
    after: { type: DataTypes.JSONB, allowNull: true },
    note: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
  },
  { sequelize, tableName: 'audit_events', timestamps: false },
)

import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'
import type { SectionName } from '../../../shared/api/lots'

/** Append-only (the database refuses UPDATE/DELETE): the latest per (part, round, section) is current. */
export class SectionRecord extends Model<
  InferAttributes<SectionRecord>,
  InferCreationAttributes<SectionRecord>
> {
  declare id: CreationOptional<number>
  declare partId: number
  declare round: number
  declare section: SectionName
  declare data: unknown
  declare instrumentId: number | null
  declare recordedBy: number
  declare recordedAt: CreationOptional<Date>
  declare clientId: string
}

SectionRecord.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    partId: { type: DataTypes.INTEGER, allowNull: false },
    round: { type: DataTypes.INTEGER, allowNull: false },
    section: { type: DataTypes.TEXT, allowNull: false },
    data: { type: DataTypes.JSONB, allowNull: false },
    instrumentId: { type: DataTypes.INTEGER, allowNull: true },
    recordedBy: { type: DataTypes.INTEGER, allowNull: false },
    recordedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    clientId: { type: DataTypes.UUID, allowNull: false, unique: true },
  },
  { sequelize, tableName: 'section_records', timestamps: false },
)

import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'

/**
 * One DFT gauge reading. Evidence: the database lets only the suspect and discard flags change.
 * The hot path (POST readings) writes these with one raw INSERT ... ON CONFLICT; the model serves
 * the seed and the occasional read.
 */
export class GaugeReading extends Model<
  InferAttributes<GaugeReading>,
  InferCreationAttributes<GaugeReading>
> {
  declare id: CreationOptional<string>
  declare partId: number
  declare lotId: number
  declare round: number
  declare areaNo: number
  declare spotNo: number
  declare thicknessUm: number
  declare instrumentId: number
  declare recordedBy: number
  declare recordedAt: CreationOptional<Date>
  declare takenAt: CreationOptional<Date>
  declare clientId: string
  declare suspect: CreationOptional<boolean>
  declare discardedAt: Date | null
  declare discardReason: string | null
  declare discardedBy: number | null
}

GaugeReading.init(
  {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    partId: { type: DataTypes.INTEGER, allowNull: false },
    lotId: { type: DataTypes.INTEGER, allowNull: false },
    round: { type: DataTypes.INTEGER, allowNull: false },
    areaNo: { type: DataTypes.INTEGER, allowNull: false },
    spotNo: { type: DataTypes.INTEGER, allowNull: false },
    thicknessUm: { type: DataTypes.DOUBLE, allowNull: false },
    instrumentId: { type: DataTypes.INTEGER, allowNull: false },
    recordedBy: { type: DataTypes.INTEGER, allowNull: false },
    recordedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    takenAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    clientId: { type: DataTypes.UUID, allowNull: false, unique: true },
    suspect: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    discardedAt: { type: DataTypes.DATE, allowNull: true },
    discardReason: { type: DataTypes.TEXT, allowNull: true },
    discardedBy: { type: DataTypes.INTEGER, allowNull: true },
  },
  { sequelize, tableName: 'gauge_readings', timestamps: false },
)

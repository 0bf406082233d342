import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'

/** A shift check of a gauge on a reference standard: passed = |reading − nominal| ≤ tolerance. */
export class InstrumentVerification extends Model<
  InferAttributes<InstrumentVerification>,
  InferCreationAttributes<InstrumentVerification>
> {
  declare id: CreationOptional<number>
  declare instrumentId: number
  declare referenceNominalUm: number
  declare toleranceUm: number
  declare readingUm: number
  declare passed: boolean
  declare occasion: 'start-of-shift' | 'end-of-shift' | 'other'
  declare verifiedBy: number
  declare verifiedAt: CreationOptional<Date>
  declare clientId: string
}

InstrumentVerification.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    instrumentId: { type: DataTypes.INTEGER, allowNull: false },
    referenceNominalUm: { type: DataTypes.DOUBLE, allowNull: false },
    toleranceUm: { type: DataTypes.DOUBLE, allowNull: false },
    readingUm: { type: DataTypes.DOUBLE, allowNull: false },
    passed: { type: DataTypes.BOOLEAN, allowNull: false },
    occasion: { type: DataTypes.TEXT, allowNull: false },
    verifiedBy: { type: DataTypes.INTEGER, allowNull: false },
    verifiedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    clientId: { type: DataTypes.UUID, allowNull: false, unique: true },
  },
  { sequelize, tableName: 'instrument_verifications', timestamps: false },
)

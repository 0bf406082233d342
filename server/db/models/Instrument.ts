import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize'
import { sequelize } from '../index'
import type { InstrumentKind } from '../../../shared/api/instruments'

export class Instrument extends Model<InferAttributes<Instrument>, InferCreationAttributes<Instrument>> {
  declare id: CreationOptional<number>
  declare kind: InstrumentKind
  declare serial: string
  declare description: CreationOptional<string>
  declare calibratedOn: string | null
  /** DATEONLY 'YYYY-MM-DD': the last day the calibration is valid. */
  declare calibrationDueOn: string
  declare certificateRef: CreationOptional<string>
  declare active: CreationOptional<boolean>
  declare version: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Instrument.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    kind: { type: DataTypes.TEXT, allowNull: false },
    serial: { type: DataTypes.TEXT, allowNull: false, unique: true },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    calibratedOn: { type: DataTypes.DATEONLY, allowNull: true },
    calibrationDueOn: { type: DataTypes.DATEONLY, allowNull: false },
    certificateRef: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'instruments' },
)

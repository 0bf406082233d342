import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'
import type { Line, LotStatus, Shift } from '../../../shared/api/lots'

/** A production lot: one customer order, one spec version, one powder/paint batch, on one line and shift. */
export class Lot extends Model<InferAttributes<Lot>, InferCreationAttributes<Lot>> {
  declare id: CreationOptional<number>
  declare lotNumber: string
  declare customerId: number
  declare orderRef: string
  declare specId: number
  /** The spec version the lot was opened with; it keeps it for good. */
  declare specVersion: number
  declare line: Line
  declare shift: Shift
  declare coatingMaterial: string
  declare batchNumber: string
  /** DATEONLY 'YYYY-MM-DD'. */
  declare batchExpiresOn: string
  declare status: CreationOptional<LotStatus>
  declare notes: CreationOptional<string>
  declare openedBy: number
  declare clientId: string
  declare version: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Lot.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    lotNumber: { type: DataTypes.TEXT, allowNull: false, unique: true },
    customerId: { type: DataTypes.INTEGER, allowNull: false },
    orderRef: { type: DataTypes.TEXT, allowNull: false },
    specId: { type: DataTypes.INTEGER, allowNull: false },
    specVersion: { type: DataTypes.INTEGER, allowNull: false },
    line: { type: DataTypes.TEXT, allowNull: false },
    shift: { type: DataTypes.TEXT, allowNull: false },
    coatingMaterial: { type: DataTypes.TEXT, allowNull: false },
    batchNumber: { type: DataTypes.TEXT, allowNull: false },
    batchExpiresOn: { type: DataTypes.DATEONLY, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'open' },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    openedBy: { type: DataTypes.INTEGER, allowNull: false },
    clientId: { type: DataTypes.UUID, allowNull: false, unique: true },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'lots' },
)

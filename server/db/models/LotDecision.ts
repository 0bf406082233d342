import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'
import type { Decision } from '../../../shared/api/review'
import type { LotStatus } from '../../../shared/api/lots'

/** Release, hold or reject of a lot. Append-only: the database refuses UPDATE and DELETE. */
export class LotDecision extends Model<
  InferAttributes<LotDecision>,
  InferCreationAttributes<LotDecision>
> {
  declare id: CreationOptional<number>
  declare lotId: number
  declare decision: Decision
  declare reason: string
  declare fromStatus: LotStatus
  declare toStatus: LotStatus
  /** The lot version the decision was taken on. */
  declare lotVersion: number
  declare decidedBy: number
  declare decidedAt: CreationOptional<Date>
  declare independenceWaived: boolean
}

LotDecision.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    lotId: { type: DataTypes.INTEGER, allowNull: false },
    decision: { type: DataTypes.TEXT, allowNull: false },
    reason: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    fromStatus: { type: DataTypes.TEXT, allowNull: false },
    toStatus: { type: DataTypes.TEXT, allowNull: false },
    lotVersion: { type: DataTypes.INTEGER, allowNull: false },
    decidedBy: { type: DataTypes.INTEGER, allowNull: false },
    decidedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    independenceWaived: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
  },
  { sequelize, tableName: 'lot_decisions', timestamps: false },
)

import { DataTypes, Model, type InferAttributes, type InferCreationAttributes } from 'sequelize'
import { sequelize } from '../index'

/** A part named in a nonconformance, with the round it was found in and the round of its retest. */
export class NonconformancePart extends Model<
  InferAttributes<NonconformancePart>,
  InferCreationAttributes<NonconformancePart>
> {
  declare nonconformanceId: number
  declare partId: number
  declare roundFound: number
  declare retestRound: number | null
}

NonconformancePart.init(
  {
    nonconformanceId: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
    partId: { type: DataTypes.INTEGER, allowNull: false, primaryKey: true },
    roundFound: { type: DataTypes.INTEGER, allowNull: false },
    retestRound: { type: DataTypes.INTEGER, allowNull: true },
  },
  { sequelize, tableName: 'nonconformance_parts', timestamps: false },
)

import { DataTypes, Model, type InferAttributes, type InferCreationAttributes } from 'sequelize'
import { sequelize } from '../index'

/** Plant-wide settings an admin may change (e.g. whether a lot's recorder may also release it). */
export class Setting extends Model<InferAttributes<Setting>, InferCreationAttributes<Setting>> {
  declare key: string
  declare value: unknown
}

Setting.init(
  {
    key: { type: DataTypes.TEXT, primaryKey: true },
    value: { type: DataTypes.JSONB, allowNull: false },
  },
  { sequelize, tableName: 'settings', createdAt: false },
)

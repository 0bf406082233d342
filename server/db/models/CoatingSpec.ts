import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize'
import { sequelize } from '../index'

/** A coating specification; its content lives in SpecVersion rows, `currentVersion` names the newest. */
export class CoatingSpec extends Model<InferAttributes<CoatingSpec>, InferCreationAttributes<CoatingSpec>> {
  declare id: CreationOptional<number>
  declare code: string
  declare title: string
  declare customerId: number | null
  declare currentVersion: CreationOptional<number>
  declare active: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

CoatingSpec.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    code: { type: DataTypes.TEXT, allowNull: false, unique: true },
    title: { type: DataTypes.TEXT, allowNull: false },
    customerId: { type: DataTypes.INTEGER, allowNull: true },
    currentVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'coating_specs' },
)

import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'

/** A cause of nonconformance from the list the admin keeps ("thin film", "holiday", ...). */
export class DefectType extends Model<
  InferAttributes<DefectType>,
  InferCreationAttributes<DefectType>
> {
  declare id: CreationOptional<number>
  declare code: string
  declare label: string
  declare active: CreationOptional<boolean>
  declare version: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

DefectType.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    code: { type: DataTypes.TEXT, allowNull: false, unique: true },
    label: { type: DataTypes.TEXT, allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'defect_types' },
)

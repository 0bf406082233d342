import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize'
import { sequelize } from '../index'
import type { SpecContent } from '../../../shared/spec/specContent'

/** One version of a coating spec. Locked (never edited again) once a lot uses it. */
export class SpecVersion extends Model<InferAttributes<SpecVersion>, InferCreationAttributes<SpecVersion>> {
  declare id: CreationOptional<number>
  declare specId: number
  declare version: number
  declare content: SpecContent
  declare changeNote: CreationOptional<string>
  declare createdBy: number | null
  declare lockedAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

SpecVersion.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    specId: { type: DataTypes.INTEGER, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false },
    content: { type: DataTypes.JSONB, allowNull: false },
    changeNote: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    createdBy: { type: DataTypes.INTEGER, allowNull: true },
    lockedAt: { type: DataTypes.DATE, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'spec_versions' },
)

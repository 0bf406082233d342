import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize'
import { sequelize } from '../index'
import type { Role } from '../../../shared/api/roles'

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>
  declare email: string
  declare name: string
  declare role: Role
  declare passwordHash: string
  declare active: CreationOptional<boolean>
  declare customerId: number | null
  declare thicknessUnit: CreationOptional<'um' | 'mil'>
  declare temperatureUnit: CreationOptional<'C' | 'F'>
  declare areaUnit: CreationOptional<'m2' | 'ft2'>
  declare failedLogins: CreationOptional<number>
  declare lockedUntil: Date | null
  declare tokenVersion: CreationOptional<number>
  declare lastLoginAt: Date | null
  declare version: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

User.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    email: { type: DataTypes.TEXT, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    role: { type: DataTypes.TEXT, allowNull: false },
    passwordHash: { type: DataTypes.TEXT, allowNull: false },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    customerId: { type: DataTypes.INTEGER, allowNull: true },
    thicknessUnit: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'um' },
    temperatureUnit: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'C' },
    areaUnit: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'm2' },
    failedLogins: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    lockedUntil: { type: DataTypes.DATE, allowNull: true },
    tokenVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    lastLoginAt: { type: DataTypes.DATE, allowNull: true },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'users' },
)

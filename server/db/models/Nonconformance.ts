import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'
import type { Disposition, NcStatus } from '../../../shared/api/review'
import type { CriterionName } from '../../../shared/rules/verdict'

/** A nonconformance record: what was wrong, with which parts, what was decided and how it was verified. */
export class Nonconformance extends Model<
  InferAttributes<Nonconformance>,
  InferCreationAttributes<Nonconformance>
> {
  declare id: CreationOptional<number>
  declare number: string
  declare lotId: number
  declare status: CreationOptional<NcStatus>
  declare source: 'auto' | 'manual'
  declare criterion: CriterionName | null
  declare defectTypeId: number
  declare description: string
  declare disposition: CreationOptional<Disposition | null>
  declare concessionRef: CreationOptional<string | null>
  declare dispositionNote: CreationOptional<string>
  declare dispositionedBy: CreationOptional<number | null>
  declare dispositionedAt: CreationOptional<Date | null>
  declare verification: CreationOptional<string | null>
  declare closedBy: CreationOptional<number | null>
  declare closedAt: CreationOptional<Date | null>
  declare openedBy: number
  declare version: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Nonconformance.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    number: { type: DataTypes.TEXT, allowNull: false, unique: true },
    lotId: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'open' },
    source: { type: DataTypes.TEXT, allowNull: false },
    criterion: { type: DataTypes.TEXT, allowNull: true },
    defectTypeId: { type: DataTypes.INTEGER, allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false },
    disposition: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
    concessionRef: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
    dispositionNote: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    dispositionedBy: { type: DataTypes.INTEGER, allowNull: true, defaultValue: null },
    dispositionedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
    verification: { type: DataTypes.TEXT, allowNull: true, defaultValue: null },
    closedBy: { type: DataTypes.INTEGER, allowNull: true, defaultValue: null },
    closedAt: { type: DataTypes.DATE, allowNull: true, defaultValue: null },
    openedBy: { type: DataTypes.INTEGER, allowNull: false },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'nonconformances' },
)

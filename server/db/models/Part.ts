import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'
import type { PartVerdict } from '../../../shared/rules/evaluatePart'
import type { OverallStatus } from '../../../shared/rules/verdict'
import type { SectionName } from '../../../shared/api/lots'

/** One part (or one row of identical pieces) of a lot, with its stored verdict for the current round. */
export class Part extends Model<InferAttributes<Part>, InferCreationAttributes<Part>> {
  declare id: CreationOptional<number>
  declare lotId: number
  declare partNumber: string
  declare description: CreationOptional<string>
  declare heatNumber: CreationOptional<string>
  declare quantity: CreationOptional<number>
  declare coatedAreaM2: number | null
  declare sampled: CreationOptional<boolean>
  declare round: CreationOptional<number>
  declare verdict: PartVerdict | null
  declare verdictStatus: OverallStatus | null
  /** The verdict status at the end of round 1, for first-pass yield. */
  declare firstPassStatus: OverallStatus | null
  /** Mean of the non-discarded readings of the current round (BMR taken off), for trends. */
  declare thicknessMeanUm: number | null
  /** Sections the current round carries from the earlier one (a repair round); empty otherwise. */
  declare carriedSections: CreationOptional<SectionName[]>
  declare clientId: string
  declare version: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Part.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    lotId: { type: DataTypes.INTEGER, allowNull: false },
    partNumber: { type: DataTypes.TEXT, allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    heatNumber: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    quantity: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    coatedAreaM2: { type: DataTypes.DOUBLE, allowNull: true },
    sampled: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    round: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    verdict: { type: DataTypes.JSONB, allowNull: true },
    verdictStatus: { type: DataTypes.TEXT, allowNull: true },
    firstPassStatus: { type: DataTypes.TEXT, allowNull: true },
    thicknessMeanUm: { type: DataTypes.DOUBLE, allowNull: true },
    carriedSections: { type: DataTypes.ARRAY(DataTypes.TEXT), allowNull: false, defaultValue: [] },
    clientId: { type: DataTypes.UUID, allowNull: false, unique: true },
    version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'parts' },
)

import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'

export type PhotoMime = 'image/jpeg' | 'image/png' | 'image/webp' | 'image/heic'

/** A photo of a lot or part, kept in PostgreSQL with its thumbnail (the record travels with the database). */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
  declare id: CreationOptional<number>
  declare lotId: number
  declare partId: number | null
  declare nonconformanceId: number | null
  declare caption: CreationOptional<string>
  declare mime: PhotoMime
  declare byteSize: number
  declare width: number
  declare height: number
  declare data: Buffer
  declare thumb: Buffer
  declare uploadedBy: number
  declare uploadedAt: CreationOptional<Date>
  declare clientId: string
}

Photo.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    lotId: { type: DataTypes.INTEGER, allowNull: false },
    partId: { type: DataTypes.INTEGER, allowNull: true },
    nonconformanceId: { type: DataTypes.INTEGER, allowNull: true },
    caption: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    mime: { type: DataTypes.TEXT, allowNull: false },
    byteSize: { type: DataTypes.INTEGER, allowNull: false },
    width: { type: DataTypes.INTEGER, allowNull: false },
    height: { type: DataTypes.INTEGER, allowNull: false },
    data: { type: DataTypes.BLOB, allowNull: false },
    thumb: { type: DataTypes.BLOB, allowNull: false },
    uploadedBy: { type: DataTypes.INTEGER, allowNull: false },
    uploadedAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    clientId: { type: DataTypes.UUID, allowNull: false, unique: true },
  },
  { sequelize, tableName: 'photos', timestamps: false },
)

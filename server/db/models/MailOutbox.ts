import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'

export type OutboxStatus = 'queued' | 'sending' | 'sent' | 'failed'

/** One e-mail to one recipient, queued in the transaction that issued the certificate. */
export class MailOutbox extends Model<
  InferAttributes<MailOutbox>,
  InferCreationAttributes<MailOutbox>
> {
  declare id: CreationOptional<string>
  declare certificateId: number
  declare contactId: number | null
  declare recipientName: string
  declare recipientEmail: string
  declare subject: string
  declare bodyText: string
  declare status: CreationOptional<OutboxStatus>
  declare attempts: CreationOptional<number>
  declare nextAttemptAt: CreationOptional<Date>
  declare lockedUntil: CreationOptional<Date | null>
  declare lockedBy: CreationOptional<string | null>
  declare lastError: CreationOptional<string | null>
  declare lastAttemptAt: CreationOptional<Date | null>
  declare sentAt: CreationOptional<Date | null>
  declare messageId: CreationOptional<string | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

MailOutbox.init(
  {
    id: { type: DataTypes.BIGINT, autoIncrement: true, primaryKey: true },
    certificateId: { type: DataTypes.INTEGER, allowNull: false },
    contactId: { type: DataTypes.INTEGER, allowNull: true },
    recipientName: { type: DataTypes.TEXT, allowNull: false },
    recipientEmail: { type: DataTypes.TEXT, allowNull: false },
    subject: { type: DataTypes.TEXT, allowNull: false },
    bodyText: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'queued' },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    nextAttemptAt: { type: DataTypes.DATE, allowNull: false, defaultValue: DataTypes.NOW },
    lockedUntil: { type: DataTypes.DATE, allowNull: true },
    lockedBy: { type: DataTypes.TEXT, allowNull: true },
    lastError: { type: DataTypes.TEXT, allowNull: true },
    lastAttemptAt: { type: DataTypes.DATE, allowNull: true },
    sentAt: { type: DataTypes.DATE, allowNull: true },
    messageId: { type: DataTypes.TEXT, allowNull: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'mail_outbox' },
)

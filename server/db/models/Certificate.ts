import {
  DataTypes,
  Model,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
} from 'sequelize'
import { sequelize } from '../index'
import type {
  CertificateData,
  CertificateKind,
  CertificateState,
} from '../../../shared/api/certificates'

/**
 * An issued certificate of conformance. The PDF and both fingerprints are stored at issue and
 * never regenerated; the database refuses changes to them (migration 0005).
 */
export class Certificate extends Model<
  InferAttributes<Certificate>,
  InferCreationAttributes<Certificate>
> {
  declare id: CreationOptional<number>
  declare number: string
  declare kind: CertificateKind
  declare lotId: number
  declare customerId: number
  declare verifyCode: string
  declare state: CreationOptional<CertificateState>
  declare data: CertificateData
  declare pdf: Buffer
  declare pdfSha256: string
  declare contentSha256: string
  declare issuedBy: number
  declare issuedAt: Date
  declare supersedesId: CreationOptional<number | null>
  declare reissueReason: CreationOptional<string | null>
  declare supersededById: CreationOptional<number | null>
  declare supersededAt: CreationOptional<Date | null>
  declare revokedAt: CreationOptional<Date | null>
  declare revokedBy: CreationOptional<number | null>
  declare revokeReason: CreationOptional<string | null>
  declare needsReissue: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

Certificate.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    number: { type: DataTypes.TEXT, allowNull: false, unique: true },
    kind: { type: DataTypes.TEXT, allowNull: false },
    lotId: { type: DataTypes.INTEGER, allowNull: false },
    customerId: { type: DataTypes.INTEGER, allowNull: false },
    verifyCode: { type: DataTypes.TEXT, allowNull: false, unique: true },
    state: { type: DataTypes.TEXT, allowNull: false, defaultValue: 'valid' },
    data: { type: DataTypes.JSONB, allowNull: false },
    pdf: { type: DataTypes.BLOB, allowNull: false },
    pdfSha256: { type: DataTypes.TEXT, allowNull: false, field: 'pdf_sha256' },
    contentSha256: { type: DataTypes.TEXT, allowNull: false, field: 'content_sha256' },
    issuedBy: { type: DataTypes.INTEGER, allowNull: false },
    issuedAt: { type: DataTypes.DATE, allowNull: false },
    supersedesId: { type: DataTypes.INTEGER, allowNull: true },
    reissueReason: { type: DataTypes.TEXT, allowNull: true },
    supersededById: { type: DataTypes.INTEGER, allowNull: true },
    supersededAt: { type: DataTypes.DATE, allowNull: true },
    revokedAt: { type: DataTypes.DATE, allowNull: true },
    revokedBy: { type: DataTypes.INTEGER, allowNull: true },
    revokeReason: { type: DataTypes.TEXT, allowNull: true },
    needsReissue: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'certificates' },
)

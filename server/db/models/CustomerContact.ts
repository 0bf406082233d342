import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes } from 'sequelize'
import { sequelize } from '../index'

/** A person at a customer who receives certificates of conformance by e-mail. */
export class CustomerContact extends Model<
  InferAttributes<CustomerContact>,
  InferCreationAttributes<CustomerContact>
> {
  declare id: CreationOptional<number>
  declare customerId: number
  declare name: string
  declare email: string
  declare receivesCertificates: CreationOptional<boolean>
  declare active: CreationOptional<boolean>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}

CustomerContact.init(
  {
    id: { type: DataTypes.INTEGER, autoIncrement: true, primaryKey: true },
    customerId: { type: DataTypes.INTEGER, allowNull: false },
    name: { type: DataTypes.TEXT, allowNull: false },
    email: { type: DataTypes.TEXT, allowNull: false },
    receivesCertificates: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
    createdAt: DataTypes.DATE,
    updatedAt: DataTypes.DATE,
  },
  { sequelize, tableName: 'customer_contacts' },
)

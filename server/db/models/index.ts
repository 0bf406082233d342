/** Every model and every association, wired in one place. Import models from here. */
import { User } from './User'
import { Customer } from './Customer'
import { CustomerContact } from './CustomerContact'
import { CoatingSpec } from './CoatingSpec'
import { SpecVersion } from './SpecVersion'
import { Instrument } from './Instrument'
import { AuditEvent } from './AuditEvent'
import { Setting } from './Setting'

Customer.hasMany(CustomerContact, { foreignKey: 'customerId', as: 'contacts' })
CustomerContact.belongsTo(Customer, { foreignKey: 'customerId', as: 'customer' })
User.belongsTo(Customer, { foreignKey: 'customerId', as: 'customer' })
CoatingSpec.hasMany(SpecVersion, { foreignKey: 'specId', as: 'versions' })
SpecVersion.belongsTo(CoatingSpec, { foreignKey: 'specId', as: 'spec' })
CoatingSpec.belongsTo(Customer, { foreignKey: 'customerId', as: 'customer' })

export { User, Customer, CustomerContact, CoatingSpec, SpecVersion, Instrument, AuditEvent, Setting }

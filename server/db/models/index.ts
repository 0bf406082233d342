/** Every model and every association, wired in one place. Import models from here. */
import { User } from './User'
import { Customer } from './Customer'
import { CustomerContact } from './CustomerContact'
import { CoatingSpec } from './CoatingSpec'
import { SpecVersion } from './SpecVersion'
import { Instrument } from './Instrument'
import { AuditEvent } from './AuditEvent'
import { Setting } from './Setting'
import { Lot } from './Lot'
import { Part } from './Part'
import { SectionRecord } from './SectionRecord'
import { GaugeReading } from './GaugeReading'
import { InstrumentVerification } from './InstrumentVerification'
import { Photo } from './Photo'

Customer.hasMany(CustomerContact, { foreignKey: 'customerId', as: 'contacts' })
CustomerContact.belongsTo(Customer, { foreignKey: 'customerId', as: 'customer' })
User.belongsTo(Customer, { foreignKey: 'customerId', as: 'customer' })
CoatingSpec.hasMany(SpecVersion, { foreignKey: 'specId', as: 'versions' })
SpecVersion.belongsTo(CoatingSpec, { foreignKey: 'specId', as: 'spec' })
CoatingSpec.belongsTo(Customer, { foreignKey: 'customerId', as: 'customer' })

// Shop floor (migration 0002).
Lot.belongsTo(Customer, { foreignKey: 'customerId', as: 'customer' })
Lot.belongsTo(CoatingSpec, { foreignKey: 'specId', as: 'spec' })
Lot.belongsTo(User, { foreignKey: 'openedBy', as: 'opener' })
Lot.hasMany(Part, { foreignKey: 'lotId', as: 'parts' })
Part.belongsTo(Lot, { foreignKey: 'lotId', as: 'lot' })
Part.hasMany(SectionRecord, { foreignKey: 'partId', as: 'sectionRecords' })
SectionRecord.belongsTo(Part, { foreignKey: 'partId', as: 'part' })
SectionRecord.belongsTo(User, { foreignKey: 'recordedBy', as: 'recorder' })
SectionRecord.belongsTo(Instrument, { foreignKey: 'instrumentId', as: 'instrument' })
Part.hasMany(GaugeReading, { foreignKey: 'partId', as: 'readings' })
GaugeReading.belongsTo(Part, { foreignKey: 'partId', as: 'part' })
GaugeReading.belongsTo(Instrument, { foreignKey: 'instrumentId', as: 'instrument' })
GaugeReading.belongsTo(User, { foreignKey: 'recordedBy', as: 'recorder' })
Instrument.hasMany(InstrumentVerification, { foreignKey: 'instrumentId', as: 'verifications' })
InstrumentVerification.belongsTo(Instrument, { foreignKey: 'instrumentId', as: 'instrument' })
InstrumentVerification.belongsTo(User, { foreignKey: 'verifiedBy', as: 'verifier' })
Lot.hasMany(Photo, { foreignKey: 'lotId', as: 'photos' })
Photo.belongsTo(User, { foreignKey: 'uploadedBy', as: 'uploader' })

export { User, Customer, CustomerContact, CoatingSpec, SpecVersion, Instrument, AuditEvent, Setting }
export { Lot, Part, SectionRecord, GaugeReading, InstrumentVerification, Photo }

// QA review (migration 0003).
import { DefectType } from './DefectType'
import { Nonconformance } from './Nonconformance'
import { NonconformancePart } from './NonconformancePart'
import { LotDecision } from './LotDecision'

Nonconformance.belongsTo(Lot, { foreignKey: 'lotId', as: 'lot' })
Nonconformance.belongsTo(DefectType, { foreignKey: 'defectTypeId', as: 'defectType' })
Nonconformance.hasMany(NonconformancePart, { foreignKey: 'nonconformanceId', as: 'partLinks' })
NonconformancePart.belongsTo(Part, { foreignKey: 'partId', as: 'part' })
Lot.hasMany(Nonconformance, { foreignKey: 'lotId', as: 'nonconformances' })
Lot.hasMany(LotDecision, { foreignKey: 'lotId', as: 'decisions' })
LotDecision.belongsTo(User, { foreignKey: 'decidedBy', as: 'decider' })

export { DefectType, Nonconformance, NonconformancePart, LotDecision }

// Certificates of conformance and their mail outbox (migration 0005).
import { Certificate } from './Certificate'
import { MailOutbox } from './MailOutbox'

Certificate.belongsTo(Lot, { foreignKey: 'lotId', as: 'lot' })
Certificate.belongsTo(Customer, { foreignKey: 'customerId', as: 'customer' })
Certificate.hasMany(MailOutbox, { foreignKey: 'certificateId', as: 'deliveries' })
MailOutbox.belongsTo(Certificate, { foreignKey: 'certificateId', as: 'certificate' })

export { Certificate, MailOutbox }

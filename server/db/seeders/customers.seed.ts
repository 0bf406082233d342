import { Customer, CustomerContact } from '../models'
import { auditSeed, count, type Seeder } from './seeder'

/** Fictional buyers: three water utilities and an industrial contractor; every address is .example. */
export const DEMO_CUSTOMERS = [
  {
    code: 'AWB',
    name: 'Ashvale Water Board',
    address: 'Treatment Works Road, Ashvale (fictional)',
    thicknessUnit: 'mil' as const,
    contacts: [
      {
        name: 'Certificates inbox, Ashvale Water Board',
        email: 'certificates@ashvale-water.example',
      },
      { name: 'Taylor Brook (buyer)', email: 'buyer@ashvale-water.example' },
    ],
  },
  {
    code: 'WWA',
    name: 'Wrenfield Water Authority',
    address: '2 Reservoir Close, Wrenfield (fictional)',
    thicknessUnit: 'um' as const,
    contacts: [
      {
        name: 'Quality office, Wrenfield Water Authority',
        email: 'quality@wrenfield-water.example',
      },
      { name: 'Jamie Sorrel (network engineer)', email: 'j.sorrel@wrenfield-water.example' },
    ],
  },
  {
    code: 'BWC',
    name: 'Brackenholt Water Company',
    address: 'Pumping Station 7, Brackenholt (fictional)',
    thicknessUnit: 'mil' as const,
    contacts: [
      { name: 'Incoming inspection, Brackenholt', email: 'inspection@brackenholt-water.example' },
    ],
  },
  {
    code: 'OPC',
    name: 'Ostmere Pipeline Contractors',
    address: 'Yard 4, Canal Wharf, Ostmere (fictional)',
    thicknessUnit: 'um' as const,
    contacts: [
      {
        name: 'Site QA, Ostmere Pipeline Contractors',
        email: 'site-qa@ostmere-contractors.example',
      },
      { name: 'Procurement, Ostmere', email: 'purchasing@ostmere-contractors.example' },
    ],
  },
]

export const customersSeeder: Seeder = {
  name: 'customers',
  async run(ctx) {
    const { t } = ctx
    for (const c of DEMO_CUSTOMERS) {
      let customer = await Customer.findOne({ where: { code: c.code }, transaction: t })
      count(ctx, 'customers', !customer)
      if (!customer) {
        customer = await Customer.create(
          { code: c.code, name: c.name, address: c.address, thicknessUnit: c.thicknessUnit },
          { transaction: t },
        )
        await auditSeed(ctx, 'customer', customer.id, customer)
      }
      for (const contact of c.contacts) {
        const existing = await CustomerContact.findOne({
          where: { customerId: customer.id, email: contact.email },
          transaction: t,
        })
        count(ctx, 'customer contacts', !existing)
        if (existing) continue
        const row = await CustomerContact.create(
          { customerId: customer.id, ...contact },
          { transaction: t },
        )
        await auditSeed(ctx, 'customer-contact', row.id, row)
      }
    }
  },
}

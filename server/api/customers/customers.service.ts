import { fn, col, where, Op, type Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction } from '../../db'
import { Customer, CustomerContact } from '../../db/models'
import { recordAudit, snapshot, type AuditActor } from '../../audit/audit.service'
import { conflict, notFound } from '../../lib/httpError'
import type {
  ContactRow,
  CustomerRow,
  contactSchema,
  createCustomerSchema,
  updateContactSchema,
  updateCustomerSchema,
} from '../../../shared/api/setup'

type CreateCustomerBody = z.infer<typeof createCustomerSchema>
type UpdateCustomerBody = z.infer<typeof updateCustomerSchema>
type ContactBody = z.infer<typeof contactSchema>
type UpdateContactBody = z.infer<typeof updateContactSchema>
type CustomerWithContacts = Customer & { contacts?: CustomerContact[] }

export function toContactRow(c: CustomerContact): ContactRow {
  return {
    id: c.id,
    name: c.name,
    email: c.email,
    receivesCertificates: c.receivesCertificates,
    active: c.active,
  }
}

export function toCustomerRow(c: CustomerWithContacts): CustomerRow {
  const contacts = [...(c.contacts ?? [])].sort(
    (a, b) => a.name.localeCompare(b.name) || a.id - b.id,
  )
  return {
    id: c.id,
    name: c.name,
    code: c.code,
    address: c.address,
    thicknessUnit: c.thicknessUnit,
    active: c.active,
    contacts: contacts.map(toContactRow),
  }
}

const withContacts = { include: [{ model: CustomerContact, as: 'contacts' }] }

export async function listCustomers(): Promise<CustomerRow[]> {
  const customers = await Customer.findAll({ ...withContacts, order: [['name', 'ASC']] })
  return customers.map(toCustomerRow)
}

export async function getCustomer(id: number, t?: Transaction): Promise<CustomerRow> {
  const customer = await Customer.findByPk(id, { ...withContacts, transaction: t })
  if (!customer) throw notFound('Customer')
  return toCustomerRow(customer)
}

/** Clear messages for the two unique keys (the indexes still catch a race: 409 either way). */
async function assertNameAndCodeFree(
  name: string | undefined,
  code: string | undefined,
  exceptId: number | null,
  t: Transaction,
) {
  const notSelf = exceptId === null ? {} : { id: { [Op.ne]: exceptId } }
  if (name !== undefined) {
    const sameName = await Customer.findOne({
      where: { [Op.and]: [where(fn('lower', col('name')), name.toLowerCase()), notSelf] },
      transaction: t,
    })
    if (sameName)
      throw conflict('duplicate_customer', `A customer named "${sameName.name}" already exists`)
  }
  if (code !== undefined) {
    const sameCode = await Customer.findOne({ where: { code, ...notSelf }, transaction: t })
    if (sameCode)
      throw conflict(
        'duplicate_customer',
        `The customer code ${code} is already used by ${sameCode.name}`,
      )
  }
}

/** One company's contacts each have their own address: a duplicate would get every certificate twice. */
async function assertContactEmailFree(
  customerId: number,
  email: string,
  exceptId: number | null,
  t: Transaction,
) {
  const same = await CustomerContact.findOne({
    where: { customerId, email, ...(exceptId === null ? {} : { id: { [Op.ne]: exceptId } }) },
    transaction: t,
  })
  if (same)
    throw conflict(
      'duplicate_contact',
      `${email} is already a contact of this customer (${same.name})`,
    )
}

async function addContactIn(
  actor: AuditActor,
  customerId: number,
  body: ContactBody,
  t: Transaction,
) {
  await assertContactEmailFree(customerId, body.email, null, t)
  const contact = await CustomerContact.create(
    {
      customerId,
      name: body.name,
      email: body.email,
      receivesCertificates: body.receivesCertificates,
      active: body.active,
    },
    { transaction: t },
  )
  await recordAudit(t, actor, {
    action: 'contact.create',
    entityType: 'customer-contact',
    entityId: contact.id,
    after: contact,
  })
  return contact
}

export async function createCustomer(
  actor: AuditActor,
  body: CreateCustomerBody,
): Promise<CustomerRow> {
  return inTransaction(async (t) => {
    await assertNameAndCodeFree(body.name, body.code, null, t)
    const customer = await Customer.create(
      {
        name: body.name,
        code: body.code,
        address: body.address,
        thicknessUnit: body.thicknessUnit,
      },
      { transaction: t },
    )
    await recordAudit(t, actor, {
      action: 'customer.create',
      entityType: 'customer',
      entityId: customer.id,
      after: customer,
    })
    for (const contact of body.contacts) await addContactIn(actor, customer.id, contact, t)
    return getCustomer(customer.id, t)
  })
}

export async function updateCustomer(
  actor: AuditActor,
  id: number,
  body: UpdateCustomerBody,
): Promise<CustomerRow> {
  return inTransaction(async (t) => {
    const customer = await Customer.findByPk(id, { lock: t.LOCK.UPDATE, transaction: t })
    if (!customer) throw notFound('Customer')
    if (body.name !== undefined && body.name !== customer.name)
      await assertNameAndCodeFree(body.name, undefined, id, t)
    const before = snapshot(customer)
    const changes: Partial<Customer> = {}
    if (body.name !== undefined && body.name !== customer.name) changes.name = body.name
    if (body.address !== undefined && body.address !== customer.address)
      changes.address = body.address
    if (body.thicknessUnit !== undefined && body.thicknessUnit !== customer.thicknessUnit)
      changes.thicknessUnit = body.thicknessUnit
    if (body.active !== undefined && body.active !== customer.active) changes.active = body.active
    if (Object.keys(changes).length > 0) {
      await customer.update({ ...changes, version: customer.version + 1 }, { transaction: t })
      await recordAudit(t, actor, {
        action: 'customer.update',
        entityType: 'customer',
        entityId: id,
        before,
        after: customer,
      })
    }
    return getCustomer(id, t)
  })
}

export async function addContact(
  actor: AuditActor,
  customerId: number,
  body: ContactBody,
): Promise<CustomerRow> {
  return inTransaction(async (t) => {
    const customer = await Customer.findByPk(customerId, { lock: t.LOCK.UPDATE, transaction: t })
    if (!customer) throw notFound('Customer')
    await addContactIn(actor, customerId, body, t)
    return getCustomer(customerId, t)
  })
}

export async function updateContact(
  actor: AuditActor,
  customerId: number,
  contactId: number,
  body: UpdateContactBody,
): Promise<CustomerRow> {
  return inTransaction(async (t) => {
    // A contact is reached only through its own customer: another company's id is simply not found.
    const contact = await CustomerContact.findOne({
      where: { id: contactId, customerId },
      lock: t.LOCK.UPDATE,
      transaction: t,
    })
    if (!contact) throw notFound('Contact')
    if (body.email !== undefined && body.email !== contact.email)
      await assertContactEmailFree(customerId, body.email, contactId, t)
    const before = snapshot(contact)
    const changes: Partial<CustomerContact> = {}
    for (const key of ['name', 'email', 'receivesCertificates', 'active'] as const) {
      const value = body[key]
      if (value !== undefined && value !== contact[key]) Object.assign(changes, { [key]: value })
    }
    if (Object.keys(changes).length > 0) {
      await contact.update(changes, { transaction: t })
      await recordAudit(t, actor, {
        action: 'contact.update',
        entityType: 'customer-contact',
        entityId: contactId,
        before,
        after: contact,
      })
    }
    return getCustomer(customerId, t)
  })
}

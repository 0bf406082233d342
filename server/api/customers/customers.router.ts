import { z } from 'zod'
import { secureRouter, idParams } from '../secureRouter'
import { ADMIN, STAFF } from '../../../shared/api/roles'
import {
  contactSchema,
  createCustomerSchema,
  updateContactSchema,
  updateCustomerSchema,
} from '../../../shared/api/setup'
import {
  addContact,
  createCustomer,
  getCustomer,
  listCustomers,
  updateContact,
  updateCustomer,
} from './customers.service'

/** Setup → Customers and the contacts certificates go to. Staff read (lots need a customer); admins write. */
const r = secureRouter('/api/customers')

const contactParams = idParams.extend({
  contactId: z.coerce.number().int().positive().max(2147483647),
})

r.get('/', { roles: STAFF }, () => listCustomers())

r.get('/:id', { roles: STAFF, params: idParams }, ({ params }) => getCustomer(params.id))

r.post('/', { roles: ADMIN, body: createCustomerSchema }, async ({ user, body, res }) => {
  res.status(201)
  return createCustomer(user, body)
})

r.patch(
  '/:id',
  { roles: ADMIN, params: idParams, body: updateCustomerSchema },
  ({ user, params, body }) => updateCustomer(user, params.id, body),
)

r.post(
  '/:id/contacts',
  { roles: ADMIN, params: idParams, body: contactSchema },
  async ({ user, params, body, res }) => {
    res.status(201)
    return addContact(user, params.id, body)
  },
)

r.patch(
  '/:id/contacts/:contactId',
  { roles: ADMIN, params: contactParams, body: updateContactSchema },
  ({ user, params, body }) => updateContact(user, params.id, params.contactId, body),
)

export const customersRouter = r

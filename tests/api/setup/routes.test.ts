import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { routeTable } from '../../../server/api/secureRouter'
import { signInEveryRole } from '../support/fixtures'
import {
  Customer,
  CustomerContact,
  CoatingSpec,
  SpecVersion,
  Instrument,
} from '../../../server/db/models'
import { ROLES, type Role } from '../../../shared/api/roles'
import { fbeContent } from './setupFixtures'

const app = createApp()
const STAFF_ROLES: Role[] = ['operator', 'supervisor', 'manager', 'admin']
const ADMIN_ONLY: Role[] = ['admin']

/** The Setup area's authorisation, written out from the brief (not read back from the code). */
const EXPECTED: Record<string, Role[]> = {
  'get /api/users': ADMIN_ONLY,
  'post /api/users': ADMIN_ONLY,
  'patch /api/users/:id': ADMIN_ONLY,
  'post /api/users/:id/reset-password': ADMIN_ONLY,
  'get /api/customers': STAFF_ROLES,
  'get /api/customers/:id': STAFF_ROLES,
  'post /api/customers': ADMIN_ONLY,
  'patch /api/customers/:id': ADMIN_ONLY,
  'post /api/customers/:id/contacts': ADMIN_ONLY,
  'patch /api/customers/:id/contacts/:contactId': ADMIN_ONLY,
  'get /api/specs': STAFF_ROLES,
  'get /api/specs/:id': STAFF_ROLES,
  'get /api/specs/:id/versions/:version': STAFF_ROLES,
  'post /api/specs': ADMIN_ONLY,
  'put /api/specs/:id': ADMIN_ONLY,
  'get /api/instruments': STAFF_ROLES,
  'post /api/instruments': ADMIN_ONLY,
  'patch /api/instruments/:id': ADMIN_ONLY,
  'get /api/settings': STAFF_ROLES,
  'put /api/settings': ADMIN_ONLY,
}
const SETUP_BASES = [
  '/api/users',
  '/api/customers',
  '/api/specs',
  '/api/instruments',
  '/api/settings',
]

describe('Setup routes by role', () => {
  let signedIn: Awaited<ReturnType<typeof signInEveryRole>>
  const ids: Record<string, number> = {}
  beforeAll(async () => {
    signedIn = await signInEveryRole(app)
    const customer = await Customer.create({ name: 'Matrix Water Board', code: 'MWB' })
    const contact = await CustomerContact.create({
      customerId: customer.id,
      name: 'QA',
      email: 'qa@mwb.example',
    })
    const spec = await CoatingSpec.create({ code: 'MX-1', title: 'Matrix spec', customerId: null })
    await SpecVersion.create({
      specId: spec.id,
      version: 1,
      content: fbeContent() as never,
      createdBy: null,
      lockedAt: null,
    })
    const instrument = await Instrument.create({
      kind: 'hygrometer',
      serial: 'MX-HYG-1',
      calibratedOn: null,
      calibrationDueOn: '2099-01-01',
    })
    // PATCH /api/users/:id with an empty body targets the operator: a change of nothing.
    Object.assign(ids, {
      user: signedIn.operator.user.id,
      customer: customer.id,
      contactId: contact.id,
      spec: spec.id,
      instrument: instrument.id,
    })
  })

  // Shift verifications live under /api/instruments but belong to the shop floor: the
  // authorisation matrix in tests/api/security covers them with every other route.
  const setupRoutes = () =>
    routeTable.filter(
      (r) =>
        SETUP_BASES.some((b) => r.path === b || r.path.startsWith(`${b}/`)) &&
        !r.path.endsWith('/verifications'),
    )

  it('declares exactly the routes of the contract, with the roles of the brief', () => {
    const declared = Object.fromEntries(
      setupRoutes().map((r) => [`${r.method} ${r.path}`, r.roles]),
    )
    expect(Object.keys(declared).sort()).toEqual(Object.keys(EXPECTED).sort())
    for (const [key, roles] of Object.entries(EXPECTED))
      expect([...(declared[key] as Role[])].sort(), key).toEqual([...roles].sort())
  })

  function concretePath(path: string): string {
    const base = SETUP_BASES.find((b) => path.startsWith(b))!
    const id = {
      '/api/users': ids.user,
      '/api/customers': ids.customer,
      '/api/specs': ids.spec,
      '/api/instruments': ids.instrument,
    }[base]
    return path
      .replace(':contactId', String(ids.contactId))
      .replace(':version', '1')
      .replace(':id', String(id))
  }

  it('answers 401 without a token, 403 to a role not listed, and lets each listed role through', async () => {
    for (const [key, allowed] of Object.entries(EXPECTED)) {
      const [method, path] = key.split(' ') as ['get' | 'post' | 'put' | 'patch', string]
      const url = concretePath(path)
      const anonymous = await request(app)[method](url).send({})
      expect(anonymous.status, `${key} anonymous`).toBe(401)
      for (const role of ROLES) {
        const res = await request(app)
          [method](url)
          .set('Authorization', signedIn[role].auth)
          .send({})
        if (allowed.includes(role)) {
          // Let through: it may still refuse the empty body (400), but never for the role.
          expect(
            [401, 403, 404],
            `${key} as ${role}: ${res.status} ${JSON.stringify(res.body)}`,
          ).not.toContain(res.status)
        } else {
          expect(res.status, `${key} as ${role}`).toBe(403)
          expect(res.body.error.code).toBe('forbidden')
        }
      }
    }
  })
})

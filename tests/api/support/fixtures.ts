import request from 'supertest'
import type { Express } from 'express'
import { User, Customer } from '../../../server/db/models'
import { hashPassword } from '../../../server/api/auth/auth.service'
import type { Role } from '../../../shared/api/roles'

export const TEST_PASSWORD = 'test-pass-1234'

let counter = 0

/** A user of the given role (a customer user gets a customer company of its own unless one is given). */
export async function createUser(role: Role, opts: { customerId?: number; email?: string } = {}) {
  counter += 1
  let customerId: number | null = null
  if (role === 'customer') {
    customerId =
      opts.customerId ??
      (await Customer.create({ name: `Test Water Board ${counter}`, code: `TWB${counter}` })).id
  }
  return User.create({
    email: opts.email ?? `${role}${counter}@test.example`,
    name: `Test ${role} ${counter}`,
    role,
    passwordHash: await hashPassword(TEST_PASSWORD),
    customerId,
    lockedUntil: null,
    lastLoginAt: null,
  })
}

/** Signs in through the real route and returns the bearer header value. */
export async function tokenFor(app: Express, user: User): Promise<string> {
  const res = await request(app).post('/api/auth/login').send({ email: user.email, password: TEST_PASSWORD })
  if (res.status !== 200) throw new Error(`login failed for ${user.email}: ${res.status} ${JSON.stringify(res.body)}`)
  return `Bearer ${res.body.token as string}`
}

/** One signed-in user per staff role plus a customer, for route-by-role tests. */
export async function signInEveryRole(app: Express) {
  const roles: Role[] = ['operator', 'supervisor', 'manager', 'admin', 'customer']
  const out = {} as Record<Role, { user: User; auth: string }>
  for (const role of roles) {
    const user = await createUser(role)
    out[role] = { user, auth: await tokenFor(app, user) }
  }
  return out
}

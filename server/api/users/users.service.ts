import { fn, col, where, type Transaction } from 'sequelize'
import { inTransaction } from '../../db'
import { User, Customer } from '../../db/models'
import { recordAudit, snapshot, type AuditActor } from '../../audit/audit.service'
import { HttpError, conflict, notFound } from '../../lib/httpError'
import { hashPassword } from '../auth/auth.service'
import type { Role } from '../../../shared/api/roles'
import type { UserRow } from '../../../shared/api/setup'
import type { z } from 'zod'
import type { createUserSchema, updateUserSchema } from '../../../shared/api/setup'

type CreateUserBody = z.infer<typeof createUserSchema>
type UpdateUserBody = z.infer<typeof updateUserSchema>
type UserWithCustomer = User & { customer?: Customer | null }

const fieldError = (field: string, message: string, code = 'invalid_input') =>
  new HttpError(400, code, message, [{ field, message }])

export function toUserRow(user: UserWithCustomer): UserRow {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    role: user.role,
    active: user.active,
    customerId: user.customerId,
    customerName: user.customer?.name ?? null,
    lastLoginAt: user.lastLoginAt ? user.lastLoginAt.toISOString() : null,
    createdAt: user.createdAt.toISOString(),
  }
}

export async function listUsers(): Promise<UserRow[]> {
  const users = await User.findAll({
    include: [{ model: Customer, as: 'customer' }],
    order: [
      ['name', 'ASC'],
      ['id', 'ASC'],
    ],
  })
  return users.map(toUserRow)
}

async function loadRow(id: number, t: Transaction): Promise<UserRow> {
  const user = await User.findByPk(id, {
    include: [{ model: Customer, as: 'customer' }],
    transaction: t,
  })
  if (!user) throw notFound('User')
  return toUserRow(user)
}

async function assertCustomerExists(customerId: number, t: Transaction) {
  const customer = await Customer.findByPk(customerId, { transaction: t })
  if (!customer)
    throw fieldError(
      'body.customerId',
      `Customer #${customerId} does not exist`,
      'invalid_reference',
    )
}

export async function createUser(actor: AuditActor, body: CreateUserBody): Promise<UserRow> {
  return inTransaction(async (t) => {
    const taken = await User.findOne({
      where: where(fn('lower', col('email')), body.email),
      transaction: t,
    })
    if (taken)
      throw conflict('duplicate_email', `A user with the e-mail ${body.email} already exists`)
    const customerId = body.role === 'customer' ? (body.customerId ?? null) : null
    if (customerId !== null) await assertCustomerExists(customerId, t)
    const user = await User.create(
      {
        email: body.email,
        name: body.name,
        role: body.role,
        passwordHash: await hashPassword(body.password),
        customerId,
        lockedUntil: null,
        lastLoginAt: null,
      },
      { transaction: t },
    )
    await recordAudit(t, actor, {
      action: 'user.create',
      entityType: 'user',
      entityId: user.id,
      after: user,
    })
    return loadRow(user.id, t)
  })
}

/**
 * Someone must always be able to manage people and specs: refuses a change that would leave no
 * active admin. The admins' rows are locked so two admins cannot demote each other at once.
 */
async function assertAnAdminRemains(
  target: User,
  nextRole: Role,
  nextActive: boolean,
  t: Transaction,
) {
  const losesAnAdmin =
    target.role === 'admin' && target.active && (nextRole !== 'admin' || !nextActive)
  if (!losesAnAdmin) return
  const admins = await User.findAll({
    where: { role: 'admin', active: true },
    lock: t.LOCK.UPDATE,
    transaction: t,
  })
  if (admins.every((a) => a.id === target.id)) {
    const what = nextActive ? 'given another role' : 'deactivated'
    throw conflict(
      'last_admin',
      `${target.name} is the last active administrator and cannot be ${what}: make another person an administrator first`,
    )
  }
}

export async function updateUser(
  actor: AuditActor,
  id: number,
  body: UpdateUserBody,
): Promise<UserRow> {
  return inTransaction(async (t) => {
    const user = await User.findByPk(id, { lock: t.LOCK.UPDATE, transaction: t })
    if (!user) throw notFound('User')
    const before = snapshot(user)
    const nextRole = body.role ?? user.role
    const nextActive = body.active ?? user.active
    if (user.id === actor.id && nextActive === false && user.active) {
      throw conflict(
        'self_deactivation',
        'You cannot deactivate your own account; ask another administrator',
      )
    }
    // A customer user belongs to exactly one company; staff belong to none (the table checks it too).
    let nextCustomerId = body.customerId !== undefined ? body.customerId : user.customerId
    if (nextRole !== 'customer') {
      if (body.customerId != null) {
        throw fieldError(
          'body.customerId',
          'Staff belong to no customer company; leave the customer empty',
        )
      }
      nextCustomerId = null
    } else if (nextCustomerId == null) {
      throw fieldError(
        'body.customerId',
        'A customer user needs the customer company they belong to',
      )
    } else if (nextCustomerId !== user.customerId) {
      await assertCustomerExists(nextCustomerId, t)
    }
    await assertAnAdminRemains(user, nextRole, nextActive, t)

    const changes: Partial<User> = {}
    if (body.name !== undefined && body.name !== user.name) changes.name = body.name
    if (nextRole !== user.role) changes.role = nextRole
    if (nextActive !== user.active) changes.active = nextActive
    if (nextCustomerId !== user.customerId) changes.customerId = nextCustomerId
    if (Object.keys(changes).length > 0) {
      await user.update({ ...changes, version: user.version + 1 }, { transaction: t })
      const action =
        changes.active === false
          ? 'user.deactivate'
          : changes.active
            ? 'user.reactivate'
            : 'user.update'
      await recordAudit(t, actor, {
        action,
        entityType: 'user',
        entityId: user.id,
        before,
        after: user,
      })
    }
    return loadRow(user.id, t)
  })
}

/** Sets a new password, ends every session signed with the old one and lifts a lockout. */
export async function resetPassword(
  actor: AuditActor,
  id: number,
  password: string,
): Promise<UserRow> {
  return inTransaction(async (t) => {
    const user = await User.findByPk(id, { lock: t.LOCK.UPDATE, transaction: t })
    if (!user) throw notFound('User')
    const before = snapshot(user)
    await user.update(
      {
        passwordHash: await hashPassword(password),
        tokenVersion: user.tokenVersion + 1,
        failedLogins: 0,
        lockedUntil: null,
        version: user.version + 1,
      },
      { transaction: t },
    )
    await recordAudit(t, actor, {
      action: 'user.reset-password',
      entityType: 'user',
      entityId: user.id,
      before,
      after: user,
      note: 'Password reset by an administrator; earlier sessions signed out',
    })
    return loadRow(user.id, t)
  })
}

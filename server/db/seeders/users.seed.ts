import { fn, col, where } from 'sequelize'
import { Customer, User } from '../models'
import { hashPassword } from '../../api/auth/auth.service'
import type { Role } from '../../../shared/api/roles'
import { DEMO_PASSWORD } from './demoPassword'
import { auditSeed, count, type Seeder } from './seeder'

export interface DemoSignIn {
  email: string
  role: Role
  name: string
  /** What this account is for in the demo. */
  purpose: string
  customerCode?: string
}

/** Every demo account signs in with DEMO_PASSWORD; the start script prints this list. */
export const DEMO_SIGN_INS: DemoSignIn[] = [
  {
    email: 'operator@harrowgate.example',
    role: 'operator',
    name: 'Alex Marlow',
    purpose: 'records readings at the line tablet',
  },
  {
    email: 'supervisor@harrowgate.example',
    role: 'supervisor',
    name: 'Jordan Pike',
    purpose: 'reviews, holds and releases lots',
  },
  {
    email: 'supervisor2@harrowgate.example',
    role: 'supervisor',
    name: 'Casey Wren',
    purpose: 'a second QA supervisor, for a release independent of the recorder',
  },
  {
    email: 'manager@harrowgate.example',
    role: 'manager',
    name: 'Morgan Hale',
    purpose: 'watches yield and trends',
  },
  {
    email: 'admin@harrowgate.example',
    role: 'admin',
    name: 'Riley Thorne',
    purpose: 'people, specs, instruments, customers',
  },
  {
    email: 'buyer@ashvale-water.example',
    role: 'customer',
    name: 'Taylor Brook',
    purpose: "buyer at Ashvale Water Board: sees only that company's certificates",
    customerCode: 'AWB',
  },
]

export const usersSeeder: Seeder = {
  name: 'users',
  async run(ctx) {
    const { t } = ctx
    // One hash for all: bcrypt is slow on purpose, and every demo account shares the password.
    let passwordHash: string | null = null
    for (const s of DEMO_SIGN_INS) {
      const existing = await User.findOne({
        where: where(fn('lower', col('email')), s.email),
        transaction: t,
      })
      count(ctx, 'users', !existing)
      if (existing) continue
      let customerId: number | null = null
      if (s.customerCode) {
        const customer = await Customer.findOne({ where: { code: s.customerCode }, transaction: t })
        if (!customer)
          throw new Error(`Seed order: customer ${s.customerCode} must be seeded before ${s.email}`)
        customerId = customer.id
      }
      passwordHash ??= await hashPassword(DEMO_PASSWORD)
      const user = await User.create(
        {
          email: s.email,
          name: s.name,
          role: s.role,
          passwordHash,
          customerId,
          lockedUntil: null,
          lastLoginAt: null,
        },
        { transaction: t },
      )
      await auditSeed(ctx, 'user', user.id, user)
    }
  },
}

import { CoatingSpec, Customer, SpecVersion, User } from '../models'
import { DEMO_SPECS } from './specContents.seed'
import { auditSeed, count, type Seeder } from './seeder'

export const specsSeeder: Seeder = {
  name: 'specs',
  async run(ctx) {
    const { t } = ctx
    const admin = await User.findOne({
      where: { email: 'admin@harrowgate.example' },
      transaction: t,
    })
    for (const s of DEMO_SPECS) {
      const existing = await CoatingSpec.findOne({ where: { code: s.code }, transaction: t })
      count(ctx, 'coating specs', !existing)
      if (existing) continue
      const customer = s.customerCode
        ? await Customer.findOne({ where: { code: s.customerCode }, transaction: t })
        : null
      if (s.customerCode && !customer)
        throw new Error(`Seed order: customer ${s.customerCode} must come before spec ${s.code}`)
      const spec = await CoatingSpec.create(
        { code: s.code, title: s.title, customerId: customer?.id ?? null, currentVersion: 1 },
        { transaction: t },
      )
      const v1 = await SpecVersion.create(
        {
          specId: spec.id,
          version: 1,
          content: s.content,
          changeNote: 'First version (demo seed)',
          createdBy: admin?.id ?? null,
          lockedAt: null,
        },
        { transaction: t },
      )
      await auditSeed(ctx, 'coating-spec', spec.id, { spec, version: v1 })
    }
  },
}

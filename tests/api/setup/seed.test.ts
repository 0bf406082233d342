import { describe, it, expect } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { DEMO_PASSWORD, DEMO_SIGN_INS, SEEDERS, runSeed } from '../../../server/db/seeders'
import {
  AuditEvent,
  CoatingSpec,
  Customer,
  CustomerContact,
  Instrument,
  SpecVersion,
  User,
} from '../../../server/db/models'
import { specContentSchema } from '../../../shared/spec/specContent'
import { createUser } from '../support/fixtures'
import { localIsoDate } from '../../../shared/api/calibration'

const app = createApp()

async function counts() {
  return {
    users: await User.count(),
    customers: await Customer.count(),
    contacts: await CustomerContact.count(),
    specs: await CoatingSpec.count(),
    versions: await SpecVersion.count(),
    instruments: await Instrument.count(),
  }
}

describe('demo seed (Harrowgate Flow Works)', () => {
  it('seeds every demo sign-in, customers, specs and instruments; a second run duplicates nothing and keeps later changes', async () => {
    await runSeed()
    const first = await counts()
    expect(first).toMatchObject({ users: DEMO_SIGN_INS.length, specs: 4, versions: 4 })
    expect(first.customers).toBeGreaterThanOrEqual(3)
    expect(first.instruments).toBeGreaterThanOrEqual(9)

    // Every demo account signs in with the demo password and has the role it is listed with.
    for (const s of DEMO_SIGN_INS) {
      const res = await request(app)
        .post('/api/auth/login')
        .send({ email: s.email, password: DEMO_PASSWORD })
      expect(res.status, s.email).toBe(200)
      expect(res.body.user.role).toBe(s.role)
    }
    const roles = DEMO_SIGN_INS.map((s) => s.role)
    for (const role of ['operator', 'supervisor', 'manager', 'admin', 'customer'])
      expect(roles).toContain(role)
    expect(roles.filter((r) => r === 'supervisor')).toHaveLength(2)
    expect(DEMO_SIGN_INS.every((s) => s.email.endsWith('.example'))).toBe(true)

    // The list shows each calibration state from the first start.
    const admin = await request(app)
      .post('/api/auth/login')
      .send({ email: 'admin@harrowgate.example', password: DEMO_PASSWORD })
    const list = await request(app)
      .get('/api/instruments')
      .set('Authorization', `Bearer ${admin.body.token}`)
    const states = new Set(list.body.map((i: { calibrationStatus: string }) => i.calibrationStatus))
    expect([...states].sort()).toEqual(['current', 'due-soon', 'overdue'])

    // Seeded specs are valid by the same schema the API checks.
    for (const v of await SpecVersion.findAll())
      expect(specContentSchema.safeParse(v.content).success).toBe(true)

    // Between runs: someone adds a user and renames a seeded customer.
    const added = await createUser('operator', { email: 'night.shift@harrowgate.example' })
    await Customer.update({ name: 'Ashvale Water Board (renamed)' }, { where: { code: 'AWB' } })
    const auditsBefore = await AuditEvent.count()

    const summary = await runSeed()
    expect(await counts()).toEqual({ ...first, users: first.users + 1 })
    expect(await User.findByPk(added.id)).not.toBeNull()
    expect((await Customer.findOne({ where: { code: 'AWB' } }))!.name).toBe(
      'Ashvale Water Board (renamed)',
    )
    expect(Object.values(summary.tally).every((n) => n.created === 0)).toBe(true)
    expect(await AuditEvent.count()).toBe(auditsBefore)
  })

  it('runs a `once` seeder only on the first run', async () => {
    let runs = 0
    const history = { name: 'test-history', once: true, run: async () => void runs++ }
    await runSeed([...SEEDERS, history], localIsoDate())
    const second = await runSeed([...SEEDERS, history], localIsoDate())
    expect(runs).toBe(1)
    // Every `once` seeder of the demo (floor and review history, certificates) is skipped too.
    expect(second.skipped).toContain('test-history')
    const onceNames = SEEDERS.filter((s) => s.once).map((s) => s.name)
    expect([...second.skipped].sort()).toEqual([...onceNames, 'test-history'].sort())
  })
})

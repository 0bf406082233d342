import { describe, it, expect } from 'vitest'
import { refuseDemoPasswordsInProduction } from '../../../server/db/seeders/demoGuard'
import { DEMO_PASSWORD } from '../../../server/db/seeders/demoPassword'
import { hashPassword } from '../../../server/api/auth/auth.service'
import { createUser } from '../support/fixtures'

/** With NODE_ENV=production, server/index.ts calls this before listening. */
describe('production refuses demo passwords', () => {
  it('names every active account that still has the demo password, and passes once reset', async () => {
    await createUser('operator')
    const demo = await createUser('admin', { email: 'demo-admin@harrowgate.example' })
    await demo.update({ passwordHash: await hashPassword(DEMO_PASSWORD) })
    await expect(refuseDemoPasswordsInProduction()).rejects.toThrow(/demo-admin@harrowgate\.example/)

    await demo.update({ passwordHash: await hashPassword('a-new-secret-2027') })
    await expect(refuseDemoPasswordsInProduction()).resolves.toBeUndefined()
  })

  it('ignores a deactivated account with the demo password (it cannot sign in)', async () => {
    const old = await createUser('supervisor', { email: 'gone@harrowgate.example' })
    await old.update({ passwordHash: await hashPassword(DEMO_PASSWORD), active: false })
    await expect(refuseDemoPasswordsInProduction()).resolves.toBeUndefined()
  })
})

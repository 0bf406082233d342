import { beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { routeTable } from '../../../server/api/secureRouter'
import { signInEveryRole } from '../support/fixtures'
import { ROLES, type Role } from '../../../shared/api/roles'

const app = createApp()
/** From the brief: plant managers, QA supervisors and administrators; not operators or customers. */
const ALLOWED: Role[] = ['supervisor', 'manager', 'admin']
const EXPECTED = ['get /api/trends', 'get /api/trends/export.csv', 'get /api/trends/options']

describe('Line health routes by role', () => {
  let signedIn: Awaited<ReturnType<typeof signInEveryRole>>
  beforeAll(async () => {
    signedIn = await signInEveryRole(app)
  })

  it('declares exactly the trend routes, each for manager, supervisor and admin', () => {
    const mine = routeTable.filter((r) => r.path.startsWith('/api/trends'))
    expect(mine.map((r) => `${r.method} ${r.path}`).sort()).toEqual(EXPECTED)
    for (const r of mine) expect([...(r.roles as Role[])].sort()).toEqual([...ALLOWED].sort())
  })

  it('answers 401 without a token, 403 to operators and customers, 200 to the others', async () => {
    for (const path of ['/api/trends', '/api/trends/options', '/api/trends/export.csv']) {
      expect((await request(app).get(path)).status, `${path} anonymous`).toBe(401)
      for (const role of ROLES) {
        const res = await request(app).get(path).set('Authorization', signedIn[role].auth)
        if (ALLOWED.includes(role)) expect(res.status, `${path} as ${role}`).toBe(200)
        else {
          expect(res.status, `${path} as ${role}`).toBe(403)
          expect(res.body.error.code).toBe('forbidden')
        }
      }
    }
  })
})

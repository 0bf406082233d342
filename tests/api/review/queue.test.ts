import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { routeTable } from '../../../server/api/secureRouter'
import { signInEveryRole } from '../support/fixtures'
import type { Role } from '../../../shared/api/roles'
import {
  GOOD_SPOTS_UM,
  THIN_SPOTS_UM,
  decide,
  reviewWorld,
  submittedLot,
  type ReviewWorld,
} from './reviewSupport'

const app = createApp()
let w: ReviewWorld

beforeAll(async () => {
  w = await reviewWorld(app)
})

interface Entry {
  id: number
  status: string
  submittedAt: string
  openNonconformances: number
  recorderIds: number[]
  lotVerdict: { status: string }
}

describe('the review queue', () => {
  it('lists lots awaiting review oldest submission first, then lots on hold, with verdict and open NCs', async () => {
    const first = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const held = await submittedLot(app, w, [GOOD_SPOTS_UM])
    const failing = await submittedLot(app, w, [THIN_SPOTS_UM, THIN_SPOTS_UM])
    const released = await submittedLot(app, w, [GOOD_SPOTS_UM])
    await decide(app, w, w.supervisor, held.id, 'hold', 'Waiting for the lab')
    await decide(app, w, w.supervisor, released.id, 'release')

    const res = await request(app).get('/api/review/queue').set('Authorization', w.supervisor.auth)
    expect(res.status).toBe(200)
    const queue = res.body as Entry[]
    const ours = queue.filter((q) => [first.id, held.id, failing.id, released.id].includes(q.id))
    expect(ours.map((q) => q.id)).toEqual([first.id, failing.id, held.id])
    const byId = new Map(ours.map((q) => [q.id, q]))
    expect(byId.get(first.id)).toMatchObject({
      status: 'awaiting-review',
      openNonconformances: 0,
      lotVerdict: { status: 'pass' },
    })
    expect(byId.get(failing.id)).toMatchObject({
      openNonconformances: 2,
      lotVerdict: { status: 'fail' },
    })
    expect(byId.get(held.id)!.status).toBe('on-hold')
    expect(byId.get(first.id)!.recorderIds).toEqual([w.operator.user.id])
    expect(Date.parse(byId.get(first.id)!.submittedAt)).toBeLessThan(
      Date.parse(byId.get(failing.id)!.submittedAt),
    )
  })
})

/** Who may call what, written out from the brief and the contract (not read back from the code). */
const STAFF: Role[] = ['operator', 'supervisor', 'manager', 'admin']
const EXPECTED: Record<string, Role[]> = {
  'post /api/lots/:id/submit': ['operator', 'supervisor'],
  'get /api/review/queue': ['supervisor', 'admin'],
  'post /api/lots/:id/decisions': ['supervisor', 'admin'],
  'get /api/lots/:id/decisions': STAFF,
  'post /api/lots/:id/reopen': ['supervisor', 'admin'],
  'get /api/lots/:id/history': STAFF,
  'get /api/nonconformances': STAFF,
  'post /api/nonconformances': ['operator', 'supervisor', 'admin'],
  'get /api/nonconformances/:id': STAFF,
  'post /api/nonconformances/:id/disposition': ['supervisor', 'admin'],
  'post /api/nonconformances/:id/close': ['supervisor', 'admin'],
  'post /api/nonconformances/:id/photos': ['operator', 'supervisor', 'admin'],
  'get /api/defect-types': STAFF,
  'post /api/defect-types': ['admin'],
  'patch /api/defect-types/:id': ['admin'],
  'get /api/audit': ['admin'],
}

describe('review routes by role', () => {
  it('the route table says exactly what the brief says', () => {
    for (const [key, roles] of Object.entries(EXPECTED)) {
      const [method, path] = key.split(' ')
      const entry = routeTable.find((r) => r.method === method && r.path === path)
      expect(entry, key).toBeDefined()
      expect([...(entry!.roles as Role[])].sort(), key).toEqual([...roles].sort())
    }
  })

  it('every other role is refused with 403 before anything is read', async () => {
    const signedIn = await signInEveryRole(app)
    for (const [key, roles] of Object.entries(EXPECTED)) {
      const [method, path] = key.split(' ') as ['get' | 'post' | 'patch', string]
      for (const role of ['operator', 'supervisor', 'manager', 'admin', 'customer'] as Role[]) {
        if (roles.includes(role)) continue
        const res = await request(app)
          [method](path.replace(':id', '999999'))
          .set('Authorization', signedIn[role].auth)
          .send({})
        expect(res.status, `${role} ${key}`).toBe(403)
      }
    }
  })
})

import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { routeTable } from '../../../server/api/secureRouter'
import { ROLES, type Role } from '../../../shared/api/roles'
import { buildSecurityWorld, fillPath, routeKey, type SecurityWorld } from './securityWorld'

const app = createApp()

const ALL: Role[] = [...ROLES]
const STAFF: Role[] = ['operator', 'supervisor', 'manager', 'admin']
const FLOOR: Role[] = ['operator', 'supervisor']
const QA: Role[] = ['supervisor', 'admin']
const ADMIN: Role[] = ['admin']
const TRENDS: Role[] = ['supervisor', 'manager', 'admin']
const CERT_READERS: Role[] = ['supervisor', 'manager', 'admin', 'customer']

/**
 * Who may call what, written out by hand from PRODUCT.md's roles and reviewed here — not read
 * back from the routers. A route added to the product without an entry here fails the first test,
 * so every new route gets a reviewed line.
 */
const EXPECTED: Record<string, Role[] | 'public'> = {
  'POST /api/auth/login': 'public',
  'GET /api/auth/me': ALL,
  'PATCH /api/auth/me/preferences': ALL,
  'GET /api/health': 'public',
  'GET /api/users': ADMIN,
  'POST /api/users': ADMIN,
  'PATCH /api/users/:id': ADMIN,
  'POST /api/users/:id/reset-password': ADMIN,
  'GET /api/customers': STAFF,
  'GET /api/customers/:id': STAFF,
  'POST /api/customers': ADMIN,
  'PATCH /api/customers/:id': ADMIN,
  'POST /api/customers/:id/contacts': ADMIN,
  'PATCH /api/customers/:id/contacts/:contactId': ADMIN,
  'GET /api/specs': STAFF,
  'GET /api/specs/:id': STAFF,
  'GET /api/specs/:id/versions/:version': STAFF,
  'POST /api/specs': ADMIN,
  'PUT /api/specs/:id': ADMIN,
  'GET /api/instruments': STAFF,
  'POST /api/instruments': ADMIN,
  'PATCH /api/instruments/:id': ADMIN,
  'GET /api/settings': STAFF,
  'PUT /api/settings': ADMIN,
  'GET /api/lots': STAFF,
  'POST /api/lots': FLOOR,
  'GET /api/lots/:id': STAFF,
  'PATCH /api/lots/:id': FLOOR,
  'POST /api/lots/:id/parts': FLOOR,
  'GET /api/parts/:id': STAFF,
  'PATCH /api/parts/:id': FLOOR,
  'PUT /api/parts/:id/sections/:section': FLOOR,
  'POST /api/parts/:id/readings': FLOOR,
  'POST /api/readings/:id/discard': FLOOR,
  'POST /api/instruments/:id/verifications': FLOOR,
  'GET /api/instruments/:id/verifications': STAFF,
  'POST /api/parts/:id/photos': FLOOR,
  'POST /api/lots/:id/photos': FLOOR,
  'GET /api/photos/:id': STAFF,
  'GET /api/photos/:id/thumb': STAFF,
  'GET /api/trends': TRENDS,
  'GET /api/trends/options': TRENDS,
  'GET /api/trends/export.csv': TRENDS,
  'POST /api/lots/:id/submit': FLOOR,
  'POST /api/lots/:id/decisions': QA,
  'GET /api/lots/:id/decisions': STAFF,
  'POST /api/lots/:id/reopen': QA,
  'GET /api/lots/:id/history': STAFF,
  'GET /api/review/queue': QA,
  'GET /api/nonconformances': STAFF,
  // The floor opens a nonconformance when it finds damage; QA (admin included) at the desk.
  'POST /api/nonconformances': ['operator', 'supervisor', 'admin'],
  'GET /api/nonconformances/:id': STAFF,
  'POST /api/nonconformances/:id/disposition': QA,
  'POST /api/nonconformances/:id/close': QA,
  'POST /api/nonconformances/:id/photos': ['operator', 'supervisor', 'admin'],
  'GET /api/defect-types': STAFF,
  'POST /api/defect-types': ADMIN,
  'PATCH /api/defect-types/:id': ADMIN,
  'GET /api/audit': ADMIN,
  'POST /api/lots/:id/certificates': QA,
  'GET /api/certificates': CERT_READERS,
  'GET /api/certificates/lots-to-issue': TRENDS,
  'GET /api/certificates/:id': CERT_READERS,
  'GET /api/certificates/:id/pdf': CERT_READERS,
  'POST /api/certificates/:id/reissue': QA,
  'POST /api/certificates/:id/revoke': QA,
  'POST /api/certificates/:id/resend': QA,
  'GET /api/verify/:code': 'public',
}

const sameRoles = (a: readonly Role[] | 'public') => (a === 'public' ? 'public' : [...a].sort())

describe('the expectation table and the router table agree', () => {
  it('every route in the product has a reviewed entry, and every entry is still a route', () => {
    const inProduct = routeTable.map(routeKey)
    expect(new Set(inProduct).size, 'a route is registered twice').toBe(inProduct.length)
    const missing = inProduct.filter((k) => !(k in EXPECTED))
    const stale = Object.keys(EXPECTED).filter((k) => !inProduct.includes(k))
    expect(missing, 'routes without an entry in EXPECTED: add a reviewed line').toEqual([])
    expect(stale, 'entries in EXPECTED that are no longer routes').toEqual([])
  })

  it("each route's roles are the reviewed ones", () => {
    const differing = routeTable
      .filter((r) => routeKey(r) in EXPECTED)
      .filter(
        (r) =>
          JSON.stringify(sameRoles(r.roles)) !== JSON.stringify(sameRoles(EXPECTED[routeKey(r)]!)),
      )
      .map((r) => ({ route: routeKey(r), product: r.roles, reviewed: EXPECTED[routeKey(r)] }))
    expect(differing).toEqual([])
  })
})

describe('every route × anonymous and each role', () => {
  let world: SecurityWorld
  beforeAll(async () => {
    world = await buildSecurityWorld(app)
  }, 60_000)

  async function call(method: string, path: string, auth?: string) {
    const m = method as 'get' | 'post' | 'put' | 'patch' | 'delete'
    const req = request(app)[m](path)
    if (auth) req.set('Authorization', auth)
    return method === 'get' ? req : req.send({})
  }

  // One test per route so a failure names it; the world is shared (built once).
  for (const route of routeTable) {
    const key = routeKey(route)
    it(key, async () => {
      const path = fillPath(route.path, world.ids)
      const seen: Record<string, number> = {}
      const anon = await call(route.method, path)
      seen.anonymous = anon.status
      for (const role of ROLES)
        seen[role] = (await call(route.method, path, world.auth[role])).status

      // Allowed callers get the route's own answer (200, or 400/404/409 for the empty body):
      // never 401/403, never a 5xx. Everyone else: 401 anonymous, 403 signed in.
      const reachable = (status: number) =>
        [401, 403].includes(status) || status >= 500 ? 'reachable' : `${status}`
      const allowed = route.roles === 'public' ? ALL : route.roles
      const actual: Record<string, string> = { anonymous: `${seen.anonymous}` }
      const expected: Record<string, string> = {
        anonymous: route.roles === 'public' ? reachable(seen.anonymous!) : '401',
      }
      for (const role of ROLES) {
        actual[role] = `${seen[role]}`
        expected[role] = allowed.includes(role) ? reachable(seen[role]!) : '403'
      }
      if (process.env.SHOW_MATRIX) console.log(key, path, JSON.stringify(seen))
      expect({ path, ...actual }).toEqual({ path, ...expected })
    })
  }
})

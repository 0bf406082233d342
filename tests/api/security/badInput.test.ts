import { describe, it, expect, beforeAll } from 'vitest'
import { createApp } from '../../../server/app'
import { routeTable } from '../../../server/api/secureRouter'
import { sequelize } from '../../../server/db'
import { lotBody } from '../floor/floorSupport'
import {
  GOOD_SPOTS_UM,
  decide,
  inspectedLot,
  submittedLot,
  type ReviewWorld,
} from '../review/reviewSupport'
import {
  buildSecurityWorld,
  fillPath,
  releasedLotWithCertificate,
  routeKey,
  type SecurityWorld,
} from './securityWorld'
import { SAMPLES, type SampleContext } from './badInputSamples'
import {
  HOSTILE,
  MALFORMED,
  NOT_AN_OBJECT,
  callerFor,
  fieldPaths,
  problemWith,
  send,
  withHostile,
} from './badInputEngine'

/**
 * Every POST/PUT/PATCH route in routeTable, signed in as a role that may call it, fed bad input:
 * each must answer 4xx with `{ error: { code, message } }` (or accept it as plain text) — never a
 * 5xx. Generated from the table, so a new route is covered the day it is added.
 */
const app = createApp()
const writes = routeTable.filter((r) => ['post', 'put', 'patch'].includes(r.method))

async function releasedLot(w: ReviewWorld) {
  const lot = await submittedLot(app, w, [GOOD_SPOTS_UM])
  expect((await decide(app, w, w.supervisor, lot.id, 'release')).status).toBe(201)
  return lot.id
}

let world: SecurityWorld
let ctxIds: SampleContext['ids']
beforeAll(async () => {
  world = await buildSecurityWorld(app)
  const w = world.review
  ctxIds = {
    ...world.ids,
    submittedLot: (await submittedLot(app, w, [GOOD_SPOTS_UM])).id,
    openLot2: (await inspectedLot(app, w, [GOOD_SPOTS_UM])).id,
    thermometer: w.ids.thermometer,
    lotForReopen: (await releasedLotWithCertificate(app, w)).lot.id,
    lotForCertificate: await releasedLot(w),
    certificateForRevoke: (await releasedLotWithCertificate(app, w)).certificate!.id,
    certificateForResend: (await releasedLotWithCertificate(app, w)).certificate!.id,
  }
}, 90_000)

const authFor = (route: (typeof writes)[number]) => {
  const role = callerFor(route)
  return role ? world.auth[role] : null
}

describe('every write route has a reviewed sample body (or says it takes none)', () => {
  it('SAMPLES and routeTable agree', () => {
    const keys = writes.map(routeKey)
    expect(
      keys.filter((k) => !(k in SAMPLES)),
      'write routes without a sample',
    ).toEqual([])
    expect(
      Object.keys(SAMPLES).filter((k) => !keys.includes(k)),
      'samples of no route',
    ).toEqual([])
  })
})

// First: the generic bodies below ({} submits a lot) would change the state the samples rely on.
describe('each field of a valid body replaced by each hostile value', () => {
  for (const route of writes) {
    const sample = SAMPLES[routeKey(route)]
    if (!sample) continue
    it(routeKey(route), { timeout: 240_000 }, async () => {
      const auth = authFor(route)
      const ctx: SampleContext = { app, ids: ctxIds, auth: auth ?? '' }
      const path = sample.path ? sample.path(ctxIds) : fillPath(route.path, world.ids)
      // (control) the sample as it is gets through, so the hostile values below reach past the
      // schema's first refusal.
      const base = await sample.body(ctx)
      const control = await send(app, route.method, path, auth, JSON.stringify(base))
      const expected = sample.control ?? 'a 2xx'
      const got = control.status < 300 ? 'a 2xx' : control.status
      expect(got, `control: ${control.text.slice(0, 300)}`).toBe(expected)
      // The sample's own (nested) fields, plus any field the schema names for an empty body.
      const empty = await send(app, route.method, path, auth, '{}')
      const details: unknown = empty.body?.error?.details
      const named = (Array.isArray(details) ? (details as { field: string }[]) : [])
        .map((d) => d.field.split('.').slice(1))
        .filter((f) => f.length === 1 && !(f[0]! in base))
      const problems: string[] = []
      for (const field of [...fieldPaths(base), ...named]) {
        for (const hostile of HOSTILE) {
          const text = withHostile(await sample.body(ctx), field, hostile)
          const res = await send(app, route.method, path, auth, text)
          const problem = problemWith(res, `${field.join('.')} = ${hostile.label}`, hostile.label)
          if (problem) problems.push(problem)
        }
      }
      expect(problems).toEqual([])
    })
  }
})

describe('malformed, non-object, empty and oversized bodies', () => {
  for (const route of writes) {
    it(routeKey(route), async () => {
      const path = fillPath(route.path, world.ids)
      const auth = authFor(route)
      const problems: string[] = []
      for (const text of MALFORMED) {
        const res = await send(app, route.method, path, auth, text)
        if (res.status !== 400 || res.body?.error?.code !== 'malformed_json') {
          problems.push(
            `malformed ${JSON.stringify(text)} → ${res.status} ${res.text.slice(0, 120)}`,
          )
        }
      }
      for (const text of [...NOT_AN_OBJECT, '{}']) {
        const problem = problemWith(await send(app, route.method, path, auth, text), text)
        if (problem) problems.push(problem)
      }
      const plain = await send(app, route.method, path, auth, 'email=a&password=b', 'text/plain')
      const p = problemWith(plain, 'text/plain body')
      if (p) problems.push(p)
      const huge = await send(app, route.method, path, auth, JSON.stringify({ a: 'x'.repeat(3e6) }))
      if (huge.status !== 413 || huge.body?.error?.code !== 'too_large') {
        problems.push(`3 MB body → ${huge.status}`)
      }
      expect(problems).toEqual([])
    })
  }
})

describe('hostile ids in the path', () => {
  const BAD_IDS = ['NaN', 'Infinity', '1e308', '-1', '0', '1.5', '99999999999', '2147483648']
  const BAD_TEXT = ["1'; DROP TABLE lots; --", '%3Cscript%3E', '..%2F..%2Fetc%2Fpasswd', '%00']
  const withParams = routeTable.filter((r) => r.path.includes('/:'))
  for (const route of withParams) {
    it(routeKey(route), async () => {
      const problems: string[] = []
      for (const id of [...BAD_IDS, ...BAD_TEXT]) {
        // Each param in turn; the others keep their real ids.
        for (const param of route.path.match(/:[A-Za-z]+/g) ?? []) {
          const path = fillPath(route.path.replace(param, id), world.ids)
          const res = await send(app, route.method, path, authFor(route), '{}')
          const problem = problemWith(res, `${param} = ${id}`)
          if (problem) problems.push(problem)
          else if (res.status < 400) problems.push(`${path} → ${res.status}: a bad id was taken`)
        }
      }
      expect(problems).toEqual([])
    })
  }
})

describe('hostile query strings on every read route', () => {
  // The filters the list and report routes take; a route ignores (strips) those it does not know.
  const KEYS = ['q', 'limit', 'offset', 'from', 'to', 'customerId', 'specId', 'lotId', 'actorId']
  const KEYS_MORE = ['status', 'state', 'line', 'shift', 'entityId', 'lotNumber', 'subgroupSize']
  const VALUES = [
    'NaN',
    'Infinity',
    '-1',
    '1e308',
    '2147483648',
    '9007199254740993',
    "'; DROP TABLE lots; --",
    '%3Cscript%3E',
    'x'.repeat(4000),
    '2026-02-30',
    '',
  ]
  const reads = routeTable.filter((r) => r.method === 'get')
  for (const route of reads) {
    it(routeKey(route), async () => {
      const path = fillPath(route.path, world.ids)
      const problems: string[] = []
      for (const key of [...KEYS, ...KEYS_MORE]) {
        for (const value of VALUES) {
          const res = await send(app, 'get', `${path}?${key}=${value}`, authFor(route), '')
          // CSV and PDF answer their own type when the filter is fine; a refusal is JSON.
          if (res.status >= 500)
            problems.push(`${key}=${value.slice(0, 30)} → ${res.status} ${res.text.slice(0, 160)}`)
          else if (res.status >= 400 && typeof res.body?.error?.code !== 'string')
            problems.push(`${key}=${value.slice(0, 30)} → ${res.status} without the error body`)
        }
      }
      // Twice the same key (Express makes it an array).
      const twice = await send(app, 'get', `${path}?limit=5&limit=6&q=a&q=b`, authFor(route), '')
      if (twice.status >= 500) problems.push(`repeated keys → ${twice.status}`)
      expect(problems).toEqual([])
    })
  }
})

describe('impossible dates and ids beyond int4 name the field', () => {
  it('list filters', async () => {
    const auth = world.auth.admin
    const cases: [string, string][] = [
      ['/api/lots?from=2026-02-30', 'query.from: No such calendar date'],
      ['/api/audit?to=2026-13-01', 'query.to: No such calendar date'],
      ['/api/trends?from=2026-02-29', 'query.from: No such calendar date'],
      ['/api/lots?customerId=2147483648', 'query.customerId'],
      ['/api/certificates?customerId=2147483648', 'query.customerId'],
    ]
    for (const [path, message] of cases) {
      const res = await send(app, 'get', path, auth, '')
      expect(res.status, path).toBe(400)
      expect(res.body.error.message, path).toContain(message)
    }
  })

  it('a lot whose powder batch expires on 31 April', async () => {
    const body = lotBody(world.ids.customer, world.ids.spec, { batchExpiresOn: '2027-04-31' })
    const res = await send(app, 'post', '/api/lots', world.auth.operator, JSON.stringify(body))
    expect(res.status).toBe(400)
    expect(res.body.error.message).toBe('body.batchExpiresOn: No such calendar date')
  })
})

describe('afterwards', () => {
  it('no SQL-shaped string ran: the lots table is still there and holds the lots', async () => {
    const [rows] = await sequelize.query('SELECT count(*)::int AS n FROM lots')
    expect((rows as { n: number }[])[0]!.n).toBeGreaterThanOrEqual(3)
  })
})

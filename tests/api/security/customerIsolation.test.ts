import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { routeTable } from '../../../server/api/secureRouter'
import { Customer } from '../../../server/db/models'
import { createUser, tokenFor } from '../support/fixtures'
import {
  GOOD_SPOTS_UM,
  decide,
  inspectedLot,
  reviewWorld,
  submit,
  uuid,
  type ReviewWorld,
} from '../review/reviewSupport'
import { fillPath, routeKey, smallPng, type WorldIds } from './securityWorld'

const app = createApp()

interface CompanyRecords {
  customer: Customer
  ids: WorldIds
  /** Strings that belong to this company alone: none may appear in another company's answers. */
  secrets: string[]
}

/** A company with one released, certified lot whose part carries a photo. */
async function companyWithCertificate(w: ReviewWorld, name: string): Promise<CompanyRecords> {
  const customer = await Customer.create({ name, code: `C${uuid().slice(0, 6).toUpperCase()}` })
  const cw = { ...w, customerId: customer.id }
  const lot = await inspectedLot(app, cw, [GOOD_SPOTS_UM])
  const partId = lot.partIds[0]!
  const photo = await request(app)
    .post(`/api/parts/${partId}/photos`)
    .set('Authorization', w.operator.auth)
    .field('clientId', uuid())
    .attach('file', await smallPng(), 'flange.png')
  expect(photo.status).toBe(201)
  expect((await submit(app, w.operator, lot.id)).status).toBe(200)
  expect((await decide(app, w, w.supervisor, lot.id, 'release')).status).toBe(201)
  const cert = await request(app)
    .post(`/api/lots/${lot.id}/certificates`)
    .set('Authorization', w.supervisor.auth)
    .send({ kind: '3.1' })
  expect(cert.status).toBe(201)
  const detail = await request(app)
    .get(`/api/lots/${lot.id}`)
    .set('Authorization', w.supervisor.auth)
  const part = detail.body.parts[0] as { heatNumber: string }
  return {
    customer,
    secrets: [
      name,
      customer.code,
      lot.lotNumber,
      detail.body.orderRef as string,
      part.heatNumber,
      cert.body.number as string,
      cert.body.verifyCode as string,
    ],
    ids: {
      user: w.operator.user.id,
      customer: customer.id,
      contact: 1,
      spec: w.specId,
      specVersion: 1,
      instrument: w.ids.gauge,
      lot: lot.id,
      releasedLot: lot.id,
      part: partId,
      reading: '1',
      photo: photo.body.id as number,
      nonconformance: 1,
      defectType: 1,
      certificate: cert.body.id as number,
      verifyCode: cert.body.verifyCode as string,
      lotNumber: lot.lotNumber,
      releasedLotNumber: lot.lotNumber,
    },
  }
}

function leaked(body: unknown, secrets: string[]): string[] {
  const text = typeof body === 'string' ? body : JSON.stringify(body)
  return secrets.filter((s) => text.includes(s))
}

describe("a customer user sees nothing of another company's", () => {
  let a: CompanyRecords
  let b: CompanyRecords
  let customerA: string
  beforeAll(async () => {
    const w = await reviewWorld(app)
    a = await companyWithCertificate(w, 'Alderbank Water Board')
    b = await companyWithCertificate(w, 'Brackenmoor Irrigation Trust')
    customerA = await tokenFor(app, await createUser('customer', { customerId: a.customer.id }))
  }, 60_000)

  it('(control) its own certificate: listed, readable, and its PDF downloads', async () => {
    const list = await request(app).get('/api/certificates').set('Authorization', customerA)
    expect(list.status).toBe(200)
    expect(list.body.map((c: { id: number }) => c.id)).toEqual([a.ids.certificate])
    const one = await request(app)
      .get(`/api/certificates/${a.ids.certificate}`)
      .set('Authorization', customerA)
    expect(one.status).toBe(200)
    expect(one.body.lotNumber).toBe(a.ids.lotNumber)
    const pdf = await request(app)
      .get(`/api/certificates/${a.ids.certificate}/pdf`)
      .set('Authorization', customerA)
    expect(pdf.status).toBe(200)
    expect(pdf.headers['content-type']).toMatch(/application\/pdf/)
  })

  const customerRoutes = routeTable.filter(
    (r) => r.roles !== 'public' && r.roles.includes('customer'),
  )

  it('every customer route with an id answers 404 for the other company, leaking nothing', async () => {
    const withIds = customerRoutes.filter((r) => r.path.includes(':'))
    expect(withIds.length).toBeGreaterThan(0)
    for (const route of withIds) {
      const path = fillPath(route.path, b.ids)
      const res = await request(app)[route.method](path).set('Authorization', customerA).send({})
      expect({ route: routeKey(route), path, status: res.status }).toEqual({
        route: routeKey(route),
        path,
        status: 404,
      })
      expect(res.headers['content-type']).toMatch(/application\/json/)
      expect(leaked(res.body, b.secrets), `${routeKey(route)} leaks`).toEqual([])
    }
  })

  it('every list a customer may read, searched for the other company by id, number or order, shows none of it', async () => {
    const lists = customerRoutes.filter((r) => r.method === 'get' && !r.path.includes(':'))
    const queries = [
      '',
      `?customerId=${b.customer.id}`,
      ...b.secrets.map((s) => `?q=${encodeURIComponent(s)}`),
    ]
    for (const route of lists) {
      for (const q of queries) {
        const res = await request(app)
          .get(route.path + q)
          .set('Authorization', customerA)
        expect(res.status, `${route.path}${q}`).toBeLessThan(500)
        expect(leaked(res.body, b.secrets), `${route.path}${q} leaks`).toEqual([])
      }
    }
  })

  it('staff routes that name the other company’s lot, part or photo answer 403 and nothing else', async () => {
    const staffOnly = routeTable.filter(
      (r) => r.roles !== 'public' && !r.roles.includes('customer') && r.path.includes(':'),
    )
    for (const route of staffOnly) {
      const path = fillPath(route.path, b.ids)
      const res = await request(app)[route.method](path).set('Authorization', customerA).send({})
      expect(res.status, path).toBe(403)
      expect(leaked(res.body, b.secrets), `${path} leaks`).toEqual([])
    }
  })

  it('the public verify page gives validity only: no customer, order or heat number', async () => {
    const res = await request(app).get(`/api/verify/${b.ids.verifyCode}`)
    expect(res.status).toBe(200)
    expect(res.body.state).toBe('valid')
    const [name, code, , orderRef, heat] = b.secrets
    expect(leaked(res.body, [name!, code!, orderRef!, heat!])).toEqual([])
  })
})

import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { createUser, tokenFor } from '../support/fixtures'
import { auditFor, fieldsOf } from './setupFixtures'

const app = createApp()

describe('Setup → Customers and their certificate contacts', () => {
  let admin: string
  let operator: string
  beforeAll(async () => {
    admin = await tokenFor(app, await createUser('admin'))
    operator = await tokenFor(app, await createUser('operator'))
  })

  const ashby = {
    name: 'Ashby Fold Water Board',
    code: 'afwb',
    thicknessUnit: 'mil',
    contacts: [
      { name: 'Certificates desk', email: 'Certificates@AshbyFold.example' },
      { name: 'Old buyer', email: 'old.buyer@ashbyfold.example', receivesCertificates: false },
    ],
  }

  it('creates a customer with its contacts in one go, and staff can read it', async () => {
    const res = await request(app).post('/api/customers').set('Authorization', admin).send(ashby)
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      name: 'Ashby Fold Water Board',
      code: 'AFWB',
      thicknessUnit: 'mil',
      active: true,
    })
    expect(res.body.contacts).toEqual([
      expect.objectContaining({
        name: 'Certificates desk',
        email: 'certificates@ashbyfold.example',
        receivesCertificates: true,
        active: true,
      }),
      expect.objectContaining({ name: 'Old buyer', receivesCertificates: false }),
    ])
    const one = await request(app)
      .get(`/api/customers/${res.body.id}`)
      .set('Authorization', operator)
    expect(one.status).toBe(200)
    expect(one.body.contacts).toHaveLength(2)
    const list = await request(app).get('/api/customers').set('Authorization', operator)
    expect(list.body.map((c: { code: string }) => c.code)).toContain('AFWB')

    const events = await auditFor('customer', res.body.id)
    expect(events.map((e) => e.action)).toEqual(['customer.create'])
    for (const contact of res.body.contacts) {
      expect((await auditFor('customer-contact', contact.id)).map((e) => e.action)).toEqual([
        'contact.create',
      ])
    }
  })

  it('refuses a second customer with the same code or the same name in other letters (409)', async () => {
    const sameCode = await request(app)
      .post('/api/customers')
      .set('Authorization', admin)
      .send({ ...ashby, name: 'Other Board', contacts: [] })
    expect(sameCode.status).toBe(409)
    expect(sameCode.body.error.message).toContain('AFWB')
    const sameName = await request(app)
      .post('/api/customers')
      .set('Authorization', admin)
      .send({ ...ashby, name: 'ASHBY FOLD WATER BOARD', code: 'AFWB2', contacts: [] })
    expect(sameName.status).toBe(409)
  })

  it('names the wrong field of a contact (400) and saves nothing', async () => {
    const res = await request(app)
      .post('/api/customers')
      .set('Authorization', admin)
      .send({
        name: 'Broken Contact Co',
        code: 'BCC',
        contacts: [{ name: 'A', email: 'not-an-address' }],
      })
    expect(res.status).toBe(400)
    expect(fieldsOf(res.body)).toContain('body.contacts.0.email')
    const list = await request(app).get('/api/customers').set('Authorization', admin)
    expect(list.body.map((c: { code: string }) => c.code)).not.toContain('BCC')
  })

  it('adds and changes contacts; a partial change keeps the fields it does not name', async () => {
    const created = await request(app)
      .post('/api/customers')
      .set('Authorization', admin)
      .send({ name: 'Calder Utilities', code: 'CAL' })
    const id = created.body.id as number
    const added = await request(app)
      .post(`/api/customers/${id}/contacts`)
      .set('Authorization', admin)
      .send({
        name: 'Site QA',
        email: 'qa@calder.example',
        receivesCertificates: false,
        active: false,
      })
    expect(added.status).toBe(201)
    const contact = added.body.contacts[0]
    expect(contact).toMatchObject({ receivesCertificates: false, active: false })

    const renamed = await request(app)
      .patch(`/api/customers/${id}/contacts/${contact.id}`)
      .set('Authorization', admin)
      .send({ name: 'Site QA office' })
    expect(renamed.status).toBe(200)
    // A rename must not switch a retired contact back on to receive certificates.
    expect(renamed.body.contacts[0]).toMatchObject({
      name: 'Site QA office',
      receivesCertificates: false,
      active: false,
    })
    const last = (await auditFor('customer-contact', contact.id)).at(-1)!
    expect(last).toMatchObject({
      action: 'contact.update',
      before: { name: 'Site QA' },
      after: { name: 'Site QA office' },
    })

    const duplicate = await request(app)
      .post(`/api/customers/${id}/contacts`)
      .set('Authorization', admin)
      .send({ name: 'Again', email: 'QA@calder.example' })
    expect(duplicate.status).toBe(409)
  })

  it("reaches a contact only through its own customer (another company's id is 404)", async () => {
    const a = await request(app)
      .post('/api/customers')
      .set('Authorization', admin)
      .send({
        name: 'Dunmere Water',
        code: 'DUN',
        contacts: [{ name: 'X', email: 'x@dunmere.example' }],
      })
    const b = await request(app)
      .post('/api/customers')
      .set('Authorization', admin)
      .send({ name: 'Elvaston Water', code: 'ELV' })
    const res = await request(app)
      .patch(`/api/customers/${b.body.id}/contacts/${a.body.contacts[0].id}`)
      .set('Authorization', admin)
      .send({ name: 'Hijacked' })
    expect(res.status).toBe(404)
  })

  it('updates a customer and audits before and after; deactivation keeps it readable', async () => {
    const created = await request(app)
      .post('/api/customers')
      .set('Authorization', admin)
      .send({ name: 'Fallow Water', code: 'FAL' })
    const res = await request(app)
      .patch(`/api/customers/${created.body.id}`)
      .set('Authorization', admin)
      .send({ thicknessUnit: 'mil', active: false })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ thicknessUnit: 'mil', active: false, name: 'Fallow Water' })
    const last = (await auditFor('customer', created.body.id)).at(-1)!
    expect(last).toMatchObject({
      action: 'customer.update',
      before: { thicknessUnit: 'um', active: true },
      after: { thicknessUnit: 'mil', active: false },
    })
    expect(
      (await request(app).get(`/api/customers/${created.body.id}`).set('Authorization', operator))
        .status,
    ).toBe(200)
    expect(
      (await request(app).get('/api/customers/999999').set('Authorization', operator)).status,
    ).toBe(404)
  })
})

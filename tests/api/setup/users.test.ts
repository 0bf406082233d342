import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { createUser, tokenFor, TEST_PASSWORD } from '../support/fixtures'
import { Customer, User } from '../../../server/db/models'
import { updateUser } from '../../../server/api/users/users.service'
import { MAX_FAILED_LOGINS } from '../../../server/api/auth/auth.service'
import { auditFor, fieldsOf } from './setupFixtures'

const app = createApp()
const NEW_PASSWORD = 'fresh-start-42'

describe('Setup → People', () => {
  let admin: User
  let auth: string
  beforeAll(async () => {
    admin = await createUser('admin')
    auth = await tokenFor(app, admin)
  })
  const as = () => ({ Authorization: auth })

  it('creates a user who can then sign in; the list shows them without any password hash', async () => {
    const res = await request(app)
      .post('/api/users')
      .set(as())
      .send({
        email: 'New.Operator@Harrowgate.example',
        name: 'New Operator',
        role: 'operator',
        password: NEW_PASSWORD,
      })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      email: 'new.operator@harrowgate.example',
      role: 'operator',
      active: true,
      customerId: null,
    })
    const login = await request(app)
      .post('/api/auth/login')
      .send({ email: 'new.operator@harrowgate.example', password: NEW_PASSWORD })
    expect(login.status).toBe(200)
    const list = await request(app).get('/api/users').set(as())
    expect(list.status).toBe(200)
    expect(list.body.map((u: { email: string }) => u.email)).toContain(
      'new.operator@harrowgate.example',
    )
    expect(JSON.stringify(list.body)).not.toMatch(/passwordHash|\$2[aby]\$/)
    const [created] = await auditFor('user', res.body.id)
    expect(created).toMatchObject({ action: 'user.create', actorId: admin.id, before: null })
    expect(created!.after).toMatchObject({
      email: 'new.operator@harrowgate.example',
      role: 'operator',
    })
    expect(created!.after).not.toHaveProperty('passwordHash')
  })

  it('refuses a second account with the same e-mail, whatever its case (409)', async () => {
    const body = {
      email: 'twice@harrowgate.example',
      name: 'Twice',
      role: 'manager',
      password: NEW_PASSWORD,
    }
    expect((await request(app).post('/api/users').set(as()).send(body)).status).toBe(201)
    const again = await request(app)
      .post('/api/users')
      .set(as())
      .send({ ...body, email: 'TWICE@harrowgate.example' })
    expect(again.status).toBe(409)
    expect(again.body.error.message).toContain('twice@harrowgate.example')
  })

  it('names the field that is wrong (400): e-mail, weak password, customer user without a company', async () => {
    const bad = await request(app)
      .post('/api/users')
      .set(as())
      .send({ email: 'nope', name: '', role: 'operator', password: 'short' })
    expect(bad.status).toBe(400)
    expect(fieldsOf(bad.body)).toEqual(
      expect.arrayContaining(['body.email', 'body.name', 'body.password']),
    )
    const noCompany = await request(app)
      .post('/api/users')
      .set(as())
      .send({ email: 'buyer@x.example', name: 'Buyer', role: 'customer', password: NEW_PASSWORD })
    expect(noCompany.status).toBe(400)
    expect(fieldsOf(noCompany.body)).toContain('body.customerId')
    const unknownCompany = await request(app)
      .post('/api/users')
      .set(as())
      .send({
        email: 'buyer@x.example',
        name: 'Buyer',
        role: 'customer',
        password: NEW_PASSWORD,
        customerId: 999999,
      })
    expect(unknownCompany.status).toBe(400)
    expect(fieldsOf(unknownCompany.body)).toContain('body.customerId')
  })

  it('creates a customer user tied to one company and shows the company name', async () => {
    const company = await Customer.create({ name: 'Fernbank Water Board', code: 'FWB' })
    const res = await request(app)
      .post('/api/users')
      .set(as())
      .send({
        email: 'buyer@fernbank.example',
        name: 'Buyer',
        role: 'customer',
        password: NEW_PASSWORD,
        customerId: company.id,
      })
    expect(res.status).toBe(201)
    expect(res.body).toMatchObject({
      role: 'customer',
      customerId: company.id,
      customerName: 'Fernbank Water Board',
    })
  })

  it('deactivates a user: their session ends and they cannot sign in again', async () => {
    const operator = await createUser('operator')
    const operatorAuth = await tokenFor(app, operator)
    const res = await request(app)
      .patch(`/api/users/${operator.id}`)
      .set(as())
      .send({ active: false })
    expect(res.status).toBe(200)
    expect(res.body.active).toBe(false)
    expect((await request(app).get('/api/auth/me').set('Authorization', operatorAuth)).status).toBe(
      401,
    )
    const login = await request(app)
      .post('/api/auth/login')
      .send({ email: operator.email, password: TEST_PASSWORD })
    expect(login.status).toBe(401)
    const events = await auditFor('user', operator.id)
    expect(events.at(-1)).toMatchObject({
      action: 'user.deactivate',
      before: { active: true },
      after: { active: false },
    })
  })

  it('resets a password: the old token dies, the old password fails, the new one works, a lockout is lifted', async () => {
    const supervisor = await createUser('supervisor')
    const oldAuth = await tokenFor(app, supervisor)
    for (let i = 0; i < MAX_FAILED_LOGINS; i++) {
      await request(app)
        .post('/api/auth/login')
        .send({ email: supervisor.email, password: 'wrong-password-1' })
    }
    expect(
      (
        await request(app)
          .post('/api/auth/login')
          .send({ email: supervisor.email, password: TEST_PASSWORD })
      ).status,
    ).toBe(423)

    const res = await request(app)
      .post(`/api/users/${supervisor.id}/reset-password`)
      .set(as())
      .send({ password: NEW_PASSWORD })
    expect(res.status).toBe(200)
    expect((await request(app).get('/api/auth/me').set('Authorization', oldAuth)).status).toBe(401)
    expect(
      (
        await request(app)
          .post('/api/auth/login')
          .send({ email: supervisor.email, password: TEST_PASSWORD })
      ).status,
    ).toBe(401)
    expect(
      (
        await request(app)
          .post('/api/auth/login')
          .send({ email: supervisor.email, password: NEW_PASSWORD })
      ).status,
    ).toBe(200)
    const last = (await auditFor('user', supervisor.id)).at(-1)!
    expect(last.action).toBe('user.reset-password')
    expect((last.after as { tokenVersion: number }).tokenVersion).toBe(
      (last.before as { tokenVersion: number }).tokenVersion + 1,
    )
    expect(last.after).not.toHaveProperty('passwordHash')

    const weak = await request(app)
      .post(`/api/users/${supervisor.id}/reset-password`)
      .set(as())
      .send({ password: 'abc' })
    expect(weak.status).toBe(400)
    expect(fieldsOf(weak.body)).toContain('body.password')
  })

  it('changes a role and records the before and after', async () => {
    const person = await createUser('operator')
    const res = await request(app)
      .patch(`/api/users/${person.id}`)
      .set(as())
      .send({ role: 'supervisor', name: 'Promoted Person' })
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ role: 'supervisor', name: 'Promoted Person' })
    const last = (await auditFor('user', person.id)).at(-1)!
    expect(last).toMatchObject({ action: 'user.update', actorId: admin.id })
    expect(last.before).toMatchObject({ role: 'operator' })
    expect(last.after).toMatchObject({ role: 'supervisor', name: 'Promoted Person' })
  })

  it('answers 404 for a user that does not exist', async () => {
    expect(
      (await request(app).patch('/api/users/999999').set(as()).send({ name: 'Ghost' })).status,
    ).toBe(404)
  })
})

describe('someone can always administer', () => {
  it('refuses an admin deactivating their own account (409)', async () => {
    const a = await createUser('admin')
    await createUser('admin')
    const res = await request(app)
      .patch(`/api/users/${a.id}`)
      .set('Authorization', await tokenFor(app, a))
      .send({ active: false })
    expect(res.status).toBe(409)
    expect(res.body.error.code).toBe('self_deactivation')
    expect((await User.findByPk(a.id))!.active).toBe(true)
  })

  it('protects the last active admin from demotion and deactivation, and allows it once another admin exists', async () => {
    // Every other admin in this file's database stands down first, so `last` really is the last.
    const last = await createUser('admin')
    await User.update({ active: false }, { where: { role: 'admin' } })
    await User.update({ active: true }, { where: { id: last.id } })
    const lastAuth = await tokenFor(app, last)

    const demote = await request(app)
      .patch(`/api/users/${last.id}`)
      .set('Authorization', lastAuth)
      .send({ role: 'manager' })
    expect(demote.status).toBe(409)
    expect(demote.body.error.code).toBe('last_admin')
    expect(demote.body.error.message).toMatch(/last active administrator/)
    // Deactivating the last admin through the service (any caller, not only the route) is refused too.
    const operator = await createUser('operator')
    await expect(updateUser(operator, last.id, { active: false })).rejects.toMatchObject({
      status: 409,
      code: 'last_admin',
    })
    expect((await User.findByPk(last.id))!.role).toBe('admin')

    await createUser('admin')
    const nowFine = await request(app)
      .patch(`/api/users/${last.id}`)
      .set('Authorization', lastAuth)
      .send({ role: 'manager' })
    expect(nowFine.status).toBe(200)
    expect(nowFine.body.role).toBe('manager')
  })
})

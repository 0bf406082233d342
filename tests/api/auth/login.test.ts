import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import jwt from 'jsonwebtoken'
import { createApp } from '../../../server/app'
import { createUser, TEST_PASSWORD, tokenFor } from '../support/fixtures'
import { User } from '../../../server/db/models'
import { MAX_FAILED_LOGINS } from '../../../server/api/auth/auth.service'

const app = createApp()

describe('sign-in', () => {
  let operator: User
  beforeAll(async () => {
    operator = await createUser('operator')
  })

  it('answers a token and the user for the right password', async () => {
    const res = await request(app).post('/api/auth/login').send({ email: operator.email.toUpperCase(), password: TEST_PASSWORD })
    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ id: operator.id, email: operator.email, role: 'operator' })
    const me = await request(app).get('/api/auth/me').set('Authorization', `Bearer ${res.body.token}`)
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(operator.email)
  })

  it('refuses a wrong password and an unknown e-mail with the same message', async () => {
    const a = await request(app).post('/api/auth/login').send({ email: operator.email, password: 'wrong-password-1' })
    const b = await request(app).post('/api/auth/login').send({ email: 'nobody@test.example', password: 'wrong-password-1' })
    expect(a.status).toBe(401)
    expect(b.status).toBe(401)
    expect(a.body.error.message).toBe(b.body.error.message)
  })

  it('names the field when the body is malformed', async () => {
    const res = await request(app).post('/api/auth/login').send({ email: 'not-an-email', password: '' })
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(res.body.error.details.map((d: { field: string }) => d.field)).toContain('body.email')
  })

  it('answers 400 for malformed JSON, not 500', async () => {
    const res = await request(app).post('/api/auth/login').set('Content-Type', 'application/json').send('{"email":')
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('malformed_json')
  })

  it('locks the account after repeated failures', async () => {
    const victim = await createUser('supervisor')
    for (let i = 0; i < MAX_FAILED_LOGINS; i++) {
      await request(app).post('/api/auth/login').send({ email: victim.email, password: 'wrong-password-1' })
    }
    const res = await request(app).post('/api/auth/login').send({ email: victim.email, password: TEST_PASSWORD })
    expect(res.status).toBe(423)
    expect(res.body.error.message).toMatch(/locked/)
  })
})

describe('tokens', () => {
  it('refuses a missing, tampered, expired, alg:none and deactivated-user token with 401', async () => {
    const user = await createUser('manager')
    const good = await tokenFor(app, user)
    const [head, payload, sig] = good.replace('Bearer ', '').split('.')
    const tampered = `Bearer ${head}.${payload}.${sig!.slice(0, -2)}xx`
    const expired = `Bearer ${jwt.sign({ tv: 0, exp: Math.floor(Date.now() / 1000) - 10 }, process.env.JWT_SECRET!, { subject: String(user.id) })}`
    const none = `Bearer ${Buffer.from('{"alg":"none","typ":"JWT"}').toString('base64url')}.${payload}.`
    for (const auth of [undefined, tampered, expired, none]) {
      const req = request(app).get('/api/auth/me')
      const res = auth ? await req.set('Authorization', auth) : await req
      expect(res.status).toBe(401)
    }
    expect((await request(app).get('/api/auth/me').set('Authorization', good)).status).toBe(200)
    await user.update({ active: false })
    expect((await request(app).get('/api/auth/me').set('Authorization', good)).status).toBe(401)
  })
})

describe('health and unknown routes', () => {
  it('reports the database as ok', async () => {
    const res = await request(app).get('/api/health')
    expect(res.status).toBe(200)
    expect(res.body).toMatchObject({ status: 'ok', db: 'ok' })
  })
  it('answers a JSON 404 for an unknown API route', async () => {
    const res = await request(app).get('/api/no-such-thing')
    expect(res.status).toBe(404)
    expect(res.body.error.code).toBe('not_found')
  })
})

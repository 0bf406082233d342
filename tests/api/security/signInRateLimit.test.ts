import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import type { Express } from 'express'

/**
 * The per-address sign-in limit, set small for this file. env.ts reads LOGIN_RATE_LIMIT once at
 * import; perFileDatabase.ts has already set a roomy default, so this file overrides it and only
 * then imports the app (a static import would be hoisted above the assignment).
 */
const LIMIT = 3
process.env.LOGIN_RATE_LIMIT = String(LIMIT)
const { createApp } = await import('../../../server/app')
const { createUser, TEST_PASSWORD } = await import('../support/fixtures')

describe(`sign-in rate limit: ${LIMIT} failed attempts a minute from one address`, () => {
  let app: Express
  let email: string
  let auth: string
  beforeAll(async () => {
    app = createApp()
    email = (await createUser('operator')).email
    const res = await request(app).post('/api/auth/login').send({ email, password: TEST_PASSWORD })
    auth = `Bearer ${res.body.token}`
  })

  it('a success does not count against the limit', async () => {
    for (let i = 0; i < LIMIT + 2; i++) {
      const res = await request(app)
        .post('/api/auth/login')
        .send({ email, password: TEST_PASSWORD })
      expect(res.status).toBe(200)
    }
  })

  it('the failures up to the limit answer 401, then 429 with a clear message — even for the right password', async () => {
    // Unknown e-mails: the account lockout (per account) plays no part here.
    for (let i = 0; i < LIMIT; i++) {
      const res = await request(app)
        .post('/api/auth/login')
        .send({ email: `nobody${i}@test.example`, password: 'wrong-password-1' })
      expect(res.status).toBe(401)
    }
    const blocked = await request(app)
      .post('/api/auth/login')
      .send({ email: 'nobody@test.example', password: 'wrong-password-1' })
    expect(blocked.status).toBe(429)
    expect(blocked.body.error).toEqual({
      code: 'rate_limited',
      message: 'Too many sign-in attempts from here; wait a minute and try again',
    })
    // draft-8 headers tell a client when to retry.
    expect(blocked.headers['ratelimit-policy']).toMatch(new RegExp(`q=${LIMIT}`))
    const right = await request(app)
      .post('/api/auth/login')
      .send({ email, password: TEST_PASSWORD })
    expect(right.status).toBe(429)
    expect(right.body).not.toHaveProperty('token')
  })

  it('only sign-in is limited: a user signed in before keeps working', async () => {
    const me = await request(app).get('/api/auth/me').set('Authorization', auth)
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(email)
  })
})

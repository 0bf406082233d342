import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import jwt from 'jsonwebtoken'
import { createApp } from '../../../server/app'
import { createUser, tokenFor, TEST_PASSWORD } from '../support/fixtures'
import type { User } from '../../../server/db/models'

/**
 * Tokens beyond tests/api/auth/login.test.ts (which covers missing, tampered, expired, alg:none
 * and a deactivated user set straight in the table): here the admin's own routes end sessions,
 * and tokens forged with the wrong key, algorithm or claims are refused.
 */
const app = createApp()
const secret = process.env.JWT_SECRET!

const me = (auth: string) => request(app).get('/api/auth/me').set('Authorization', auth)

function expectSignedOut(res: request.Response) {
  expect(res.status).toBe(401)
  expect(res.body.error.code).toBe('unauthenticated')
  expect(res.body.error.message).toMatch(/sign in again/i)
}

describe('sessions end when an admin acts', () => {
  let admin: string
  beforeAll(async () => {
    admin = await tokenFor(app, await createUser('admin'))
  })

  it('a password reset signs out every earlier token; the new password signs in', async () => {
    const user = await createUser('operator')
    const before = await tokenFor(app, user)
    expect((await me(before)).status).toBe(200)
    const reset = await request(app)
      .post(`/api/users/${user.id}/reset-password`)
      .set('Authorization', admin)
      .send({ password: 'new-pass-5678' })
    expect(reset.status).toBe(200)
    expectSignedOut(await me(before))
    const old = await request(app)
      .post('/api/auth/login')
      .send({ email: user.email, password: TEST_PASSWORD })
    expect(old.status).toBe(401)
    const fresh = await request(app)
      .post('/api/auth/login')
      .send({ email: user.email, password: 'new-pass-5678' })
    expect(fresh.status).toBe(200)
    expect((await me(`Bearer ${fresh.body.token}`)).status).toBe(200)
  })

  it('deactivating through Setup → People ends the session at once, and sign-in says why', async () => {
    const user = await createUser('supervisor')
    const auth = await tokenFor(app, user)
    const off = await request(app)
      .patch(`/api/users/${user.id}`)
      .set('Authorization', admin)
      .send({ active: false })
    expect(off.status).toBe(200)
    expectSignedOut(await me(auth))
    // Also a write, not just /me: the check is in the one authenticate step.
    const write = await request(app)
      .post('/api/lots')
      .set('Authorization', auth)
      .send({ clientId: 'x' })
    expect(write.status).toBe(401)
    const login = await request(app)
      .post('/api/auth/login')
      .send({ email: user.email, password: TEST_PASSWORD })
    expect(login.status).toBe(401)
    expect(login.body.error.message).toMatch(/deactivated/)
  })
})

describe('forged tokens', () => {
  let user: User
  beforeAll(async () => {
    user = await createUser('admin')
  })
  const claims = () => ({ tv: user.tokenVersion })
  const sign = (key: string, opts: jwt.SignOptions = {}) =>
    `Bearer ${jwt.sign(claims(), key, { subject: String(user.id), expiresIn: 600, ...opts })}`

  it('(control) a token signed like the server signs it is accepted', async () => {
    expect((await me(sign(secret))).status).toBe(200)
  })

  it('signed with another key', async () => {
    expectSignedOut(await me(sign('another-secret-of-forty-characters-long!!')))
  })

  it('HS512 with the right key: only HS256 is accepted', async () => {
    expectSignedOut(await me(sign(secret, { algorithm: 'HS512' })))
  })

  it('for a user who does not exist, or a subject that is no user id at all', async () => {
    // Signed with the right key: only a leaked key makes these, but they must still be a 401.
    for (const subject of ['999999', '99999999999', 'abc', '-1', '1.5']) {
      expectSignedOut(await me(`Bearer ${jwt.sign({ tv: 0 }, secret, { subject })}`))
    }
  })

  it('with a token version other than the user’s', async () => {
    const forged = jwt.sign({ tv: user.tokenVersion + 1 }, secret, { subject: String(user.id) })
    expectSignedOut(await me(`Bearer ${forged}`))
  })

  it('without a subject, or with garbage in place of a token', async () => {
    expectSignedOut(await me(`Bearer ${jwt.sign({ tv: 0 }, secret)}`))
    expectSignedOut(await me('Bearer not.a.token'))
    expectSignedOut(
      await me(`Basic ${Buffer.from(`${user.email}:${TEST_PASSWORD}`).toString('base64')}`),
    )
  })

  it('a valid token in the query string instead of the header', async () => {
    const token = sign(secret).replace('Bearer ', '')
    expectSignedOut(await request(app).get(`/api/auth/me?access_token=${token}`))
  })
})

/**
 * A token whose signature passed is remembered until it expires (server/middleware/verifiedTokens.ts):
 * what was refused before must still be refused after the same user's good token was accepted.
 */
describe('tokens after one was accepted and remembered', () => {
  let user: User
  beforeAll(async () => {
    user = await createUser('operator')
  })

  it('refuses it once it expires, though it was accepted a moment before', async () => {
    const token = jwt.sign({ tv: user.tokenVersion }, secret, {
      subject: String(user.id),
      // exp is whole seconds after a floored iat: 3 leaves at least 2 s of life for the two
      // accepted calls, even on a loaded machine (1 left as little as a few ms; CI saw a 401).
      expiresIn: 3,
    })
    expect((await me(`Bearer ${token}`)).status).toBe(200)
    expect((await me(`Bearer ${token}`)).status).toBe(200)
    const { exp } = jwt.decode(token) as { exp: number }
    await new Promise((r) => setTimeout(r, Math.max(0, exp * 1000 - Date.now()) + 50))
    expectSignedOut(await me(`Bearer ${token}`))
  })

  it('refuses the same token with one character of its signature or payload changed', async () => {
    const token = await tokenFor(app, user)
    expect((await me(token)).status).toBe(200)
    const [head, payload, signature] = token.replace('Bearer ', '').split('.')
    const flip = (s: string, i: number) =>
      s.slice(0, i) + (s[i] === 'A' ? 'B' : 'A') + s.slice(i + 1)
    expectSignedOut(await me(`Bearer ${head}.${payload}.${flip(signature!, 3)}`))
    const otherClaims = Buffer.from(JSON.stringify({ tv: user.tokenVersion, sub: '1' })).toString(
      'base64url',
    )
    expectSignedOut(await me(`Bearer ${head}.${otherClaims}.${signature}`))
  })

  it('refuses it after a deactivation, though its signature is remembered', async () => {
    const token = await tokenFor(app, user)
    expect((await me(token)).status).toBe(200)
    await user.update({ active: false })
    try {
      expectSignedOut(await me(token))
    } finally {
      await user.update({ active: true })
    }
  })
})

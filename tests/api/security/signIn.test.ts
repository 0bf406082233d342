import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { createApp } from '../../../server/app'
import { createUser, tokenFor, TEST_PASSWORD } from '../support/fixtures'
import { LOCK_MINUTES, MAX_FAILED_LOGINS } from '../../../server/api/auth/auth.service'
import { PASSWORD_MIN_LENGTH } from '../../../shared/api/auth'
import { User } from '../../../server/db/models'
import { sequelize } from '../../../server/db'

/** Lockout and password policy (the per-address rate limit is in signInRateLimit.test.ts). */
const app = createApp()

const login = (email: string, password: string) =>
  request(app).post('/api/auth/login').send({ email, password })

async function failTimes(email: string, times: number) {
  for (let i = 0; i < times; i++) {
    const res = await login(email, `wrong-password-${i}`)
    expect(res.status).toBe(401)
  }
}

describe('account lockout', () => {
  let admin: string
  beforeAll(async () => {
    admin = await tokenFor(app, await createUser('admin'))
  })

  it(`one failure short of ${MAX_FAILED_LOGINS} still signs in, and a success clears the count`, async () => {
    const user = await createUser('operator')
    await failTimes(user.email, MAX_FAILED_LOGINS - 1)
    expect((await login(user.email, TEST_PASSWORD)).status).toBe(200)
    // The count started again: another MAX−1 failures do not lock either.
    await failTimes(user.email, MAX_FAILED_LOGINS - 1)
    expect((await login(user.email, TEST_PASSWORD)).status).toBe(200)
  })

  it(`after ${MAX_FAILED_LOGINS} failures even the right password waits, and the answer says for how long`, async () => {
    const user = await createUser('manager')
    await failTimes(user.email, MAX_FAILED_LOGINS)
    const res = await login(user.email, TEST_PASSWORD)
    expect(res.status).toBe(423)
    expect(res.body.error.code).toBe('account_locked')
    expect(res.body.error.message).toContain(`locked for ${LOCK_MINUTES} more minute(s)`)
    expect(res.body).not.toHaveProperty('token')
    const row = await User.findByPk(user.id)
    const lockedMinutes = (row!.lockedUntil!.getTime() - Date.now()) / 60000
    expect(lockedMinutes).toBeGreaterThan(LOCK_MINUTES - 1)
    expect(lockedMinutes).toBeLessThanOrEqual(LOCK_MINUTES)
  })

  it('an address with no account is answered exactly as a real one: the lock does not tell them apart', async () => {
    const real = await createUser('operator')
    const unknown = `nobody-${real.id}@harrowgate.example`
    const answers = async (email: string, times: number) => {
      const out: { status: number; body: unknown }[] = []
      for (let i = 0; i < times; i++) {
        const res = await login(email, `wrong-password-${i}`)
        out.push({ status: res.status, body: res.body })
      }
      return out
    }
    const realAnswers = await answers(real.email, MAX_FAILED_LOGINS + 1)
    expect(realAnswers.map((a) => a.status)).toEqual([
      ...Array<number>(MAX_FAILED_LOGINS).fill(401),
      423,
    ])
    expect(await answers(unknown, MAX_FAILED_LOGINS + 1)).toEqual(realAnswers)
    // Once both locks have run out, the count starts again from nothing for both.
    await sequelize.query(
      "UPDATE users SET locked_until = now() - interval '1 minute' WHERE id = $1",
      {
        bind: [real.id],
      },
    )
    await sequelize.query(
      "UPDATE sign_in_failures_unknown SET locked_until = now() - interval '1 minute' WHERE email = $1",
      { bind: [unknown] },
    )
    const again = await answers(real.email, MAX_FAILED_LOGINS + 1)
    expect(again).toEqual(realAnswers)
    expect(await answers(unknown, MAX_FAILED_LOGINS + 1)).toEqual(again)
  })

  it('a locked account with the right password answers the same 423 as with a wrong one', async () => {
    const user = await createUser('operator')
    await failTimes(user.email, MAX_FAILED_LOGINS)
    const right = await login(user.email, TEST_PASSWORD)
    const wrong = await login(user.email, 'wrong-password-x')
    expect(right.status).toBe(423)
    expect(right.body).toEqual(wrong.body)
  })

  it("another account's failures do not lock this one", async () => {
    const victim = await createUser('supervisor')
    const other = await createUser('supervisor')
    await failTimes(other.email, MAX_FAILED_LOGINS)
    expect((await login(victim.email, TEST_PASSWORD)).status).toBe(200)
  })

  it('an admin password reset lifts the lock', async () => {
    const user = await createUser('operator')
    await failTimes(user.email, MAX_FAILED_LOGINS)
    expect((await login(user.email, TEST_PASSWORD)).status).toBe(423)
    const reset = await request(app)
      .post(`/api/users/${user.id}/reset-password`)
      .set('Authorization', admin)
      .send({ password: 'fresh-start-42' })
    expect(reset.status).toBe(200)
    expect((await login(user.email, 'fresh-start-42')).status).toBe(200)
  })
})

describe('password policy, with a message that says what to do', () => {
  let admin: string
  let target: User
  beforeAll(async () => {
    admin = await tokenFor(app, await createUser('admin'))
    target = await createUser('operator')
  })

  const tooShort = 'abc1234'.padEnd(PASSWORD_MIN_LENGTH - 1, 'x')
  const cases = [
    { password: tooShort, message: `Use at least ${PASSWORD_MIN_LENGTH} characters` },
    { password: 'onlyletterspassword', message: 'Use letters and at least one digit' },
    { password: '12345678901234', message: 'Use letters and at least one digit' },
    { password: `a1${'x'.repeat(199)}`, message: 'Use at most 200 characters' },
  ]

  it('creating a user refuses a weak password, naming the field', async () => {
    for (const { password, message } of cases) {
      const res = await request(app)
        .post('/api/users')
        .set('Authorization', admin)
        .send({
          email: `p${password.length}@policy.example`,
          name: 'New Op',
          role: 'operator',
          password,
        })
      expect(res.status, password).toBe(400)
      expect(res.body.error.code).toBe('invalid_input')
      expect(res.body.error.message).toBe(`body.password: ${message}`)
      expect(res.body.error.details).toContainEqual({ field: 'body.password', message })
    }
    expect(await User.count({ where: { name: 'New Op' } })).toBe(0)
  })

  it('a reset refuses a weak password and leaves the old one working', async () => {
    for (const { password, message } of cases) {
      const res = await request(app)
        .post(`/api/users/${target.id}/reset-password`)
        .set('Authorization', admin)
        .send({ password })
      expect(res.status, password).toBe(400)
      expect(res.body.error.message).toBe(`body.password: ${message}`)
    }
    expect((await login(target.email, TEST_PASSWORD)).status).toBe(200)
  })

  it(`(control) ${PASSWORD_MIN_LENGTH} characters with letters and a digit are accepted`, async () => {
    const res = await request(app).post('/api/users').set('Authorization', admin).send({
      email: 'ok@policy.example',
      name: 'Policy Ok',
      role: 'operator',
      password: 'abcdefghi1',
    })
    expect(res.status).toBe(201)
    expect(res.body).not.toHaveProperty('passwordHash')
    expect(JSON.stringify(res.body)).not.toContain('abcdefghi1')
    expect((await login('ok@policy.example', 'abcdefghi1')).status).toBe(200)
  })
})

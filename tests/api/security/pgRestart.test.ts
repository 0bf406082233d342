import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import request from 'supertest'
import pg from 'pg'
import { execFileSync } from 'node:child_process'
import { createServer } from 'node:net'
import type { Express } from 'express'
import { ThrowawayCluster } from './throwawayCluster'

/**
 * PostgreSQL restarts under a running app (issue 8 §3): /api/health answers 503 with the reason
 * during the outage, API calls answer 503 (nothing was saved), and afterwards the same app serves
 * again without being restarted. On a cluster of this file's own; the app is imported after
 * DATABASE_URL points at it (static imports would be hoisted above the assignment).
 */
function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer()
    s.once('error', reject)
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number }
      s.close(() => resolve(port))
    })
  })
}

const cluster = new ThrowawayCluster(await freePort())
try {
  cluster.init()
  cluster.start()
  const admin = new pg.Client({ connectionString: cluster.url() })
  await admin.connect()
  await admin.query('CREATE DATABASE filmtrail_fault')
  await admin.end()
  process.env.DATABASE_URL = cluster.url('filmtrail_fault')
  execFileSync('npx', ['tsx', 'server/cli/migrate.ts'], {
    cwd: new URL('../../../', import.meta.url).pathname,
    env: { ...process.env },
    stdio: 'pipe',
  })
} catch (err) {
  cluster.destroy()
  throw err
}
const { createApp } = await import('../../../server/app')
const { sequelize } = await import('../../../server/db')
const { createUser, tokenFor } = await import('../support/fixtures')

/** Polls until `ok` holds or the time is up; answers the last response and the seconds it took. */
async function until(
  app: Express,
  path: string,
  auth: string,
  ok: (s: number) => boolean,
  seconds: number,
) {
  const started = Date.now()
  let res: request.Response
  do {
    res = await request(app).get(path).set('Authorization', auth)
    if (ok(res.status)) break
    await new Promise((r) => setTimeout(r, 200))
  } while (Date.now() - started < seconds * 1000)
  return { res, seconds: (Date.now() - started) / 1000 }
}

describe('PostgreSQL restarted while the app runs', () => {
  let app: Express
  let auth: string
  beforeAll(async () => {
    app = createApp()
    auth = await tokenFor(app, await createUser('supervisor'))
  })
  afterAll(async () => {
    cluster.thaw()
    await sequelize.close().catch(() => undefined)
    cluster.destroy()
  })

  it('health 503 with a reason during the outage, then serving again — same app, no restart', async () => {
    const up = await request(app).get('/api/health')
    expect(up.status).toBe(200)
    expect(up.body).toEqual({ status: 'ok', db: 'ok' })
    expect((await request(app).get('/api/lots').set('Authorization', auth)).status).toBe(200)

    cluster.stop()
    const down = await until(app, '/api/health', '', (s) => s === 503, 5)
    expect(down.res.status).toBe(503)
    expect(down.res.body).toMatchObject({ status: 'degraded', db: 'unreachable' })
    expect(down.res.body.reason).toEqual(expect.any(String))
    expect(down.seconds).toBeLessThan(5)
    // Answers quickly, every time, while the database is away.
    const started = Date.now()
    expect((await request(app).get('/api/health')).status).toBe(503)
    expect(Date.now() - started).toBeLessThan(3000)
    // An ordinary API call says the database is away and nothing was saved — not a bare 500.
    const write = await request(app)
      .patch('/api/auth/me/preferences')
      .set('Authorization', auth)
      .send({ thicknessUnit: 'mil' })
    expect(write.status).toBe(503)
    expect(write.body.error).toMatchObject({ code: 'database_unavailable' })
    expect(write.body.error.message).toMatch(/nothing was saved/)

    cluster.start()
    const back = await until(app, '/api/health', '', (s) => s === 200, 15)
    expect(back.res.status).toBe(200)
    expect(back.res.body).toEqual({ status: 'ok', db: 'ok' })
    const lots = await request(app).get('/api/lots').set('Authorization', auth)
    expect(lots.status).toBe(200)
    const saved = await request(app)
      .patch('/api/auth/me/preferences')
      .set('Authorization', auth)
      .send({ thicknessUnit: 'mil' })
    expect(saved.status).toBe(200)
    expect(saved.body.user.thicknessUnit).toBe('mil')
  }, 60_000)

  it('a frozen database (connections hang, nothing answers): health still answers 503 within a few seconds', async () => {
    expect((await request(app).get('/api/health')).status).toBe(200)
    cluster.freeze()
    // Thawed on a timer too, so a hanging request cannot leave the cluster frozen.
    const thawLater = setTimeout(() => cluster.thaw(), 8000)
    try {
      const started = Date.now()
      const res = await request(app).get('/api/health')
      const seconds = (Date.now() - started) / 1000
      expect(res.status).toBe(503)
      expect(res.body).toMatchObject({ status: 'degraded', db: 'unreachable' })
      expect(res.body.reason).toBe('PostgreSQL did not answer within 2 s')
      expect(seconds).toBeLessThan(4)
    } finally {
      clearTimeout(thawLater)
      cluster.thaw()
    }
    const back = await until(app, '/api/health', '', (s) => s === 200, 20)
    expect(back.res.status).toBe(200)
    expect((await request(app).get('/api/lots').set('Authorization', auth)).status).toBe(200)
  }, 60_000)
})

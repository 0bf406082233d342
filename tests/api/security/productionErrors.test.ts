import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import express from 'express'
import type { Express } from 'express'

/**
 * Error bodies as production answers them. env.ts reads NODE_ENV once at import, so this file
 * sets it before importing the app (a static import would be hoisted above the assignment).
 * LOG_LEVEL=silent: the 500s below are logged by design, and this test is not about the log.
 */
process.env.NODE_ENV = 'production'
process.env.LOG_LEVEL = 'silent'
const { env } = await import('../../../server/config/env')
const { createApp } = await import('../../../server/app')
const { errorHandler } = await import('../../../server/middleware/errorHandler')
const { sequelize } = await import('../../../server/db')
const { createUser, tokenFor } = await import('../support/fixtures')

const INTERNAL_MESSAGE =
  'Something went wrong on the server; nothing was saved. Try again, and tell an admin if it repeats.'

function expectNoInternals(res: request.Response, ...secrets: string[]) {
  expect(res.status).toBe(500)
  expect(res.body).toEqual({ error: { code: 'internal', message: INTERNAL_MESSAGE } })
  for (const s of [...secrets, 'stack', '.ts:', 'node_modules']) {
    expect(res.text).not.toContain(s)
  }
  expect(res.text).not.toMatch(/\bat .+:\d+:\d+/) // a stack frame
}

describe('production error bodies carry no stack and no internals', () => {
  let app: Express
  let auth: string
  beforeAll(async () => {
    expect(env.NODE_ENV).toBe('production')
    app = createApp()
    auth = await tokenFor(app, await createUser('admin'))
  })

  it('a plain Error thrown by a handler (the real error middleware on a small app)', async () => {
    const tiny = express()
    tiny.get('/boom', () => {
      throw new Error('secret detail: pool exhausted at db-7')
    })
    tiny.use(errorHandler)
    expectNoInternals(await request(tiny).get('/boom'), 'secret detail', 'db-7')
  })

  it('a real database failure in a real route (this file’s own database loses a table)', async () => {
    const ok = await request(app).get('/api/defect-types').set('Authorization', auth)
    expect(ok.status).toBe(200)
    // A broken schema: the query fails inside PostgreSQL, as it would after a bad manual change.
    await sequelize.query('ALTER TABLE defect_types RENAME TO defect_types_gone')
    try {
      const res = await request(app).get('/api/defect-types').set('Authorization', auth)
      expectNoInternals(res, 'defect_types', 'relation', 'SELECT')
    } finally {
      await sequelize.query('ALTER TABLE defect_types_gone RENAME TO defect_types')
    }
  })

  it('a value PostgreSQL refuses (beyond int4, no such date) is a 400 even where a schema missed it', async () => {
    const tiny = express()
    tiny.get('/int', async () => sequelize.query('SELECT 2147483648::int4'))
    tiny.get('/date', async () => sequelize.query("SELECT '2026-02-30'::date"))
    tiny.use(errorHandler)
    for (const path of ['/int', '/date']) {
      const res = await request(tiny).get(path)
      expect(res.status, path).toBe(400)
      expect(res.body.error.code).toBe('invalid_input')
      expect(res.body.error.message).toMatch(/out of range here/)
      expect(res.text).not.toMatch(/SELECT|int4|::/)
    }
  })

  it('4xx answers stay as helpful as in development', async () => {
    const res = await request(app).post('/api/users').set('Authorization', auth).send({})
    expect(res.status).toBe(400)
    expect(res.body.error.code).toBe('invalid_input')
    expect(res.body.error.details.length).toBeGreaterThan(0)
    expect(res.body.error).not.toHaveProperty('stack')
  })
})

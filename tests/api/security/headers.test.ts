import { describe, it, expect, beforeAll } from 'vitest'
import request from 'supertest'
import { existsSync } from 'node:fs'
import { createApp } from '../../../server/app'
import { env } from '../../../server/config/env'
import { createUser, tokenFor } from '../support/fixtures'

const app = createApp()

/** CSP directives as a map: "script-src" → ["'self'"]. */
function csp(header: string | undefined): Record<string, string[]> {
  const out: Record<string, string[]> = {}
  for (const part of (header ?? '').split(';')) {
    const [name, ...values] = part.trim().split(/\s+/)
    if (name) out[name] = values
  }
  return out
}

function expectHardened(res: request.Response) {
  const h = res.headers
  const policy = csp(h['content-security-policy'])
  expect(policy['default-src']).toEqual(["'self'"])
  // Scripts only from the app's own files: no inline script, no eval, no CDN.
  expect(policy['script-src']).toEqual(["'self'"])
  expect(policy['script-src-attr']).toEqual(["'none'"])
  expect(policy['object-src']).toEqual(["'none'"])
  // Nothing comes from a CDN: fonts are bundled (npm @fontsource), so no https: source either.
  for (const sources of Object.values(policy)) {
    expect(sources.filter((s) => s === 'https:' || s === '*' || s.startsWith('http'))).toEqual([])
  }
  expect(policy['frame-ancestors']).toEqual(["'self'"])
  expect(h['x-frame-options']).toBe('SAMEORIGIN')
  expect(h['x-content-type-options']).toBe('nosniff')
  expect(h['referrer-policy']).toBe('no-referrer')
  expect(h['cross-origin-opener-policy']).toBe('same-origin')
  expect(h).not.toHaveProperty('x-powered-by')
}

describe('security headers (helmet) on every kind of answer', () => {
  let auth: string
  beforeAll(async () => {
    auth = await tokenFor(app, await createUser('supervisor'))
  })

  it('a JSON answer, a 401, an unknown API route and a malformed body', async () => {
    const answers = [
      await request(app).get('/api/health'),
      await request(app).get('/api/lots'),
      await request(app).get('/api/lots').set('Authorization', auth),
      await request(app).get('/api/no-such-route'),
      await request(app)
        .post('/api/auth/login')
        .set('Content-Type', 'application/json')
        .send('{"email":'),
    ]
    expect(answers.map((r) => r.status)).toEqual([200, 401, 200, 404, 400])
    for (const res of answers) {
      expectHardened(res)
      expect(res.headers['content-type']).toMatch(/^application\/json/)
    }
  })

  it.runIf(existsSync(env.CLIENT_DIST))('the client shell and its files', async () => {
    const shell = await request(app).get('/lots')
    expect(shell.status).toBe(200)
    expect(shell.headers['content-type']).toMatch(/^text\/html/)
    expectHardened(shell)
    const script = /src="(\/assets\/[^"]+\.js)"/.exec(shell.text)?.[1]
    expect(script).toBeTruthy()
    const js = await request(app).get(script!)
    expect(js.status).toBe(200)
    expectHardened(js)
  })

  it('the CSV export answers as a download, not a page', async () => {
    const res = await request(app).get('/api/trends/export.csv').set('Authorization', auth)
    expect(res.status).toBe(200)
    expect(res.headers['content-type']).toMatch(/^text\/csv/)
    expect(res.headers['content-disposition']).toMatch(/^attachment/)
    expectHardened(res)
  })
})

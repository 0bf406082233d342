/**
 * `DATABASE_URL=… node --import tsx [--cpu-prof] scripts/bench/readingsProbe.ts [--requests 400]`
 *
 * Not part of npm run bench: a look inside one readings POST. The real app runs in this process
 * (NODE_ENV=production, LOG_LEVEL=warn) on a database filled as the bench fills it; requests go
 * one at a time, so each one's SQL statements are counted exactly (every pg round trip, Sequelize's
 * included, transaction control too) and a --cpu-prof profile shows only this path.
 */
import { randomBytes } from 'node:crypto'
import type { AddressInfo } from 'node:net'
import { parseArgs } from 'node:util'
import pg from 'pg'

const { values } = parseArgs({ options: { requests: { type: 'string', default: '400' } } })
Object.assign(process.env, {
  NODE_ENV: 'production',
  LOG_LEVEL: process.env.LOG_LEVEL ?? 'warn',
  JWT_SECRET: randomBytes(32).toString('hex'),
  LOGIN_RATE_LIMIT: '1000',
})
const url = process.env.DATABASE_URL
if (!url) throw new Error('Set DATABASE_URL')

const statements: string[] = []
const clientQuery = pg.Client.prototype.query as (...a: unknown[]) => unknown
pg.Client.prototype.query = function (this: pg.Client, ...a: unknown[]) {
  const q = a[0] as string | { text?: string }
  statements.push(
    (typeof q === 'string' ? q : (q.text ?? '')).trim().split(/\s+/).slice(0, 4).join(' '),
  )
  return clientQuery.apply(this, a)
} as typeof pg.Client.prototype.query

const { prepareDatabase, signIn, openLotsForReadings } = await import('./prepare')
const { readingRequests } = await import('./readings')
const { createApp } = await import('../../server/app')
const { sequelize } = await import('../../server/db')
await prepareDatabase(url)
const server = createApp().listen(0, '127.0.0.1')
await new Promise((r) => server.once('listening', r))
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`
try {
  const auth = await signIn(base, 'operator@harrowgate.example')
  const targets = await openLotsForReadings(base, url, auth, 1, 200)
  const next = readingRequests(targets)
  const n = Number(values.requests)
  const ms: number[] = []
  let perRequest: string[] = []
  for (let i = 0; i < n + 20; i++) {
    const { path, body } = next()
    statements.length = 0
    const t0 = performance.now()
    const res = await fetch(base + path, {
      method: 'POST',
      headers: { 'content-type': 'application/json', authorization: auth },
      body,
    })
    await res.arrayBuffer()
    if (res.status !== 201) throw new Error(`${path}: ${res.status}`)
    if (i >= 20) ms.push(performance.now() - t0)
    perRequest = [...statements]
  }
  ms.sort((a, b) => a - b)
  console.log(
    `${n} sequential readings POSTs: median ${ms[n >> 1]!.toFixed(2)} ms, p95 ${ms[Math.ceil(n * 0.95) - 1]!.toFixed(2)} ms`,
  )
  console.log(
    `SQL statements in the last request (pipelined pairs share one round trip): ${perRequest.length}`,
  )
  for (const s of perRequest) console.log(`  ${s}`)
} finally {
  server.close()
  await sequelize.close()
}

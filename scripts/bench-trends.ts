/**
 * `DATABASE_URL=… npx tsx scripts/bench-trends.ts [--runs 40]`
 *
 * Times the Line health requests over HTTP against the real app (in this process, on a free
 * loopback port), signed in as the demo plant manager, on a database filled by
 * scripts/generate-history.ts. Prints p50 / p95 / max per request; the target is p95 ≤ 150 ms.
 * No assertion: a slow machine should not fail a build, it should be looked at.
 */
import { randomBytes } from 'node:crypto'
import type { AddressInfo } from 'node:net'
import { loadavg } from 'node:os'
import { parseArgs } from 'node:util'
import { QueryTypes } from 'sequelize'

const { values } = parseArgs({ options: { runs: { type: 'string', default: '40' } } })
const runs = Number(values.runs)
process.env.JWT_SECRET ??= randomBytes(32).toString('hex')
process.env.LOG_LEVEL ??= 'warn'
process.env.NODE_ENV ??= 'test'

const { createApp } = await import('../server/app')
const { sequelize } = await import('../server/db')
const { DEMO_PASSWORD } = await import('../server/db/seeders/demoPassword')

const server = createApp().listen(0, '127.0.0.1')
await new Promise((r) => server.once('listening', r))
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`

try {
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email: 'manager@harrowgate.example', password: DEMO_PASSWORD }),
  })
  if (!login.ok) throw new Error(`sign-in failed: ${login.status} ${await login.text()}`)
  const auth = { Authorization: `Bearer ${((await login.json()) as { token: string }).token}` }

  const today = new Date().toISOString().slice(0, 10)
  const yearAgo = new Date(Date.now() - 364 * 86_400_000).toISOString().slice(0, 10)
  const year = `from=${yearAgo}&to=${today}`
  const cases: [string, string][] = [
    ['default (13 weeks)', '/api/trends'],
    ['one year, all lines', `/api/trends?${year}`],
    ['one year, FBE line, night shift', `/api/trends?${year}&line=fbe-powder&shift=3`],
    ['one year, family VB', `/api/trends?${year}&family=VB`],
    ['filter options, one year', `/api/trends/options?${year}`],
  ]
  const first = (await (await fetch(`${base}/api/trends?${year}`, { headers: auth })).json()) as {
    totals: { inspected: number }
    specChoices: { specId: number; code: string }[]
  }
  const second = first.specChoices[1]
  if (second)
    cases.push([`one year, spec ${second.code}`, `/api/trends?${year}&specId=${second.specId}`])
  console.log(
    `Parts inspected in the last year: ${first.totals.inspected}; ${runs} runs per request.`,
  )
  // A fixed CPU-bound query, to compare runs on a busy machine with runs on a quiet one.
  const r0 = performance.now()
  await sequelize.query('SELECT count(*) FROM generate_series(1, 1000000)', {
    type: QueryTypes.SELECT,
  })
  const refMs = performance.now() - r0
  console.log(
    `Reference (count of a 1,000,000-row generate_series): ${refMs.toFixed(0)} ms; load ${loadavg()
      .map((l) => l.toFixed(1))
      .join(' ')}`,
  )

  for (const [label, path] of cases) {
    const ms: number[] = []
    for (let i = 0; i < runs + 3; i++) {
      const t0 = performance.now()
      const res = await fetch(base + path, { headers: auth })
      await res.arrayBuffer()
      if (!res.ok) throw new Error(`${path}: ${res.status}`)
      if (i >= 3) ms.push(performance.now() - t0) // the first three warm the caches
    }
    ms.sort((a, b) => a - b)
    const q = (p: number) => ms[Math.min(ms.length - 1, Math.ceil(p * ms.length) - 1)]!.toFixed(1)
    console.log(
      `  ${label.padEnd(34)} p50 ${q(0.5).padStart(6)} ms  p95 ${q(0.95).padStart(6)} ms  max ${q(1).padStart(6)} ms`,
    )
  }
  const t0 = performance.now()
  const csv = await fetch(`${base}/api/trends/export.csv?${year}`, { headers: auth })
  const bytes = (await csv.arrayBuffer()).byteLength
  console.log(
    `  CSV export, one year: ${(bytes / 1e6).toFixed(1)} MB in ${(performance.now() - t0).toFixed(0)} ms`,
  )
} finally {
  server.close()
  await sequelize.close()
}

/**
 * trends_p95_ms: the main Line health request (GET /api/trends, the page's default filter: the
 * last 13 weeks, every line and shift) over HTTP against the real server, on the large history.
 * trends_ratio_vs_raw_sql: that p95 ÷ the p95 of the very same SQL sent straight through pg.
 *
 * "The same SQL" is captured, not retyped: the product's own trendsReport() runs once in this
 * process with sequelize.query watched, which records every statement with its bind values and
 * which statements had finished before it started. The replay keeps that order and overlap (the
 * summary and the Pareto in parallel, the thickness section after the summary) on a pg pool of
 * the server's size, with work_mem set as the product sets it. HTTP and raw runs alternate, so a
 * burst of load from elsewhere on the machine hits both alike.
 */
import { QueryTypes } from 'sequelize'
import pg from 'pg'
import { percentile } from './load'

interface Captured {
  sql: string
  bind: unknown[]
  /** Indexes of the statements that had completed before this one started. */
  after: number[]
}

async function captureTrendsSql(): Promise<Captured[]> {
  const { sequelize } = await import('../../server/db')
  const { trendsReport } = await import('../../server/api/trends/trends.service')
  const { trendsFilterSchema } = await import('../../shared/api/trends')
  const captured: Captured[] = []
  const done: number[] = []
  const original = sequelize.query.bind(sequelize)
  const watched = async (sql: unknown, options?: { bind?: unknown[]; type?: string }) => {
    const text = typeof sql === 'string' ? sql : String((sql as { query?: string }).query ?? sql)
    // The work_mem setting and transaction control are the session set-up, not the report's SQL.
    const isReport = options?.type === QueryTypes.SELECT && !/^\s*SET\b/i.test(text)
    const index = isReport
      ? captured.push({ sql: text, bind: options?.bind ?? [], after: [...done] }) - 1
      : -1
    try {
      return await (original as (s: unknown, o?: unknown) => Promise<unknown>)(sql, options)
    } finally {
      if (index >= 0) done.push(index)
    }
  }
  ;(sequelize as unknown as { query: unknown }).query = watched
  try {
    await trendsReport(trendsFilterSchema.parse({}))
  } finally {
    ;(sequelize as unknown as { query: unknown }).query = original
    await sequelize.close()
  }
  if (captured.length === 0) throw new Error('trendsReport ran no SQL: nothing to compare with')
  return captured
}

let captured: Promise<Captured[]> | null = null

async function replay(pool: pg.Pool, statements: Captured[]) {
  const finished = statements.map(() => {
    let resolve!: () => void
    const p = new Promise<void>((r) => (resolve = r))
    return { p, resolve }
  })
  await Promise.all(
    statements.map(async (s, i) => {
      await Promise.all(s.after.map((j) => finished[j]!.p))
      await pool.query(s.sql, s.bind)
      finished[i]!.resolve()
    }),
  )
}

export interface TrendsResult {
  httpP95Ms: number
  rawP95Ms: number
  httpP50Ms: number
  rawP50Ms: number
  statements: number
  inspected: number
}

export async function measureTrends(
  base: string,
  auth: string,
  databaseUrl: string,
  runs: number,
  poolMax: number,
): Promise<TrendsResult> {
  captured ??= captureTrendsSql() // once per bench: the product's SQL does not change between runs
  const statements = await captured
  const pool = new pg.Pool({
    connectionString: databaseUrl,
    max: poolMax,
    options: '-c work_mem=32MB',
  })
  const http: number[] = []
  const raw: number[] = []
  let inspected = 0
  try {
    for (let i = 0; i < runs + 3; i++) {
      const t0 = performance.now()
      const res = await fetch(`${base}/api/trends`, { headers: { authorization: auth } })
      // timed to the last byte received; the bench's own JSON parse is not the server's time
      const bytes = await res.arrayBuffer()
      const t1 = performance.now()
      if (!res.ok) throw new Error(`GET /api/trends answered ${res.status}`)
      const body = JSON.parse(new TextDecoder().decode(bytes)) as { totals: { inspected: number } }
      const r0 = performance.now()
      await replay(pool, statements)
      const t2 = performance.now()
      inspected = body.totals.inspected
      if (i < 3) continue // the first three warm the caches on both sides
      http.push(t1 - t0)
      raw.push(t2 - r0)
    }
  } finally {
    await pool.end()
  }
  http.sort((a, b) => a - b)
  raw.sort((a, b) => a - b)
  return {
    httpP95Ms: percentile(http, 0.95),
    rawP95Ms: percentile(raw, 0.95),
    httpP50Ms: percentile(http, 0.5),
    rawP50Ms: percentile(raw, 0.5),
    statements: statements.length,
    inspected,
  }
}

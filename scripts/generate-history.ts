/**
 * `npm run history:generate -- [--parts 52000] [--weeks 52] [--readings 20] [--seed 7]`
 *
 * Writes a large invented history for Harrowgate Flow Works into the database named by
 * DATABASE_URL (migrated and demo-seeded first, so the specs, customers, people and gauges it
 * refers to exist): ≥ 50,000 parts and ≥ 1,000,000 gauge readings by default, generated in SQL.
 * For measuring (scripts/bench-trends.ts), not for a plant's real database: it refuses
 * NODE_ENV=production. Runs again on the same database add another history (new lot numbers).
 */
import { randomBytes } from 'node:crypto'
import { parseArgs } from 'node:util'
import pg from 'pg'
import { historySteps } from './history/historySql'

const { values } = parseArgs({
  options: {
    parts: { type: 'string', default: '52000' },
    weeks: { type: 'string', default: '52' },
    readings: { type: 'string', default: '20' },
    seed: { type: 'string', default: '7' },
    'skip-seed': { type: 'boolean', default: false },
  },
})
const parts = Number(values.parts)
const weeks = Number(values.weeks)
const readingsPerPart = Number(values.readings)
const seed = Number(values.seed)
for (const [name, v, min] of [
  ['parts', parts, 1],
  ['weeks', weeks, 1],
  ['readings', readingsPerPart, 3],
] as const) {
  if (!Number.isInteger(v) || v < min) throw new Error(`--${name} must be a whole number ≥ ${min}`)
}
if (process.env.NODE_ENV === 'production') {
  console.error('Refusing to write invented history into a production database.')
  process.exit(1)
}
const url = process.env.DATABASE_URL
if (!url) {
  console.error(
    'Set DATABASE_URL to the database to fill (e.g. a throwaway one on 127.0.0.1:54339).',
  )
  process.exit(1)
}

// The server's config wants a JWT secret even though nothing here signs anything.
process.env.JWT_SECRET ??= randomBytes(32).toString('hex')
process.env.LOG_LEVEL ??= 'warn'

const started = Date.now()
const seconds = (from: number) => ((Date.now() - from) / 1000).toFixed(1)

if (!values['skip-seed']) {
  const { sequelize } = await import('../server/db')
  const { migrateUp } = await import('../server/db/migrate')
  const { runSeed } = await import('../server/db/seeders')
  await migrateUp(sequelize)
  await runSeed()
  await sequelize.close()
  console.log(`migrations and demo seed: ${seconds(started)} s`)
}

const client = new pg.Client({ connectionString: url })
await client.connect()
try {
  // Deterministic with --seed: one process, no parallel workers drawing random() in another order.
  await client.query('SET max_parallel_workers_per_gather = 0')
  await client.query("SET work_mem = '64MB'")
  // Bulk load into a throwaway database: skip the per-row foreign-key triggers (every id written
  // here comes from rows inserted or looked up in the same transaction). Needs a superuser;
  // without one the load is simply slower.
  await client.query('SET session_replication_role = replica').catch(() => {
    console.log('  (not a superuser: foreign keys checked row by row, slower)')
  })
  const tag = `G${randomBytes(2).toString('hex').toUpperCase()}`
  await client.query('BEGIN')
  for (const step of historySteps({ parts, weeks, readingsPerPart, seed, tag })) {
    const t0 = Date.now()
    await client.query(step.sql)
    console.log(`  ${step.label.padEnd(26)} ${seconds(t0).padStart(6)} s`)
  }
  await client.query('COMMIT')
  const t0 = Date.now()
  // VACUUM marks the new pages all-visible, so the trend queries can use index-only scans.
  for (const table of [
    'lots',
    'parts',
    'gauge_readings',
    'section_records',
    'nonconformance_parts',
  ])
    await client.query(`VACUUM ANALYZE ${table}`)
  console.log(`  ${'vacuum analyze'.padEnd(26)} ${seconds(t0).padStart(6)} s`)
  const { rows } = await client.query<{ what: string; n: string }>(`
    SELECT 'lots' AS what, count(*)::text AS n FROM lots WHERE lot_number LIKE '%-${tag}%'
    UNION ALL SELECT 'parts', count(*)::text FROM parts p JOIN lots l ON l.id = p.lot_id WHERE l.lot_number LIKE '%-${tag}%'
    UNION ALL SELECT 'gauge readings', count(*)::text FROM gauge_readings r JOIN lots l ON l.id = r.lot_id WHERE l.lot_number LIKE '%-${tag}%'
    UNION ALL SELECT 'first-pass fails', count(*)::text FROM parts p JOIN lots l ON l.id = p.lot_id
      WHERE l.lot_number LIKE '%-${tag}%' AND p.first_pass_status = 'fail'
    UNION ALL SELECT 'nonconformances', count(*)::text FROM nonconformances n JOIN lots l ON l.id = n.lot_id WHERE l.lot_number LIKE '%-${tag}%'
    UNION ALL SELECT 'period', min(created_at)::date || ' to ' || max(created_at)::date FROM lots WHERE lot_number LIKE '%-${tag}%'`)
  console.log(`History ${tag} written in ${seconds(started)} s:`)
  for (const r of rows) console.log(`  ${r.what.padEnd(18)} ${r.n}`)
} catch (err) {
  await client.query('ROLLBACK').catch(() => {})
  throw err
} finally {
  await client.end()
}

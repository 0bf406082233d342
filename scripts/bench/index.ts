/**
 * `npm run bench -- [--out bench-out/bench.json] [--runs 3] [--duration 10] [--keep] [--db URL]
 *                   [--skip-build] [--parts 52000] [--strict] [--cpu-prof]`
 *
 * Builds the client, starts a throwaway PostgreSQL cluster (.data/pg-bench, 127.0.0.1:54359,
 * fsync off), migrates, seeds the demo plant and the large history (scripts/generate-history.ts:
 * ≥ 50,000 parts, ≥ 1,000,000 gauge readings), starts the real server (NODE_ENV=production,
 * LOG_LEVEL=warn) on 127.0.0.1:5190 and measures; each measurement --runs times, the table and
 * the JSON give the medians. Everything it started is stopped and the cluster removed at the end
 * (--keep leaves the cluster running and prints its URL; --db URL measures an already filled
 * database instead). Exit status 0 even when a target is missed (the machine may be busy), unless
 * --strict. See scripts/bench/README.md.
 */
import { execFileSync } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { mkdirSync } from 'node:fs'
import { loadavg } from 'node:os'
import { parseArgs } from 'node:util'
import pg from 'pg'
import { startCluster, type Cluster } from './cluster'
import { startServer, type RunningServer } from './serverProcess'
import {
  BENCH_PASSWORD,
  BENCH_POOL_MAX,
  benchServerEnv,
  openLotsForReadings,
  prepareDatabase,
  signIn,
} from './prepare'
import { loadBare, loadReadings } from './readings'
import { measureTrends } from './trends'
import { measureCertificatePdf } from './pdf'
import { measureClientSize } from './clientSize'
import { printTable, summarise, writeJson, type MetricDef } from './report'
import { cpuSpan, dataDirectory, postmasterPidOf } from './cpu'
import { startSmtpSink } from './smtpSink'

const { values: args } = parseArgs({
  options: {
    out: { type: 'string', default: 'bench-out/bench.json' },
    runs: { type: 'string', default: '3' },
    duration: { type: 'string', default: '10' },
    keep: { type: 'boolean', default: false },
    db: { type: 'string' },
    'skip-build': { type: 'boolean', default: false },
    parts: { type: 'string', default: '52000' },
    strict: { type: 'boolean', default: false },
    'cpu-prof': { type: 'boolean', default: false },
  },
})
const RUNS = Number(args.runs)
const DURATION_S = Number(args.duration)
const PG_PORT = 54359
const APP_PORT = 5190
const POOL_MAX = BENCH_POOL_MAX
const CLIENT_OUT = 'bench-out/client'

const METRICS: MetricDef[] = [
  { name: 'reading_post_rps', unit: 'req/s', target: '>= 1000' },
  { name: 'reading_post_p95_ms', unit: 'ms', target: '<= 25' },
  { name: 'reading_post_overhead_ratio', unit: 'ratio', target: '<= 1.5' },
  { name: 'trends_p95_ms', unit: 'ms', target: '<= 150' },
  { name: 'trends_ratio_vs_raw_sql', unit: 'ratio', target: '<= 1.3' },
  { name: 'certificate_pdf_median_ms', unit: 'ms', target: '<= 80' },
  { name: 'client_initial_kb_gzip', unit: 'KB', target: '<= 300' },
  { name: 'server_rss_mb', unit: 'MB', target: '<= 250' },
]

const say = (s: string) => console.log(`[bench] ${s}`)
const load = () =>
  loadavg()
    .map((l) => l.toFixed(2))
    .join(' ')
const started = Date.now()
const elapsed = () => `${((Date.now() - started) / 1000).toFixed(0)} s`

mkdirSync('bench-out', { recursive: true })
const loadAtStart = load()
say(
  `load average at start: ${loadAtStart} (${process.env.CI ? 'CI' : 'local'}, 2-core target machine)`,
)

let cluster: Cluster | null = null
let server: RunningServer | null = null
let smtp: Awaited<ReturnType<typeof startSmtpSink>> | null = null
const stopAll = async () => {
  await server?.stop().catch(() => {})
  await smtp?.stop()
  if (cluster && !args.keep) cluster.stop()
}
process.on('SIGINT', () => void stopAll().then(() => process.exit(130)))
// Whatever goes wrong, the server and the cluster do not outlive the bench.
process.on('unhandledRejection', (err) => {
  console.error(err)
  void stopAll().then(() => process.exit(2))
})
process.on('SIGTERM', () => void stopAll().then(() => process.exit(143)))

try {
  if (!args['skip-build']) {
    say('building the client (vite build → bench-out/client)')
    execFileSync(
      'node_modules/.bin/vite',
      ['build', '--logLevel', 'warn', '--outDir', CLIENT_OUT, '--emptyOutDir'],
      {
        stdio: 'inherit',
      },
    )
  }

  let dbUrl = args.db
  if (!dbUrl) {
    say(`throwaway PostgreSQL on 127.0.0.1:${PG_PORT} (.data/pg-bench, fsync off)`)
    cluster = startCluster('pg-bench', PG_PORT)
    cluster.createDatabase('filmtrail_bench')
    dbUrl = cluster.urlFor('filmtrail_bench')
    say(`migrations, demo seed and the large history (${args.parts} parts; about 2 minutes)`)
    execFileSync(
      'node',
      ['--import', 'tsx', 'scripts/generate-history.ts', '--parts', args.parts],
      {
        stdio: 'inherit',
        env: { ...process.env, NODE_ENV: 'development', DATABASE_URL: dbUrl, LOG_LEVEL: 'warn' },
      },
    )
  } else {
    // an already filled database may predate the newest migrations
    execFileSync('node', ['--import', 'tsx', 'server/cli/migrate.ts'], {
      stdio: 'inherit',
      env: {
        ...process.env,
        NODE_ENV: 'development',
        DATABASE_URL: dbUrl,
        JWT_SECRET: 'x'.repeat(40),
      },
    })
  }
  await prepareDatabase(dbUrl)
  const history = await countHistory(dbUrl)
  say(`history: ${history.parts} parts, ${history.readings} gauge readings (${elapsed()})`)

  // This process imports the trends service and the PDF renderer: same settings as the server.
  const jwtSecret = randomBytes(32).toString('hex')
  Object.assign(process.env, {
    DATABASE_URL: dbUrl,
    JWT_SECRET: jwtSecret,
    LOG_LEVEL: 'warn',
    NODE_ENV: 'production',
  })
  smtp = await startSmtpSink()
  server = await startServer({
    port: APP_PORT,
    databaseUrl: dbUrl,
    logFile: 'bench-out/server.log',
    env: benchServerEnv(jwtSecret, { CLIENT_DIST: CLIENT_OUT, SMTP_PORT: String(smtp.port) }),
    nodeFlags: args['cpu-prof'] ? ['--cpu-prof', '--cpu-prof-dir=bench-out/prof'] : [],
  })
  say(`server pid ${server.pid} on ${server.base}; RSS after start ${server.rssMb().toFixed(0)} MB`)
  const operator = await signIn(server.base, 'operator@harrowgate.example')
  const manager = await signIn(server.base, 'manager@harrowgate.example')
  const targets = await openLotsForReadings(server.base, dbUrl, operator, 8, 250)
  say(
    `${targets.partIds.length} parts in 8 open lots for the readings load; gauge #${targets.instrumentId}`,
  )

  say('client size: sign-in page and the operator’s first page in Chromium')
  const client = await measureClientSize(server.base, 'operator@harrowgate.example', BENCH_PASSWORD)
  say(`  operator’s first page: ${client.firstPage}; ${client.files.length} files`)

  say('warming up (3 s of readings, 2 s of the bare route)')
  const acknowledged: string[] = []
  const warm = await loadReadings(server.base, operator, targets, 3)
  acknowledged.push(...warm.acknowledged)
  await loadBare(server.base, 2)
  const postmaster = postmasterPidOf(await dataDirectory(dbUrl))

  const runs: Record<string, number>[] = []
  const details: Record<string, unknown>[] = []
  for (let run = 1; run <= RUNS; run++) {
    const loadBefore = load()
    const readingsCpu = cpuSpan(server.pid, postmaster)
    const readings = await loadReadings(server.base, operator, targets, DURATION_S)
    const readingsCpuMs = readingsCpu.end(readings.requests)
    acknowledged.push(...readings.acknowledged)
    const bareCpu = cpuSpan(server.pid, postmaster)
    const bare = await loadBare(server.base, DURATION_S)
    const bareCpuMs = bareCpu.end(bare.requests)
    const rssMb = server.rssMb()
    const trends = await measureTrends(server.base, manager, dbUrl, 30, POOL_MAX)
    const pdf = await measureCertificatePdf(20)
    if (readings.non2xx || readings.errors || bare.non2xx || bare.errors)
      throw new Error(
        `run ${run}: refused or failed requests: ${JSON.stringify({ readings, bare })}`,
      )
    runs.push({
      reading_post_rps: readings.rps,
      reading_post_p95_ms: readings.p95Ms,
      reading_post_overhead_ratio: readings.p95Ms / bare.p95Ms,
      trends_p95_ms: trends.httpP95Ms,
      trends_ratio_vs_raw_sql: trends.httpP95Ms / trends.rawP95Ms,
      certificate_pdf_median_ms: pdf.medianMs,
      client_initial_kb_gzip: client.kbGzip,
      server_rss_mb: rssMb,
    })
    const strip = ({ acknowledged: _, ...rest }: typeof readings) => rest
    details.push({
      run,
      loadBefore,
      loadAfter: load(),
      readings: { ...strip(readings), cpuMsPerRequest: readingsCpuMs },
      bare: { ...strip(bare), cpuMsPerRequest: bareCpuMs },
      trends,
      pdfMedianMs: pdf.medianMs,
      rssMb,
    })
    say(
      `run ${run}/${RUNS} (load ${loadBefore}): readings ${readings.rps.toFixed(0)} req/s p95 ${readings.p95Ms.toFixed(1)} ms; ` +
        `bare ${bare.rps.toFixed(0)} req/s p95 ${bare.p95Ms.toFixed(1)} ms; trends p95 ${trends.httpP95Ms.toFixed(1)} ms ` +
        `vs raw ${trends.rawP95Ms.toFixed(1)} ms (${trends.statements} statements, ${trends.inspected} parts); ` +
        `pdf ${pdf.medianMs.toFixed(1)} ms; RSS ${rssMb.toFixed(0)} MB`,
    )
    say(
      `  CPU per request: readings node ${readingsCpuMs.serverMsPerReq.toFixed(2)} ms + PostgreSQL ` +
        `${readingsCpuMs.postgresMsPerReq.toFixed(2)} ms; bare node ${bareCpuMs.serverMsPerReq.toFixed(2)} ms + ` +
        `PostgreSQL ${bareCpuMs.postgresMsPerReq.toFixed(2)} ms`,
    )
  }

  // Nothing acknowledged may be missing, nothing stored twice.
  const check = await checkAcknowledged(dbUrl, acknowledged)
  if (check.missing || check.duplicated)
    throw new Error(`acknowledged readings: ${JSON.stringify(check)}`)
  say(`check: all ${acknowledged.length} acknowledged readings stored, each once`)

  const metrics = summarise(METRICS, runs)
  const loadAtEnd = load()
  printTable(
    metrics,
    `load average at start ${loadAtStart}, at end ${loadAtEnd}; medians of ${RUNS} runs; ${elapsed()}`,
  )
  writeJson(args.out, metrics, {
    loadAverage: { start: loadAtStart, end: loadAtEnd },
    history,
    client,
    details,
  })
  say(`written ${args.out}`)
  await stopAll()
  if (cluster && args.keep) say(`cluster kept: ${dbUrl}`)
  if (args.strict && metrics.some((m) => !m.pass)) process.exitCode = 1
} catch (err) {
  console.error(err)
  await stopAll()
  process.exitCode = 2
}

async function countHistory(url: string) {
  const db = new pg.Client({ connectionString: url })
  await db.connect()
  try {
    const { rows } = await db.query<{ parts: string; readings: string }>(
      'SELECT (SELECT count(*) FROM parts) AS parts, (SELECT count(*) FROM gauge_readings) AS readings',
    )
    return { parts: Number(rows[0]!.parts), readings: Number(rows[0]!.readings) }
  } finally {
    await db.end()
  }
}

async function checkAcknowledged(url: string, clientIds: string[]) {
  const db = new pg.Client({ connectionString: url })
  await db.connect()
  try {
    const { rows } = await db.query<{ found: string; duplicated: string }>(
      `SELECT count(DISTINCT r.client_id) AS found, count(*) - count(DISTINCT r.client_id) AS duplicated
         FROM gauge_readings r WHERE r.client_id = ANY($1::uuid[])`,
      [clientIds],
    )
    return {
      missing: clientIds.length - Number(rows[0]!.found),
      duplicated: Number(rows[0]!.duplicated),
    }
  } finally {
    await db.end()
  }
}

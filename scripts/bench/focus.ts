/**
 * `node --import tsx scripts/bench/focus.ts --db URL [--duration 10] [--bare] [--client DIR] [--cpu-prof]`
 *
 * Not part of npm run bench: one or two of its measurements against an already filled database
 * (`npm run bench -- --keep` leaves one), to try a change quickly or profile the hot path.
 * Default: the readings load only (req/s, p95, CPU per request, RSS). --bare adds the bare route;
 * --client DIR measures client_initial_kb_gzip of a client built into DIR instead of any load.
 */
import { randomBytes } from 'node:crypto'
import { parseArgs } from 'node:util'
import {
  BENCH_PASSWORD,
  benchServerEnv,
  prepareDatabase,
  signIn,
  openLotsForReadings,
} from './prepare'
import { loadReadings, loadBare } from './readings'
import { startServer } from './serverProcess'
import { cpuSpan, dataDirectory, postmasterPidOf } from './cpu'
import { measureClientSize } from './clientSize'

const { values } = parseArgs({
  options: {
    db: { type: 'string' },
    duration: { type: 'string', default: '10' },
    'cpu-prof': { type: 'boolean', default: false },
    bare: { type: 'boolean', default: false },
    client: { type: 'string' },
  },
})
if (!values.db) throw new Error('--db URL: a database filled by npm run bench -- --keep')
const dbUrl = values.db
await prepareDatabase(dbUrl)
const server = await startServer({
  port: 5191,
  databaseUrl: dbUrl,
  logFile: 'bench-out/server-focus.log',
  env: benchServerEnv(
    randomBytes(32).toString('hex'),
    values.client ? { CLIENT_DIST: values.client } : {},
  ),
  nodeFlags: values['cpu-prof'] ? ['--cpu-prof', '--cpu-prof-dir=bench-out/prof-focus'] : [],
})
try {
  if (values.client) {
    const size = await measureClientSize(server.base, 'operator@harrowgate.example', BENCH_PASSWORD)
    for (const f of size.files.slice(0, 40))
      console.log(`${(f.gzipBytes / 1024).toFixed(1).padStart(6)} KB  ${f.url}`)
    console.log(`client_initial_kb_gzip ${size.kbGzip.toFixed(1)} KB (${size.files.length} files)`)
  } else {
    const operator = await signIn(server.base, 'operator@harrowgate.example')
    const targets = await openLotsForReadings(server.base, dbUrl, operator, 8, 250)
    await loadReadings(server.base, operator, targets, 2)
    const postmaster = postmasterPidOf(await dataDirectory(dbUrl))
    const span = cpuSpan(server.pid, postmaster)
    const r = await loadReadings(server.base, operator, targets, Number(values.duration))
    const cpu = span.end(r.requests)
    console.log(
      `readings ${r.rps.toFixed(0)} req/s, p50 ${r.p50Ms.toFixed(1)} ms, p95 ${r.p95Ms.toFixed(1)} ms; ` +
        `CPU per request: node ${cpu.serverMsPerReq.toFixed(2)} ms, PostgreSQL ${cpu.postgresMsPerReq.toFixed(2)} ms; ` +
        `RSS ${server.rssMb().toFixed(0)} MB`,
    )
    if (values.bare) {
      const s2 = cpuSpan(server.pid, postmaster)
      const b = await loadBare(server.base, Number(values.duration))
      const c2 = s2.end(b.requests)
      console.log(
        `bare ${b.rps.toFixed(0)} req/s, p95 ${b.p95Ms.toFixed(1)} ms; CPU per request: node ` +
          `${c2.serverMsPerReq.toFixed(2)} ms, PostgreSQL ${c2.postgresMsPerReq.toFixed(2)} ms`,
      )
    }
  }
} finally {
  await server.stop()
}

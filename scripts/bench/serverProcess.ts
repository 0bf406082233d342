/**
 * The real server (the bundle of server/index.ts, scripts/serverBuild.ts) as a child process on
 * its own port and database, the way the start command runs it, for the benchmark and the fault
 * tests. Output goes to a log file so a crash can be read afterwards.
 */
import { spawn, type ChildProcess } from 'node:child_process'
import { createWriteStream, readFileSync } from 'node:fs'
import { ensureServerBuild, serverNodeArgs } from '../serverBuild'

export interface ServerOptions {
  port: number
  databaseUrl: string
  logFile: string
  env?: Record<string, string>
  /** Extra node flags, e.g. ['--cpu-prof', '--cpu-prof-dir=bench-out/prof']. */
  nodeFlags?: string[]
}

export interface RunningServer {
  base: string
  child: ChildProcess
  pid: number
  /** Resident set size of the server process from /proc (MB). */
  rssMb(): number
  /** Resolves when the process has exited. */
  exited: Promise<number | null>
  stop(signal?: NodeJS.Signals): Promise<void>
}

export async function waitForHealth(base: string, timeoutMs = 60_000, exited?: Promise<unknown>) {
  const deadline = Date.now() + timeoutMs
  let dead = false
  void exited?.then(() => (dead = true))
  while (Date.now() < deadline) {
    if (dead) throw new Error(`the server at ${base} exited before it answered /api/health`)
    try {
      const res = await fetch(`${base}/api/health`)
      if (res.ok) return
    } catch {
      /* not listening yet */
    }
    await new Promise((r) => setTimeout(r, 100))
  }
  throw new Error(`the server at ${base} did not answer /api/health within ${timeoutMs} ms`)
}

export async function startServer(opts: ServerOptions): Promise<RunningServer> {
  await ensureServerBuild()
  const log = createWriteStream(opts.logFile, { flags: 'a' })
  const child = spawn(process.execPath, [...(opts.nodeFlags ?? []), ...serverNodeArgs()], {
    env: {
      PATH: process.env.PATH ?? '/usr/bin:/bin',
      HOME: process.env.HOME ?? '/root',
      HOST: '127.0.0.1',
      PORT: String(opts.port),
      DATABASE_URL: opts.databaseUrl,
      PUBLIC_URL: `http://127.0.0.1:${opts.port}`,
      ...opts.env,
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  })
  child.stdout!.pipe(log, { end: false })
  child.stderr!.pipe(log, { end: false })
  const exited = new Promise<number | null>((resolve) =>
    child.once('exit', (code) => resolve(code)),
  )
  const base = `http://127.0.0.1:${opts.port}`
  await waitForHealth(base, 60_000, exited)
  return {
    base,
    child,
    pid: child.pid!,
    exited,
    rssMb() {
      const status = readFileSync(`/proc/${child.pid}/status`, 'utf8')
      const kb = Number(/VmRSS:\s+(\d+) kB/.exec(status)?.[1] ?? NaN)
      return kb / 1024
    },
    async stop(signal: NodeJS.Signals = 'SIGTERM') {
      if (child.exitCode === null && child.signalCode === null) child.kill(signal)
      await exited
    },
  }
}

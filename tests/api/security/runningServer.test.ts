import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { createServer, connect } from 'node:net'
import { networkInterfaces } from 'node:os'
import { createUser, TEST_PASSWORD } from '../support/fixtures'

/**
 * The server as `npm start` runs it (node --import tsx server/index.ts), in a child process on
 * this file's database, logging everything (LOG_LEVEL=trace: every request and every SQL
 * statement): where it listens, and what its log never holds.
 */
const ROOT = new URL('../../../', import.meta.url).pathname

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

/** Listening sockets on `port` from the kernel's own table: [hex address, family]. */
function listenersOn(port: number): string[] {
  const hexPort = port.toString(16).toUpperCase().padStart(4, '0')
  const out: string[] = []
  for (const file of ['/proc/net/tcp', '/proc/net/tcp6']) {
    for (const line of readFileSync(file, 'utf8').split('\n').slice(1)) {
      const [, local, , state] = line.trim().split(/\s+/)
      if (state === '0A' && local?.endsWith(`:${hexPort}`)) out.push(local.split(':')[0]!)
    }
  }
  return out
}

const serverEnv = (extra: Record<string, string>) => ({
  ...process.env,
  NODE_ENV: 'development',
  LOG_LEVEL: 'trace',
  HOST: '127.0.0.1',
  OUTBOX_POLL_MS: '600000',
  SMTP_PORT: '1',
  ...extra,
})

describe('the running server', () => {
  let child: ChildProcess
  let port: number
  let log = ''
  let base: string

  beforeAll(async () => {
    port = await freePort()
    base = `http://127.0.0.1:${port}`
    child = spawn('node', ['--import', 'tsx', 'server/index.ts'], {
      cwd: ROOT,
      env: serverEnv({ PORT: String(port), PUBLIC_URL: base }),
      stdio: ['ignore', 'pipe', 'pipe'],
    })
    child.stdout!.on('data', (d: Buffer) => (log += d.toString()))
    child.stderr!.on('data', (d: Buffer) => (log += d.toString()))
    const deadline = Date.now() + 25_000
    while (!log.includes('Filmtrail listening')) {
      if (Date.now() > deadline || child.exitCode !== null)
        throw new Error(`server did not start:\n${log}`)
      await new Promise((r) => setTimeout(r, 100))
    }
  }, 30_000)

  afterAll(() => {
    child?.kill('SIGTERM')
  })

  it('listens on 127.0.0.1 only', async () => {
    expect(listenersOn(port)).toEqual(['0100007F'])
    const outward = Object.values(networkInterfaces())
      .flat()
      .filter((a) => a && a.family === 'IPv4' && !a.internal)
      .map((a) => a!.address)
    for (const address of outward) {
      const refused = await new Promise<boolean>((resolve) => {
        const socket = connect({ host: address, port, timeout: 2000 })
        socket.once('connect', () => (socket.destroy(), resolve(false)))
        socket.once('error', () => resolve(true))
        socket.once('timeout', () => (socket.destroy(), resolve(true)))
      })
      expect(refused, `reachable on ${address}:${port}`).toBe(true)
    }
  })

  it('never writes a password or a token to its log, even at trace level', async () => {
    const admin = await createUser('admin')
    const post = (path: string, body: unknown, auth?: string) =>
      fetch(base + path, {
        method: 'POST',
        headers: { 'content-type': 'application/json', ...(auth ? { authorization: auth } : {}) },
        body: JSON.stringify(body),
      })
    const wrong = 'Wrong-Secret-Pass-987'
    expect((await post('/api/auth/login', { email: admin.email, password: wrong })).status).toBe(
      401,
    )
    const ok = await post('/api/auth/login', { email: admin.email, password: TEST_PASSWORD })
    expect(ok.status).toBe(200)
    const { token } = (await ok.json()) as { token: string }
    const auth = `Bearer ${token}`
    const created = 'Logged-Never-4242'
    const made = await post(
      '/api/users',
      { email: 'logcheck@test.example', name: 'Log Check', role: 'operator', password: created },
      auth,
    )
    expect(made.status).toBe(201)
    const { id } = (await made.json()) as { id: number }
    const resetTo = 'Reset-Never-5353'
    expect(
      (await post(`/api/users/${id}/reset-password`, { password: resetTo }, auth)).status,
    ).toBe(200)
    // A weak password is refused: the refusal is logged, the password is not.
    const weak = 'short1'
    expect((await post(`/api/users/${id}/reset-password`, { password: weak }, auth)).status).toBe(
      400,
    )
    await new Promise((r) => setTimeout(r, 500))

    // (control) the log did record these requests and their SQL.
    expect(log).toContain('/api/users/')
    expect(log).toMatch(/UPDATE \\"users\\" SET/) // pino writes JSON: the quotes are escaped
    for (const secret of [wrong, TEST_PASSWORD, created, resetTo, weak, token]) {
      expect(log.includes(secret), `the log holds ${secret.slice(0, 12)}…`).toBe(false)
    }
  })
})

describe('configuration refuses a network address', () => {
  for (const [name, value] of [
    ['HOST', '0.0.0.0'],
    ['HOST', '192.0.2.2'],
    ['SMTP_HOST', '0.0.0.0'],
  ] as const) {
    it(`${name}=${value}: the server does not start, and says why`, () => {
      const run = spawnSync('node', ['--import', 'tsx', 'server/index.ts'], {
        cwd: ROOT,
        env: serverEnv({ PORT: '1', [name]: value, LOG_LEVEL: 'info' }),
        encoding: 'utf8',
        timeout: 20_000,
      })
      expect(run.status).not.toBe(0)
      // env.ts names the variable, then the rule (one rule for both host settings).
      expect(run.stderr + run.stdout).toContain(
        `${name}: HOST must be a loopback address (127.x.x.x, ::1 or localhost)`,
      )
    }, 25_000)
  }
})

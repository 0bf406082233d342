import { spawn, execFileSync, type ChildProcess } from 'node:child_process'
import { ensureServerBuild, serverNodeArgs } from '../../../scripts/serverBuild'
import { existsSync, mkdirSync, openSync } from 'node:fs'
import pg from 'pg'
import { BASE_URL, E2E_DB, E2E_PORT, SCREENSHOT_DIR, adminUrl, e2eDatabaseUrl } from './serverInfo'

/**
 * Once per e2e run: a fresh database with the migrations and the demo seed, the built client,
 * and the real server on 127.0.0.1:5199 — the same `server/index.ts` that `npm start` runs.
 * Teardown kills the server's whole process group, so no node process outlives the run.
 */
const JWT_SECRET = 'e2e-only-secret-not-for-anything-else-0123456789'
// One log per port, so parallel runs (E2E_PORT) do not write over each other's.
const SERVER_LOG =
  E2E_PORT === 5199 ? 'test-output/e2e-server.log' : `test-output/e2e-server-${E2E_PORT}.log`

function serverEnv(): NodeJS.ProcessEnv {
  return {
    ...process.env,
    NODE_ENV: 'test',
    HOST: '127.0.0.1',
    PORT: String(E2E_PORT),
    DATABASE_URL: e2eDatabaseUrl(),
    JWT_SECRET,
    JWT_SECRET_FILE: '',
    CLIENT_DIST: 'dist',
    LOG_LEVEL: 'warn',
    // The sign-in tests sign in many times from one address.
    LOGIN_RATE_LIMIT: '1000',
  }
}

async function freshDatabase() {
  // The name goes into DROP DATABASE unquoted, so only a plain identifier is accepted.
  if (!/^[a-z_][a-z0-9_]*$/.test(E2E_DB))
    throw new Error(`E2E_DB must be a plain identifier: ${E2E_DB}`)
  const client = new pg.Client({ connectionString: adminUrl() })
  try {
    await client.connect()
  } catch (err) {
    throw new Error(
      `Browser tests need the throwaway PostgreSQL: run them through "npm test" (or start it with ` +
        `"scripts/db.sh start test"). ${(err as Error).message}`,
    )
  }
  await client.query(`DROP DATABASE IF EXISTS ${E2E_DB} WITH (FORCE)`)
  await client.query(`CREATE DATABASE ${E2E_DB}`)
  await client.end()
}

async function waitForHealth(child: ChildProcess, timeoutMs = 30_000) {
  const deadline = Date.now() + timeoutMs
  while (Date.now() < deadline) {
    if (child.exitCode !== null)
      throw new Error(`The e2e server exited with code ${child.exitCode}; see ${SERVER_LOG}`)
    try {
      const res = await fetch(`${BASE_URL}/api/health`)
      if (res.ok) return
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200))
  }
  throw new Error(
    `The e2e server did not answer ${BASE_URL}/api/health within ${timeoutMs / 1000} s`,
  )
}

function stop(child: ChildProcess) {
  if (child.pid === undefined || child.exitCode !== null) return
  try {
    // Negative pid: the whole group (the server and anything it started).
    process.kill(-child.pid, 'SIGTERM')
  } catch {
    return
  }
  const deadline = Date.now() + 5000
  while (Date.now() < deadline) {
    try {
      process.kill(-child.pid, 0)
    } catch {
      return
    }
    execFileSync('sleep', ['0.1'])
  }
  try {
    process.kill(-child.pid, 'SIGKILL')
  } catch {
    // already gone
  }
}

export default async function setup() {
  mkdirSync(SCREENSHOT_DIR, { recursive: true })
  await freshDatabase()
  const env = serverEnv()
  execFileSync('npx', ['tsx', 'server/cli/migrate.ts'], { env, stdio: 'inherit' })
  execFileSync('npx', ['tsx', 'server/cli/seed.ts'], {
    env,
    stdio: ['ignore', 'ignore', 'inherit'],
  })
  // `npm test` builds the client first; a lone `vitest --project e2e` builds it here.
  if (!existsSync('dist/index.html')) execFileSync('npx', ['vite', 'build'], { stdio: 'inherit' })

  // The server as npm start runs it: the bundle (rebuilt here when a source is newer).
  await ensureServerBuild()
  const log = openSync(SERVER_LOG, 'w')
  const child = spawn(process.execPath, serverNodeArgs(), {
    env,
    detached: true,
    stdio: ['ignore', log, log],
  })
  try {
    await waitForHealth(child)
  } catch (err) {
    stop(child)
    throw err
  }
  return () => stop(child)
}

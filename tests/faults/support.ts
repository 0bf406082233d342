/**
 * Fault tests: a throwaway PostgreSQL cluster per test file (scripts/bench/cluster.ts), migrated
 * by the product's own migrate command, and this process's environment pointed at it before any
 * server module is imported (import those dynamically, after useDatabase).
 */
import { execFileSync } from 'node:child_process'
import { randomBytes } from 'node:crypto'
import { createServer, type AddressInfo } from 'node:net'
import { startCluster, type Cluster } from '../../scripts/bench/cluster'

export interface FaultDatabase {
  cluster: Cluster
  url: string
  jwtSecret: string
}

export function faultDatabase(name: string, port: number): FaultDatabase {
  const cluster = startCluster(name, port)
  cluster.createDatabase('filmtrail_faults')
  const url = cluster.urlFor('filmtrail_faults')
  const jwtSecret = randomBytes(32).toString('hex')
  execFileSync(process.execPath, ['--import', 'tsx', 'server/cli/migrate.ts'], {
    env: { ...process.env, DATABASE_URL: url, JWT_SECRET: jwtSecret, NODE_ENV: 'test' },
    stdio: 'inherit',
  })
  Object.assign(process.env, {
    DATABASE_URL: url,
    JWT_SECRET: jwtSecret,
    NODE_ENV: 'test',
    LOGIN_RATE_LIMIT: '1000',
    PUBLIC_URL: 'http://127.0.0.1:5180',
  })
  return { cluster, url, jwtSecret }
}

/** A loopback port nobody listens on (bound and released at once). */
export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer()
    s.on('error', reject)
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo
      s.close(() => resolve(port))
    })
  })
}

export const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms))

/** Settings of a server process in a fault test (production mode: no demo passwords exist here). */
export function serverEnv(db: FaultDatabase, extra: Record<string, string> = {}) {
  return {
    NODE_ENV: 'production',
    LOG_LEVEL: 'warn',
    JWT_SECRET: db.jwtSecret,
    LOGIN_RATE_LIMIT: '1000',
    ...extra,
  }
}

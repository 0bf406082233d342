/**
 * A throwaway PostgreSQL 15 cluster for measuring: its own data folder under .data/, its own
 * loopback port, fsync off (nothing here must survive a crash). Started fresh, removed at the end.
 * Same commands as scripts/db.sh (initdb refuses root: run as the postgres OS user when root).
 */
import { execFileSync } from 'node:child_process'
import { chmodSync, chownSync, existsSync, mkdirSync, rmSync } from 'node:fs'
import { dirname, resolve } from 'node:path'

const PGBIN = '/usr/lib/postgresql/15/bin'
const isRoot = process.getuid?.() === 0

function asPg(cmd: string, args: string[]) {
  const [file, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', cmd, ...args]] : [cmd, args]
  return execFileSync(file, argv, { encoding: 'utf8', stdio: ['ignore', 'pipe', 'pipe'] })
}

export interface Cluster {
  port: number
  dataDir: string
  adminUrl: string
  urlFor(db: string): string
  createDatabase(db: string): void
  stop(): void
}

export function startCluster(name: string, port: number, extra: string[] = []): Cluster {
  if (!existsSync(`${PGBIN}/initdb`))
    throw new Error(
      'PostgreSQL 15 is missing: run "npm test" once (it installs it) or apt-get install postgresql-15',
    )
  const dataDir = resolve('.data', name)
  const pgCtl = (...args: string[]) => asPg(`${PGBIN}/pg_ctl`, ['-D', dataDir, ...args])
  // A leftover from an interrupted run: stop it and start clean.
  if (existsSync(`${dataDir}/PG_VERSION`)) {
    try {
      pgCtl('-m', 'immediate', '-w', 'stop')
    } catch {
      /* was not running */
    }
  }
  rmSync(dataDir, { recursive: true, force: true })
  mkdirSync(dataDir, { recursive: true })
  if (isRoot) {
    const pgUid = Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).trim())
    const pgGid = Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).trim())
    chownSync(dataDir, pgUid, pgGid)
    // every parent must be enterable by the postgres user
    for (let d = dirname(dataDir); d !== '/'; d = dirname(d)) {
      try {
        chmodSync(d, 0o755)
      } catch {
        /* not ours to change */
      }
    }
  }
  chmodSync(dataDir, 0o700)
  asPg(`${PGBIN}/initdb`, [
    '-D',
    dataDir,
    '-U',
    'postgres',
    '--auth=trust',
    '-E',
    'UTF8',
    '--locale=C.UTF-8',
  ])
  const opts = [
    `-p ${port}`,
    '-c listen_addresses=127.0.0.1',
    `-c unix_socket_directories=${dataDir}`,
    '-c fsync=off',
    '-c synchronous_commit=off',
    '-c full_page_writes=off',
    '-c max_connections=200',
    ...extra,
  ].join(' ')
  pgCtl('-l', `${dataDir}/server.log`, '-w', '-t', '60', '-o', opts, 'start')
  const urlFor = (db: string) => `postgres://postgres@127.0.0.1:${port}/${db}`
  return {
    port,
    dataDir,
    adminUrl: urlFor('postgres'),
    urlFor,
    createDatabase(db: string) {
      asPg(`${PGBIN}/psql`, [
        '-h',
        '127.0.0.1',
        '-p',
        String(port),
        '-U',
        'postgres',
        '-qc',
        `CREATE DATABASE ${db}`,
      ])
    },
    stop() {
      try {
        pgCtl('-m', 'fast', '-w', 'stop')
      } catch {
        /* already stopped */
      }
      rmSync(dataDir, { recursive: true, force: true })
    },
  }
}

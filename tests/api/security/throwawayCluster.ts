import { execFileSync } from 'node:child_process'
import { chmodSync, chownSync, mkdirSync, readFileSync, readdirSync, rmSync } from 'node:fs'
import { randomBytes } from 'node:crypto'
import { resolve } from 'node:path'

/**
 * A PostgreSQL 15 cluster of a test's own (the shared test cluster on 54339 must not be stopped),
 * made the way scripts/db.sh makes the test one: under .data/, loopback only, fsync off.
 */
const PGBIN = '/usr/lib/postgresql/15/bin'
const ROOT = resolve(new URL('../../../', import.meta.url).pathname)
const isRoot = process.getuid?.() === 0

function asPostgres(cmd: string, args: string[]) {
  const [file, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', cmd, ...args]] : [cmd, args]
  return execFileSync(file, argv, { stdio: ['ignore', 'pipe', 'pipe'], encoding: 'utf8' })
}

export class ThrowawayCluster {
  readonly dir = resolve(ROOT, '.data', `pg-fault-${randomBytes(4).toString('hex')}`)
  constructor(readonly port: number) {}

  url(db = 'postgres') {
    return `postgres://postgres@127.0.0.1:${this.port}/${db}`
  }

  init() {
    mkdirSync(this.dir, { recursive: true })
    if (isRoot) {
      const uid = Number(execFileSync('id', ['-u', 'postgres'], { encoding: 'utf8' }).trim())
      const gid = Number(execFileSync('id', ['-g', 'postgres'], { encoding: 'utf8' }).trim())
      chownSync(this.dir, uid, gid)
    }
    chmodSync(this.dir, 0o700)
    asPostgres(`${PGBIN}/initdb`, [
      '-D',
      this.dir,
      '-U',
      'postgres',
      '--auth=trust',
      '-E',
      'UTF8',
      '--locale=C.UTF-8',
    ])
  }

  start() {
    const options = [
      `-p ${this.port}`,
      '-c listen_addresses=127.0.0.1',
      `-c unix_socket_directories=${this.dir}`,
      '-c fsync=off -c synchronous_commit=off -c full_page_writes=off',
    ].join(' ')
    asPostgres(`${PGBIN}/pg_ctl`, [
      '-D',
      this.dir,
      '-l',
      `${this.dir}/server.log`,
      '-w',
      '-t',
      '30',
      '-o',
      options,
      'start',
    ])
  }

  /** Fast shutdown: open connections are cut, as when the database host restarts. */
  stop() {
    asPostgres(`${PGBIN}/pg_ctl`, ['-D', this.dir, '-m', 'fast', '-w', 'stop'])
  }

  running() {
    try {
      asPostgres(`${PGBIN}/pg_ctl`, ['-D', this.dir, 'status'])
      return true
    } catch {
      return false
    }
  }

  /** The postmaster and its children (backends, checkpointer, ...), from /proc. */
  pids(): number[] {
    const postmaster = Number(readFileSync(`${this.dir}/postmaster.pid`, 'utf8').split('\n')[0])
    const children = readdirSync('/proc')
      .filter((d) => /^\d+$/.test(d))
      .filter((d) => {
        try {
          // /proc/<pid>/stat: "pid (name) state ppid ..."; the name may hold spaces, so split after ')'.
          const stat = readFileSync(`/proc/${d}/stat`, 'utf8')
          return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1]) === postmaster
        } catch {
          return false
        }
      })
      .map(Number)
    return [postmaster, ...children]
  }

  /** Frozen, not stopped: connections open and then hear nothing, as with a hung host. */
  freeze() {
    for (const pid of this.pids()) process.kill(pid, 'SIGSTOP')
  }

  thaw() {
    for (const pid of this.pids()) process.kill(pid, 'SIGCONT')
  }

  destroy() {
    if (this.running()) this.stop()
    rmSync(this.dir, { recursive: true, force: true })
  }
}

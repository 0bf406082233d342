import pg from 'pg'
import { Sequelize, type Transaction } from 'sequelize'
import { env } from '../config/env'
import { logger } from '../lib/logger'

/**
 * pg's Client with an 'error' listener from birth. Sequelize attaches its own only once the
 * connection is set up; a connection that hears "ready" and, in the same network read, the
 * server's shutdown notice (a PostgreSQL restart while the event loop is busy) would otherwise
 * throw an uncaught error and end the process. Marked invalid, the pool discards it.
 */
class GuardedClient extends pg.Client {
  constructor(config?: string | pg.ClientConfig) {
    // Pipeline mode: a query asked for while another is in flight on this connection goes out at
    // once instead of waiting for the answer (the write hot path sends pairs of statements of one
    // transaction together). Answers still come back in order; Sequelize's own queries, one at a
    // time, behave as before.
    super({
      ...(typeof config === 'string' ? { connectionString: config } : config),
      pipeline: true,
    })
    this.on('error', (err) => {
      ;(this as unknown as { _invalid: boolean })._invalid = true
      logger.warn(
        { code: (err as { code?: string }).code },
        `database connection lost: ${err.message}`,
      )
    })
  }

  /**
   * pg writes each protocol message of a query (Bind, Execute, Sync …) as its own socket write,
   * one system call each. Corked until the next tick, they leave in one write: the statements
   * of the write hot path cost a third of the system calls and PostgreSQL wakes once per query.
   */
  override query(...args: unknown[]): never {
    const stream = (this as unknown as { connection: { stream: Corkable } }).connection.stream
    if (!stream.writableCorked && stream.writable) {
      stream.cork()
      process.nextTick(() => stream.uncork())
    }
    return (super.query as (...a: unknown[]) => never)(...args)
  }
}
interface Corkable {
  writable: boolean
  writableCorked: number
  cork(): void
  uncork(): void
}
const dialectModule = Object.assign(Object.create(pg) as typeof pg, { Client: GuardedClient })

/** The one Sequelize instance. Schema changes go through migrations (server/db/migrations), never sync(). */
export const sequelize = new Sequelize(env.DATABASE_URL, {
  dialect: 'postgres',
  dialectModule,
  logging: env.LOG_LEVEL === 'trace' ? (sql) => logger.trace(sql) : false,
  pool: { max: env.DB_POOL_MAX, min: 0, idle: 10000, acquire: 10000 },
  define: { underscored: true, timestamps: true },
  dialectOptions: { application_name: 'filmtrail', statement_timeout: 30000 },
})

/** Runs `fn` in one transaction: everything it writes, audit events included, lands together or not at all. */
export function inTransaction<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
  return sequelize.transaction(fn)
}

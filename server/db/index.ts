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
    super(config)
    this.on('error', (err) => {
      ;(this as unknown as { _invalid: boolean })._invalid = true
      logger.warn(
        { code: (err as { code?: string }).code },
        `database connection lost: ${err.message}`,
      )
    })
  }
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

import { Sequelize, type Transaction } from 'sequelize'
import { env } from '../config/env'
import { logger } from '../lib/logger'

/** The one Sequelize instance. Schema changes go through migrations (server/db/migrations), never sync(). */
export const sequelize = new Sequelize(env.DATABASE_URL, {
  dialect: 'postgres',
  logging: env.LOG_LEVEL === 'trace' ? (sql) => logger.trace(sql) : false,
  pool: { max: env.DB_POOL_MAX, min: 0, idle: 10000, acquire: 10000 },
  define: { underscored: true, timestamps: true },
  dialectOptions: { application_name: 'filmtrail', statement_timeout: 30000 },
})

/** Runs `fn` in one transaction: everything it writes, audit events included, lands together or not at all. */
export function inTransaction<T>(fn: (t: Transaction) => Promise<T>): Promise<T> {
  return sequelize.transaction(fn)
}

import { QueryTypes } from 'sequelize'
import { sequelize } from '../../db'

/**
 * A read-only trend query in a transaction of its own with more sort/hash memory (SET LOCAL ends
 * with the transaction): the planner's guess for GROUP BY date_trunc('week') is poor and with the
 * default 4 MB it sorts a year of parts on disk instead of hashing ~600 groups in memory.
 */
export function readQuery<T extends object>(sql: string, bind: unknown[]): Promise<T[]> {
  return sequelize.transaction({ readOnly: true }, async (transaction) => {
    await sequelize.query("SET LOCAL work_mem = '32MB'", { transaction })
    return sequelize.query<T>(sql, { bind, type: QueryTypes.SELECT, transaction })
  })
}

import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import { isoWeek } from '../lots/lotNumber'

/** "NC-2648": ISO year and week, like the lot numbers, so a record is placed in time when read aloud. */
export function ncNumberPrefix(at: Date): string {
  const { year, week } = isoWeek(at)
  return `NC-${String(year % 100).padStart(2, '0')}${String(week).padStart(2, '0')}`
}

/**
 * The next nonconformance number of the week, e.g. "NC-2648-007". The counter row stays locked
 * until the caller's transaction ends, so numbers never repeat; a rolled-back one is given back.
 */
export async function nextNcNumber(at: Date, t: Transaction): Promise<string> {
  const prefix = ncNumberPrefix(at)
  const [row] = await sequelize.query<{ last_seq: number }>(
    `INSERT INTO nc_number_counters (prefix, last_seq) VALUES ($1, 1)
     ON CONFLICT (prefix) DO UPDATE SET last_seq = nc_number_counters.last_seq + 1
     RETURNING last_seq`,
    { bind: [prefix], type: QueryTypes.SELECT, transaction: t },
  )
  return `${prefix}-${String(row!.last_seq).padStart(3, '0')}`
}

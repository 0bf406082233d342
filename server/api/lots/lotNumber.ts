import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import type { Line } from '../../../shared/api/lots'

/** F = FBE powder line, L = liquid-epoxy booth: the first thing said when a lot is read aloud. */
export const LINE_LETTERS: Record<Line, 'F' | 'L'> = { 'fbe-powder': 'F', 'liquid-epoxy': 'L' }

/** ISO 8601 week-numbering year and week of a calendar date (the plant's local day). */
export function isoWeek(at: Date): { year: number; week: number } {
  const d = new Date(Date.UTC(at.getFullYear(), at.getMonth(), at.getDate()))
  const weekday = d.getUTCDay() || 7
  d.setUTCDate(d.getUTCDate() + 4 - weekday) // the Thursday of this week decides the year
  const yearStart = Date.UTC(d.getUTCFullYear(), 0, 1)
  const week = Math.ceil(((d.getTime() - yearStart) / 86_400_000 + 1) / 7)
  return { year: d.getUTCFullYear(), week }
}

/** "F2648": line letter, 2-digit ISO year, 2-digit ISO week. */
export function lotNumberPrefix(line: Line, at: Date): string {
  const { year, week } = isoWeek(at)
  return `${LINE_LETTERS[line]}${String(year % 100).padStart(2, '0')}${String(week).padStart(2, '0')}`
}

/**
 * The next lot number of that line and week, e.g. "F2648-031". The counter row is created or
 * incremented in one statement and stays locked until the caller's transaction ends, so two lots
 * opened at once are numbered one after the other; a rolled-back lot gives its number back.
 */
export async function nextLotNumber(line: Line, at: Date, t: Transaction): Promise<string> {
  const prefix = lotNumberPrefix(line, at)
  const [row] = await sequelize.query<{ last_seq: number }>(
    `INSERT INTO lot_number_counters (prefix, last_seq) VALUES ($1, 1)
     ON CONFLICT (prefix) DO UPDATE SET last_seq = lot_number_counters.last_seq + 1
     RETURNING last_seq`,
    { bind: [prefix], type: QueryTypes.SELECT, transaction: t },
  )
  return `${prefix}-${String(row!.last_seq).padStart(3, '0')}`
}

/** `count` consecutive numbers of one line and week in one statement (the demo seed's bulk path). */
export async function reserveLotNumbers(
  line: Line,
  at: Date,
  count: number,
  t: Transaction,
): Promise<string[]> {
  const prefix = lotNumberPrefix(line, at)
  const [row] = await sequelize.query<{ last_seq: number }>(
    `INSERT INTO lot_number_counters (prefix, last_seq) VALUES ($1, $2)
     ON CONFLICT (prefix) DO UPDATE SET last_seq = lot_number_counters.last_seq + $2
     RETURNING last_seq`,
    { bind: [prefix, count], type: QueryTypes.SELECT, transaction: t },
  )
  const first = row!.last_seq - count + 1
  return Array.from({ length: count }, (_, i) => `${prefix}-${String(first + i).padStart(3, '0')}`)
}

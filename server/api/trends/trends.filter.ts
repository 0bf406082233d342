import { localIsoDate } from '../../../shared/api/calibration'
import {
  DEFAULT_PERIOD_DAYS,
  MAX_PERIOD_DAYS,
  type ResolvedTrendsFilter,
  type TrendsFilter,
} from '../../../shared/api/trends'
import { badRequest } from '../../lib/httpError'

function addDays(isoDate: string, days: number): string {
  const d = new Date(`${isoDate}T00:00:00Z`)
  d.setUTCDate(d.getUTCDate() + days)
  return d.toISOString().slice(0, 10)
}

/** Fills the period: `to` defaults to today, `from` to 13 weeks before `to`. */
export function resolveFilter(f: TrendsFilter, today = localIsoDate()): ResolvedTrendsFilter {
  const to = f.to ?? today
  const from = f.from ?? addDays(to, -DEFAULT_PERIOD_DAYS + 1)
  const days = (Date.parse(to) - Date.parse(from)) / 86_400_000
  if (days > MAX_PERIOD_DAYS) {
    throw badRequest('period_too_long', `Choose a period of at most ${MAX_PERIOD_DAYS} days`)
  }
  return { ...f, from, to }
}

export interface FilterSql {
  /** `FROM parts p JOIN lots l ... WHERE ...` with $n placeholders. */
  fromWhere: string
  /** The conditions alone (p = parts, l = lots), for a query that joins more tables. */
  where: string
  bind: unknown[]
}

/**
 * The filtered parts as a FROM … WHERE clause. Only the conditions asked for are written, so the
 * planner sees plain equalities (no "$1 IS NULL OR …" that defeats the indexes). The period
 * bounds are dates in the session's time zone: [from 00:00, to + 1 day 00:00).
 */
export function filterSql(f: ResolvedTrendsFilter): FilterSql {
  const bind: unknown[] = [f.from, f.to]
  const where = [
    'p.created_at >= $1::date',
    'p.created_at < $2::date + 1',
    'p.first_pass_status IS NOT NULL',
    'p.sampled',
  ]
  const add = (sql: (n: number) => string, value: unknown) => {
    bind.push(value)
    where.push(sql(bind.length))
  }
  if (f.line) add((n) => `l.line = $${n}`, f.line)
  if (f.shift) add((n) => `l.shift = $${n}`, f.shift)
  if (f.specId) add((n) => `l.spec_id = $${n}`, f.specId)
  if (f.customerId) add((n) => `l.customer_id = $${n}`, f.customerId)
  // Same expression as the index parts_family_created (migration 0004).
  if (f.family) add((n) => `upper(split_part(p.part_number, '-', 1)) = $${n}`, f.family)
  const conditions = where.join(' AND ')
  return {
    fromWhere: `FROM parts p JOIN lots l ON l.id = p.lot_id WHERE ${conditions}`,
    where: conditions,
    bind,
  }
}

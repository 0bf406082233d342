import type { Response } from 'express'
import { QueryTypes } from 'sequelize'
import { sequelize } from '../../db'
import { TRENDS_CSV_COLUMNS, type TrendsFilter } from '../../../shared/api/trends'
import { filterSql, resolveFilter } from './trends.filter'

/** Rows per round trip: the export never holds more than this many parts in memory. */
const PAGE = 5000

/**
 * One CSV cell (RFC 4180): quoted when it holds a comma, quote or line break, quotes doubled.
 * A text cell that starts with = + - @ (or a tab / CR) gets a leading apostrophe, so a
 * spreadsheet shows it as text instead of running it as a formula (OWASP "CSV injection").
 */
export function csvCell(value: unknown): string {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : ''
  let s = String(value)
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s
}

export function csvLine(values: unknown[]): string {
  return values.map(csvCell).join(',') + '\r\n'
}

/** Streams the filtered parts, oldest first, in pages (keyset on created_at, id). */
export async function writeTrendsCsv(input: TrendsFilter, res: Response): Promise<void> {
  const filter = resolveFilter(input)
  const sql = filterSql(filter)
  const k = sql.bind.length
  res.setHeader('Content-Type', 'text/csv; charset=utf-8')
  res.setHeader(
    'Content-Disposition',
    `attachment; filename="line-health-${filter.from}-to-${filter.to}.csv"`,
  )
  // A BOM so that spreadsheet programs read µm and accented names as UTF-8.
  res.write('\uFEFF' + csvLine([...TRENDS_CSV_COLUMNS]))
  let after: { at: string; id: number } | null = null
  for (;;) {
    const keyset = after
      ? `AND (p.created_at, p.id) > ($${k + 1}::timestamptz, $${k + 2}::int)`
      : ''
    const rows: Record<string, unknown>[] = await sequelize.query(
      `SELECT to_char(p.created_at, 'YYYY-MM-DD"T"HH24:MI:SSOF') AS inspected_at,
              to_char(p.created_at, 'IYYY-"W"IW') AS week, l.lot_number, l.line, l.shift,
              c.name AS customer, s.code AS spec, l.spec_version, p.part_number,
              upper(split_part(p.part_number, '-', 1)) AS part_family, p.description,
              p.heat_number, p.quantity, p.coated_area_m2, p.round, p.first_pass_status,
              p.verdict_status AS current_status, p.thickness_mean_um,
              p.holidays_found_r1 AS holidays_found_round1,
              p.created_at::text AS cursor_at, p.id AS cursor_id
         FROM parts p JOIN lots l ON l.id = p.lot_id
         JOIN customers c ON c.id = l.customer_id
         JOIN coating_specs s ON s.id = l.spec_id
        WHERE ${sql.where} ${keyset}
        ORDER BY p.created_at, p.id LIMIT ${PAGE}`,
      { bind: after ? [...sql.bind, after.at, after.id] : sql.bind, type: QueryTypes.SELECT },
    )
    if (rows.length === 0) break
    res.write(rows.map((r) => csvLine(TRENDS_CSV_COLUMNS.map((c) => r[c]))).join(''))
    const last = rows[rows.length - 1]!
    after = { at: String(last.cursor_at), id: Number(last.cursor_id) }
    if (rows.length < PAGE) break
  }
  res.end()
}

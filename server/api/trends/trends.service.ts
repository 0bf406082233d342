import { QueryTypes } from 'sequelize'
import { sequelize } from '../../db'
import { LINES, LINE_LABELS, SHIFTS } from '../../../shared/api/lots'
import type { TrendsFilter, TrendsOptions, TrendsReport } from '../../../shared/api/trends'
import { filterSql, resolveFilter } from './trends.filter'
import { loadSummary } from './trends.summary'
import { loadPareto } from './trends.pareto'
import { loadThickness } from './trends.thickness'

/**
 * The whole Line health page in one answer. The summary and the Pareto run in parallel on two
 * pooled connections; the thickness section waits for the summary only when no spec was chosen
 * (it then takes the spec with the most measured parts).
 */
export async function trendsReport(input: TrendsFilter): Promise<TrendsReport> {
  const filter = resolveFilter(input)
  const sql = filterSql(filter)
  const summaryP = loadSummary(sql)
  const paretoP = loadPareto(sql)
  // When the summary fails first, the Pareto's failure is never awaited: without this it would
  // be an unhandled rejection, which ends the whole server process (the request still gets the
  // summary's error).
  paretoP.catch(() => {})
  const summary = await summaryP
  const chosen = filter.specId
    ? summary.specChoices.find((s) => s.specId === filter.specId)
    : summary.specChoices[0]
  const [pareto, thickness] = await Promise.all([
    paretoP,
    chosen ? loadThickness(sql, chosen, filter.subgroupSize) : Promise.resolve(null),
  ])
  return { filter, ...summary, pareto, thickness }
}

/** What the filter menus offer: every line and shift, active customers and specs, families seen. */
export async function trendsOptions(query: { from?: string; to?: string }): Promise<TrendsOptions> {
  const { from, to } = resolveFilter({ ...query, subgroupSize: 5 })
  const [customers, specs, families] = await Promise.all([
    sequelize.query<{ id: number; name: string }>(
      'SELECT id, name FROM customers WHERE active ORDER BY name',
      { type: QueryTypes.SELECT },
    ),
    sequelize.query<{ id: number; code: string; title: string }>(
      'SELECT id, code, title FROM coating_specs ORDER BY code',
      { type: QueryTypes.SELECT },
    ),
    sequelize.query<{ family: string; parts: number }>(
      `SELECT upper(split_part(part_number, '-', 1)) AS family, count(*)::int AS parts
         FROM parts WHERE created_at >= $1::date AND created_at < $2::date + 1
        GROUP BY 1 ORDER BY 2 DESC, 1 LIMIT 200`,
      { bind: [from, to], type: QueryTypes.SELECT },
    ),
  ])
  return {
    from,
    to,
    lines: LINES.map((value) => ({ value, label: LINE_LABELS[value] })),
    shifts: [...SHIFTS],
    customers,
    specs,
    // The filter accepts only what a family can be (letters and digits up to the first dash).
    families: families.filter((f) => /^[A-Z0-9]{1,20}$/.test(f.family)),
  }
}

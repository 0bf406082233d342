import { readQuery } from './readQuery'
import type {
  ShiftThroughput,
  SpecChoice,
  TrendsReport,
  WeekHolidays,
  WeekYield,
} from '../../../shared/api/trends'
import type { FilterSql } from './trends.filter'

interface SummaryRow {
  weeks: WeekYield[] | null
  holidays: WeekHolidays[] | null
  throughput: ShiftThroughput[] | null
  specs: SpecChoice[] | null
}

/**
 * Weekly first-pass yield, holidays per 100 parts, throughput per week and shift, and the specs
 * with measured parts — one statement and one pass over the filtered parts: a GROUP BY week,
 * shift and spec (at most 53 × 3 × specs rows) that every list is then summed from.
 * Weeks: date_trunc('week') = ISO weeks starting Monday. Holidays: parts.holidays_found_r1,
 * kept by the database from the latest round-1 holiday record (migration 0004); a part without
 * one is not counted as tested.
 */
export async function loadSummary(
  filter: FilterSql,
): Promise<Omit<TrendsReport, 'filter' | 'pareto' | 'thickness'>> {
  const sql = `
    WITH roll AS (
      SELECT date_trunc('week', p.created_at) AS wk, l.shift, l.spec_id,
             count(*)::int AS inspected,
             count(*) FILTER (WHERE p.first_pass_status = 'pass')::int AS passed,
             count(*) FILTER (WHERE p.first_pass_status = 'fail')::int AS failed,
             count(*) FILTER (WHERE p.first_pass_status = 'incomplete')::int AS incomplete,
             count(p.holidays_found_r1)::int AS tested,
             coalesce(sum(p.holidays_found_r1), 0)::int AS found,
             count(p.thickness_mean_um)::int AS measured,
             coalesce(sum(p.coated_area_m2 * p.quantity), 0)::float8 AS area
      ${filter.fromWhere}
      GROUP BY 1, 2, 3
    ),
    weeks AS (
      SELECT wk, sum(inspected)::int AS inspected, sum(passed)::int AS passed,
             sum(failed)::int AS failed, sum(incomplete)::int AS incomplete,
             sum(tested)::int AS tested, sum(found)::int AS found
        FROM roll GROUP BY wk
    ),
    thr AS (SELECT wk, shift, sum(inspected)::int AS parts, sum(area) AS area FROM roll GROUP BY wk, shift),
    specs AS (SELECT spec_id, sum(measured)::int AS measured FROM roll GROUP BY spec_id)
    SELECT
      (SELECT json_agg(json_build_object(
          'weekStart', to_char(wk, 'YYYY-MM-DD'), 'weekLabel', to_char(wk, 'IYYY-"W"IW'),
          'inspected', inspected, 'passed', passed, 'failed', failed, 'incomplete', incomplete,
          'yieldPct', CASE WHEN inspected > 0 THEN passed * 100.0::float8 / inspected END)
        ORDER BY wk) FROM weeks) AS weeks,
      (SELECT json_agg(json_build_object(
          'weekStart', to_char(wk, 'YYYY-MM-DD'), 'weekLabel', to_char(wk, 'IYYY-"W"IW'),
          'partsTested', tested, 'holidaysFound', found,
          'per100Parts', CASE WHEN tested > 0 THEN found * 100.0::float8 / tested END)
        ORDER BY wk) FROM weeks) AS holidays,
      (SELECT json_agg(json_build_object(
          'weekStart', to_char(wk, 'YYYY-MM-DD'), 'weekLabel', to_char(wk, 'IYYY-"W"IW'),
          'shift', shift, 'parts', parts, 'coatedAreaM2', area)
        ORDER BY wk, shift) FROM thr) AS throughput,
      (SELECT json_agg(json_build_object('specId', s.spec_id, 'code', c.code, 'title', c.title,
          'measuredParts', s.measured) ORDER BY s.measured DESC, c.code)
         FROM specs s JOIN coating_specs c ON c.id = s.spec_id WHERE s.measured > 0) AS specs`
  const [row] = await readQuery<SummaryRow>(sql, filter.bind)
  const yieldByWeek = row?.weeks ?? []
  const holidaysByWeek = row?.holidays ?? []
  const throughput = row?.throughput ?? []
  const inspected = yieldByWeek.reduce((s, w) => s + w.inspected, 0)
  const passed = yieldByWeek.reduce((s, w) => s + w.passed, 0)
  return {
    totals: {
      inspected,
      passed,
      yieldPct: inspected > 0 ? (passed * 100) / inspected : null,
      holidaysFound: holidaysByWeek.reduce((s, w) => s + w.holidaysFound, 0),
      coatedAreaM2: throughput.reduce((s, t) => s + t.coatedAreaM2, 0),
    },
    yieldByWeek,
    holidaysByWeek,
    throughput,
    specChoices: row?.specs ?? [],
  }
}

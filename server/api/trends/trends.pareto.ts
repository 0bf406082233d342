import { readQuery } from './readQuery'
import type { ParetoCause } from '../../../shared/api/trends'
import type { FilterSql } from './trends.filter'

/** Words for a failing verdict criterion when no nonconformance names the cause. */
export const CRITERION_CAUSES: Record<string, string> = {
  'surface-prep': 'Surface preparation (verdict)',
  climate: 'Climate out of limits (verdict)',
  thickness: 'Film thickness (verdict)',
  holiday: 'Holidays (verdict)',
  cure: 'Cure (verdict)',
  adhesion: 'Adhesion (verdict)',
}
export const CAUSE_NOT_RECORDED = 'Failed first inspection, cause not recorded'

/**
 * Reject causes, most frequent first, with the cumulative share (window functions over the
 * grouped counts). Reads only parts with a nonconformance or a first-pass failure (the partial
 * index parts_first_pass_fail), never the whole period. One count per part and cause:
 * - every defect type of the nonconformances raised on the part;
 * - a part that failed first pass with no nonconformance: each criterion its stored verdict
 *   fails, or "cause not recorded" when it has been repaired since (the verdict now passes).
 */
export async function loadPareto(filter: FilterSql): Promise<ParetoCause[]> {
  const labels = Object.entries(CRITERION_CAUSES)
  const k = filter.bind.length
  const sql = `
    WITH nc AS (
      SELECT DISTINCT np.part_id, dt.label AS cause
        FROM nonconformance_parts np
        JOIN nonconformances n ON n.id = np.nonconformance_id
        JOIN defect_types dt ON dt.id = n.defect_type_id
        JOIN parts p ON p.id = np.part_id
        JOIN lots l ON l.id = p.lot_id
       WHERE ${filter.where}
    ),
    crit AS (SELECT * FROM unnest($${k + 1}::text[], $${k + 2}::text[]) AS c(criterion, label)),
    fallback AS (
      SELECT p.id AS part_id, coalesce(failing.label, '${CAUSE_NOT_RECORDED}') AS cause
        FROM parts p JOIN lots l ON l.id = p.lot_id
        LEFT JOIN LATERAL (
          SELECT crit.label FROM jsonb_array_elements(p.verdict -> 'criteria') c
            JOIN crit ON crit.criterion = c ->> 'criterion'
           WHERE c ->> 'status' = 'fail'
        ) failing ON true
       WHERE ${filter.where} AND p.first_pass_status = 'fail'
         AND NOT EXISTS (SELECT 1 FROM nc WHERE nc.part_id = p.id)
    ),
    counted AS (
      SELECT cause, 'nonconformance' AS source, count(*)::int AS n FROM nc GROUP BY cause
      UNION ALL
      SELECT cause, 'verdict', count(*)::int FROM fallback GROUP BY cause
    )
    SELECT cause, source, n AS count,
           n * 100.0::float8 / sum(n) OVER () AS pct,
           sum(n) OVER (ORDER BY n DESC, cause, source ROWS UNBOUNDED PRECEDING) * 100.0::float8
             / sum(n) OVER () AS "cumulativePct"
      FROM counted
     ORDER BY n DESC, cause, source`
  return readQuery<ParetoCause>(sql, [
    ...filter.bind,
    labels.map(([c]) => c),
    labels.map(([, l]) => l),
  ])
}

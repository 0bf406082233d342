import { BINS_IN_BAND, CONTROL_CHART_MAX_POINTS } from '../../../shared/api/trends'
import type { FilterSql } from './trends.filter'

/**
 * One statement for the thickness section of one spec: the band of the latest version used, the
 * part-mean statistics (count, avg, stddev_samp, min, max), the subgroup ranges and means, the
 * histogram bin counts and the latest subgroups for the control chart.
 *
 *
 * The histogram layout repeats shared/rules/statistics.ts histogramForBand step by step in
 * float8 (IEEE doubles, like JS): width = (usl − lsl)/bins; whole extra bins below/above (at most
 * 95 each) to hold min and max; bin = floor((v − start)/width + 1e-9), a value at usl in the
 * last band bin, clamped to the ends. Without a spec maximum the top edge is the highest value.
 */
export function thicknessSql(
  filter: FilterSql,
  specId: number,
  subgroupSize: number,
): { sql: string; bind: unknown[] } {
  const s = filter.bind.length + 1
  const n = s + 1
  const bins = BINS_IN_BAND
  const extra = Math.floor((200 - bins) / 2)
  const eps = `'1e-9'::float8`
  const sql = `
    WITH fp AS MATERIALIZED (
      SELECT p.id, p.lot_id, p.created_at, p.thickness_mean_um AS v, l.spec_version
      ${filter.fromWhere} AND l.spec_id = $${s} AND p.thickness_mean_um IS NOT NULL
    ),
    -- One pass for the versions used; everything about versions is read from this tiny list.
    fv AS (SELECT spec_version AS version, count(*)::int AS n FROM fp GROUP BY spec_version),
    latest AS (SELECT max(version) AS version FROM fv),
    band AS (
      SELECT (sv.content #>> '{thickness,minUm}')::float8 AS lsl,
             (sv.content #>> '{thickness,maxUm}')::float8 AS usl
        FROM spec_versions sv JOIN latest ON sv.version = latest.version
       WHERE sv.spec_id = $${s}
    ),
    same_band AS (
      SELECT sv.version, fv.n FROM spec_versions sv JOIN fv ON fv.version = sv.version, band
       WHERE sv.spec_id = $${s}
         AND (sv.content #>> '{thickness,minUm}')::float8 = band.lsl
         AND (sv.content #>> '{thickness,maxUm}')::float8 IS NOT DISTINCT FROM band.usl
    ),
    t AS MATERIALIZED (SELECT fp.* FROM fp WHERE fp.spec_version IN (SELECT version FROM same_band)),
    stats AS (
      SELECT count(*)::int AS n, avg(v) AS mean, stddev_samp(v) AS sd, min(v) AS lo, max(v) AS hi,
             count(*) FILTER (WHERE v < band.lsl)::int AS below_min,
             count(*) FILTER (WHERE v > band.usl)::int AS above_max
        FROM t, band GROUP BY band.lsl, band.usl
    ),
    grouped AS (
      SELECT lot_id, (row_number() OVER (PARTITION BY lot_id ORDER BY created_at, id) - 1) / $${n} AS grp,
             v, created_at
        FROM t
    ),
    sg AS (
      SELECT lot_id, grp, avg(v) AS m, max(v) - min(v) AS r, min(created_at) AS at
        FROM grouped GROUP BY lot_id, grp HAVING count(*) = $${n}
    ),
    lay0 AS (
      SELECT band.lsl, stats.lo, stats.hi,
             CASE WHEN band.usl > band.lsl THEN band.usl ELSE greatest(stats.hi, band.lsl + 1) END AS usl
        FROM band, stats
    ),
    lay1 AS (SELECT lay0.*, (usl - lsl) / ${bins} AS width FROM lay0),
    lay AS (
      SELECT lay1.*, lsl - below * width AS start, below + ${bins} + above AS nbins, below
        FROM lay1,
        LATERAL (SELECT
          least(${extra}, CASE WHEN lo < lsl THEN ceil((lsl - lo) / width - ${eps}) ELSE 0 END)::int AS below,
          least(${extra}, CASE WHEN hi > usl THEN ceil((hi - usl) / width - ${eps}) ELSE 0 END)::int AS above) x
    ),
    binned AS (
      SELECT greatest(0, least(lay.nbins - 1,
               CASE WHEN abs(t.v - lay.usl) <= ${eps} * greatest(1, abs(lay.usl)) THEN lay.below + ${bins} - 1
                    ELSE floor((t.v - lay.start) / lay.width + ${eps})::int END)) AS i
        FROM t, lay
    )
    SELECT
      (SELECT row_to_json(band) FROM band) AS band,
      (SELECT json_agg(version ORDER BY version) FROM same_band) AS versions,
      (SELECT sum(n)::int FROM fv) - (SELECT coalesce(sum(n), 0)::int FROM same_band) AS excluded,
      (SELECT row_to_json(stats) FROM stats) AS stats,
      (SELECT json_build_object('count', count(*)::int, 'rBar', avg(r), 'center', avg(m)) FROM sg) AS sub,
      (SELECT json_build_object('start', start, 'width', width, 'below', below, 'nbins', nbins,
          'usl', usl) FROM lay) AS layout,
      (SELECT json_agg(json_build_object('i', i, 'count', c) ORDER BY i)
         FROM (SELECT i, count(*)::int AS c FROM binned GROUP BY i) b) AS bins,
      (SELECT json_agg(json_build_object('lotNumber', l.lot_number, 'at', x.at, 'meanUm', x.m,
          'rangeUm', x.r) ORDER BY x.at, x.lot_id, x.grp)
         FROM (SELECT * FROM sg ORDER BY at DESC, lot_id DESC, grp DESC LIMIT ${CONTROL_CHART_MAX_POINTS}) x
         JOIN lots l ON l.id = x.lot_id) AS points`
  return { sql, bind: [...filter.bind, specId, subgroupSize] }
}

import { readQuery } from './readQuery'
import { D2_BY_SUBGROUP_SIZE } from '../../../shared/rules/statistics'
import { westernElectricViolations } from '../../../shared/rules/westernElectric'
import {
  BINS_IN_BAND,
  type ControlChart,
  type ControlChartPoint,
  type HistogramBinRow,
  type SpecChoice,
  type ThicknessSection,
} from '../../../shared/api/trends'
import type { FilterSql } from './trends.filter'
import { thicknessSql } from './trends.thickness.sql'
import { capabilityReading, indicesFrom } from './capability'

interface ThicknessRow {
  band: { lsl: number; usl: number | null } | null
  versions: number[] | null
  excluded: number
  stats: {
    n: number
    mean: number
    sd: number | null
    lo: number
    hi: number
    below_min: number
    above_max: number
  } | null
  sub: { count: number; rBar: number | null; center: number | null }
  layout: { start: number; width: number; below: number; nbins: number; usl: number } | null
  bins: { i: number; count: number }[] | null
  points: Omit<ControlChartPoint, 'index'>[] | null
}

const RULE_TEXT: Record<1 | 2 | 3 | 4, string> = {
  1: 'one point beyond 3σ',
  2: '2 of 3 beyond 2σ on one side',
  3: '4 of 5 beyond 1σ on one side',
  4: '8 in a row on one side of the centre line',
}

function histogram(row: ThicknessRow): HistogramBinRow[] {
  const lay = row.layout
  if (!lay) return []
  const counts = new Map((row.bins ?? []).map((b) => [b.i, b.count]))
  // Edges computed exactly as histogramForBand does: start + i × width.
  return Array.from({ length: lay.nbins }, (_, i) => ({
    fromUm: lay.start + i * lay.width,
    toUm: lay.start + (i + 1) * lay.width,
    count: counts.get(i) ?? 0,
    inBand: i >= lay.below && i < lay.below + BINS_IN_BAND,
  }))
}

function controlChart(
  row: ThicknessRow,
  subgroupSize: number,
  sigmaWithin: number | null,
): ControlChart | null {
  const center = row.sub.center
  if (center === null || sigmaWithin === null || !(sigmaWithin > 0)) return null
  const sigmaMeanUm = sigmaWithin / Math.sqrt(subgroupSize)
  const points = (row.points ?? []).map((p, index) => ({ ...p, index }))
  const violations = westernElectricViolations(
    points.map((p) => p.meanUm),
    center,
    sigmaMeanUm,
  ).map((v) => {
    const p = points[v.index]!
    const side = p.meanUm > center ? 'thick side' : 'thin side'
    return {
      index: v.index,
      rule: v.rule,
      lotNumber: p.lotNumber,
      at: p.at,
      meanUm: p.meanUm,
      text: `Rule ${v.rule}: ${RULE_TEXT[v.rule]} (${side})`,
    }
  })
  return {
    subgroupSize,
    centerUm: center,
    sigmaMeanUm,
    uclUm: center + 3 * sigmaMeanUm,
    lclUm: center - 3 * sigmaMeanUm,
    totalSubgroups: row.sub.count,
    points,
    violations,
  }
}

/** The thickness section for one spec: capability from SQL aggregates, histogram, X̄ chart. */
export async function loadThickness(
  filter: FilterSql,
  spec: SpecChoice,
  subgroupSize: number,
): Promise<ThicknessSection | null> {
  const { sql, bind } = thicknessSql(filter, spec.specId, subgroupSize)
  const [row] = await readQuery<ThicknessRow>(sql, bind)
  if (!row?.band || !row.stats || row.stats.n === 0) return null
  const { lsl, usl } = row.band
  const st = row.stats
  const d2 = D2_BY_SUBGROUP_SIZE[subgroupSize]!
  const rBar = row.sub.count > 0 ? row.sub.rBar : null
  const sigmaWithinUm = rBar === null ? null : rBar / d2
  const sigmaOverallUm = st.n >= 2 ? st.sd : null
  const within = indicesFrom(st.mean, sigmaWithinUm, lsl, usl)
  const overall = indicesFrom(st.mean, sigmaOverallUm, lsl, usl)
  return {
    specId: spec.specId,
    specCode: spec.code,
    specTitle: spec.title,
    versions: row.versions ?? [],
    excludedOtherBand: row.excluded,
    lslUm: lsl,
    uslUm: usl,
    n: st.n,
    meanUm: st.mean,
    minUm: st.lo,
    maxUm: st.hi,
    belowMin: st.below_min,
    aboveMax: st.above_max,
    sigmaOverallUm,
    subgroupSize,
    subgroupCount: row.sub.count,
    rBarUm: rBar,
    sigmaWithinUm,
    d2,
    within,
    overall,
    reading: capabilityReading({
      n: st.n,
      meanUm: st.mean,
      lslUm: lsl,
      uslUm: usl,
      within,
      overall,
    }),
    histogram: histogram(row),
    histogramOpenTop: !(usl !== null && usl > lsl),
    controlChart: controlChart(row, subgroupSize, sigmaWithinUm),
  }
}

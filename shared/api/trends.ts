import { z } from 'zod'
import { isoDateSchema } from './isoDate'
import { LINES, SHIFTS, type Line, type Shift } from './lots'
import type { Role } from './roles'

/**
 * Line health (trends) for plant managers. Routes (TRENDS_ROLES only):
 *   GET /api/trends?from&to&line&shift&specId&customerId&family&subgroupSize   TrendsReport
 *   GET /api/trends/options?from&to                                            TrendsOptions
 *   GET /api/trends/export.csv?<same filters>        one row per inspected part, text/csv
 *
 * Definitions (the page says them too):
 * - A part is "inspected" in the week of `parts.created_at` (the moment it was booked for
 *   inspection), in the database server's time zone; weeks are ISO weeks starting Monday.
 *   Only parts with a first-pass status are counted (the verdict at the end of round 1).
 * - First-pass yield = parts whose first_pass_status is 'pass' ÷ parts inspected.
 * - Part family = the part number up to its first dash, upper case ("VB-150-FL" → "VB").
 * - Pareto: one count per part and cause. Causes are the defect types of the nonconformances
 *   raised on the part; a part that failed first pass without any nonconformance counts under
 *   the criteria its stored verdict fails (or "cause not recorded").
 * - Thickness is the part mean (thickness_mean_um) for one spec at a time; parts of spec
 *   versions whose band differs from the latest version's band are left out (and counted).
 *   Pp/Ppk: overall sample sd (n − 1) of the part means. Cp/Cpk: within-subgroup σ̂ = R̄/d₂,
 *   subgroups = consecutive runs of `subgroupSize` parts of one lot in time order; the parts
 *   left over at the end of a lot count for mean, Pp/Ppk and histogram but not for R̄.
 * - Control chart: X̄ of those subgroups in time order, centre X̄̄, limits X̄̄ ± 3σ̂/√n; Western
 *   Electric rules run on the points shown (the latest CONTROL_CHART_MAX_POINTS subgroups).
 */
export const TRENDS_ROLES: Role[] = ['supervisor', 'manager', 'admin']

/** Default period: the last 13 weeks (a quarter) up to today. */
export const DEFAULT_PERIOD_DAYS = 91
/** The histogram puts this many equal bins between the spec minimum and maximum. */
export const BINS_IN_BAND = 10
export const CONTROL_CHART_MAX_POINTS = 200
/** Longest period one request may ask for (a little over two years). */
export const MAX_PERIOD_DAYS = 800

const isoDate = isoDateSchema

export const trendsFilterSchema = z
  .object({
    from: isoDate.optional(),
    to: isoDate.optional(),
    line: z.enum(LINES).optional(),
    shift: z.enum(SHIFTS).optional(),
    specId: z.coerce.number().int().positive().max(2147483647).optional(),
    customerId: z.coerce.number().int().positive().max(2147483647).optional(),
    family: z
      .string()
      .trim()
      .toUpperCase()
      .regex(/^[A-Z0-9]{1,20}$/, 'A part family is the part number up to its first dash')
      .optional(),
    subgroupSize: z.coerce.number().int().min(2).max(10).default(5),
  })
  .refine((f) => !f.from || !f.to || f.from <= f.to, {
    message: 'The period must end on or after its start',
    path: ['to'],
  })
export type TrendsFilterInput = z.input<typeof trendsFilterSchema>
export type TrendsFilter = z.output<typeof trendsFilterSchema>

export const trendsOptionsQuerySchema = z.object({
  from: isoDate.optional(),
  to: isoDate.optional(),
})

/** The filters as the server applied them: the period always resolved. */
export interface ResolvedTrendsFilter extends Omit<TrendsFilter, 'from' | 'to'> {
  from: string
  to: string
}

export interface WeekYield {
  /** Monday of the ISO week, YYYY-MM-DD. */
  weekStart: string
  /** e.g. "2025-W07". */
  weekLabel: string
  inspected: number
  passed: number
  failed: number
  /** Round 1 not finished (first_pass_status 'incomplete'). */
  incomplete: number
  /** passed ÷ inspected × 100; null when nothing was inspected. */
  yieldPct: number | null
}

export interface ParetoCause {
  cause: string
  source: 'nonconformance' | 'verdict'
  /** Parts with this cause. */
  count: number
  pct: number
  cumulativePct: number
}

export interface WeekHolidays {
  weekStart: string
  weekLabel: string
  /** Parts with a round-1 holiday record. */
  partsTested: number
  holidaysFound: number
  /** holidaysFound ÷ partsTested × 100; null without tested parts. */
  per100Parts: number | null
}

export interface ShiftThroughput {
  weekStart: string
  weekLabel: string
  shift: Shift
  parts: number
  /** Sum of coated area × quantity, m²; parts without an area add nothing. */
  coatedAreaM2: number
}

export interface HistogramBinRow {
  fromUm: number
  toUm: number
  count: number
  inBand: boolean
}

export interface ControlChartPoint {
  /** Position among the points shown, 0-based (the index the rule list refers to). */
  index: number
  lotNumber: string
  /** Time of the subgroup's first part, ISO. */
  at: string
  meanUm: number
  rangeUm: number
}

export interface RuleViolationRow {
  index: number
  rule: 1 | 2 | 3 | 4
  lotNumber: string
  at: string
  meanUm: number
  /** Plain words: "2 of 3 beyond 2σ, thick side". */
  text: string
}

export interface ControlChart {
  subgroupSize: number
  centerUm: number
  /** σ of a subgroup mean: σ̂ within ÷ √n. */
  sigmaMeanUm: number
  uclUm: number
  lclUm: number
  totalSubgroups: number
  points: ControlChartPoint[]
  violations: RuleViolationRow[]
}

export interface CapabilityIndices {
  cp: number | null
  cpk: number | null
  cpl: number | null
  cpu: number | null
}

export interface ThicknessSection {
  specId: number
  specCode: string
  specTitle: string
  /** Versions whose band is the one shown. */
  versions: number[]
  /** Measured parts left out because their spec version had another band. */
  excludedOtherBand: number
  lslUm: number
  /** null: the spec sets no maximum (one-sided: only Cpl / Ppl). */
  uslUm: number | null
  n: number
  meanUm: number
  minUm: number
  maxUm: number
  belowMin: number
  aboveMax: number
  /** Overall sample sd (n − 1), for Pp/Ppk. null when n < 2. */
  sigmaOverallUm: number | null
  subgroupSize: number
  subgroupCount: number
  rBarUm: number | null
  /** R̄ / d₂, for Cp/Cpk. null without full subgroups. */
  sigmaWithinUm: number | null
  d2: number
  /** From σ within. */
  within: CapabilityIndices
  /** From σ overall: pp = cp, ppk = cpk, ppl = cpl, ppu = cpu of this object. */
  overall: CapabilityIndices
  /** Plain-language reading, one sentence each. */
  reading: string[]
  histogram: HistogramBinRow[]
  /** The histogram's right end is the highest value seen, not a spec maximum. */
  histogramOpenTop: boolean
  controlChart: ControlChart | null
}

export interface SpecChoice {
  specId: number
  code: string
  title: string
  measuredParts: number
}

export interface TrendsReport {
  filter: ResolvedTrendsFilter
  totals: {
    inspected: number
    passed: number
    yieldPct: number | null
    holidaysFound: number
    coatedAreaM2: number
  }
  yieldByWeek: WeekYield[]
  pareto: ParetoCause[]
  holidaysByWeek: WeekHolidays[]
  throughput: ShiftThroughput[]
  /** Specs with measured parts in the filter, most parts first: the thickness section picks one. */
  specChoices: SpecChoice[]
  /** null when no part of the chosen spec has a mean thickness. */
  thickness: ThicknessSection | null
}

export interface TrendsOptions {
  from: string
  to: string
  lines: { value: Line; label: string }[]
  shifts: Shift[]
  customers: { id: number; name: string }[]
  specs: { id: number; code: string; title: string }[]
  /** Part families seen in the period, with their part counts. */
  families: { family: string; parts: number }[]
}

/** The CSV's columns, in order (export.csv). */
export const TRENDS_CSV_COLUMNS = [
  'inspected_at',
  'week',
  'lot_number',
  'line',
  'shift',
  'customer',
  'spec',
  'spec_version',
  'part_number',
  'part_family',
  'description',
  'heat_number',
  'quantity',
  'coated_area_m2',
  'round',
  'first_pass_status',
  'current_status',
  'thickness_mean_um',
  'holidays_found_round1',
] as const

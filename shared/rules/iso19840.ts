/**
 * Dry film thickness on rough surfaces by ISO 19840 (TRADE.md §2). Acceptance unless otherwise
 * agreed [R]: mean ≥ NDFT; every reading ≥ 80 % of NDFT; readings below NDFT (necessarily
 * between 80 % and 100 %) under 20 % of all readings — editions differ on exactly 20 %, so
 * `allowExactly20Pct` is a setting (spec field `isoAllowExactly20Pct`); every reading ≤ the
 * specified maximum, 3 × NDFT when none is given [P].
 */
import { atLeast, atMost, mean, RuleInputError, requireArray, requirePositive } from './errors'
import { requireRange, requireThicknessUm, MAX_THICKNESS_UM } from './errors'
import { formatPct, formatUm, plural, type DisplayUnit } from './format'

export const ISO19840_MIN_NDFT_UM = 40
export const ISO19840_DEFAULT_MAX_FACTOR = 3
export const ISO19840_FLOOR_FACTOR = 0.8
export const ISO19840_MAX_BELOW_NOMINAL_SHARE = 0.2

/** Profile correction values when the gauge was adjusted on smooth steel [M — a setting]. */
export const ISO19840_PROFILE_CORRECTION_UM = {
  fine: 10,
  medium: 25,
  coarse: 40,
  unknown: 25,
} as const
export type ProfileGradeIso = keyof typeof ISO19840_PROFILE_CORRECTION_UM

export function iso19840ProfileCorrectionUm(profile: ProfileGradeIso): number {
  const v = ISO19840_PROFILE_CORRECTION_UM[profile]
  if (v === undefined)
    throw new RuleInputError('profile', 'must be fine, medium, coarse or unknown')
  return v
}

/**
 * Minimum readings per inspection area [M — a setting]: ≤ 1 m² → 5; > 1–3 → 10; > 3–10 → 15;
 * > 10–30 → 20; > 30–100 → 30; then +10 per additional 100 m² or part of it.
 */
export function iso19840MinReadings(inspectionAreaM2: number): number {
  const a = requirePositive(inspectionAreaM2, 'inspectionAreaM2', 1e8, ' m²')
  const steps: [number, number][] = [
    [1, 5],
    [3, 10],
    [10, 15],
    [30, 20],
    [100, 30],
  ]
  for (const [limit, readings] of steps) if (atMost(a, limit)) return readings
  return 30 + 10 * Math.ceil((a - 100) / 100 - 1e-9)
}

export interface Iso19840Input {
  nominalUm: number
  maxUm?: number | null
  readingsUm: number[]
  /** true = "at most 20 %" below nominal allowed; false (default) = "under 20 %". */
  allowExactly20Pct?: boolean
  /** Subtracted from every reading (gauge adjusted on smooth steel); default 0. */
  profileCorrectionUm?: number
  /** When given, fewer readings than the ISO 19840 table asks for make the result incomplete. */
  inspectionAreaM2?: number
  displayUnit?: DisplayUnit
}

export interface Iso19840Result {
  pass: boolean
  status: 'pass' | 'fail' | 'incomplete'
  meanUm: number
  minUm: number
  maxUm: number
  belowNominalShare: number
  maxAllowedUm: number
  floorUm: number
  requiredReadings: number | null
  /** false when NDFT < 40 µm: the criteria are still applied, and a reason says so. */
  inScope: boolean
  reasons: string[]
}

/**
 * ISO 19840 verdict. minUm/maxUm/meanUm are of the (corrected) readings. Readings are judged as a
 * set, so the order never matters. `reasons` lists failures, plus a scope note when NDFT < 40 µm
 * (the standard does not cover such films; the criteria are applied as the agreed method).
 */
export function evaluateIso19840(input: Iso19840Input): Iso19840Result {
  const nominal = requirePositive(input.nominalUm, 'nominalUm', MAX_THICKNESS_UM, ' µm')
  const maxAllowedUm =
    input.maxUm === undefined || input.maxUm === null
      ? ISO19840_DEFAULT_MAX_FACTOR * nominal
      : requireThicknessUm(input.maxUm, 'maxUm')
  if (maxAllowedUm < nominal) throw new RuleInputError('maxUm', 'must not be below nominalUm')
  const correction = requireRange(
    input.profileCorrectionUm ?? 0,
    'profileCorrectionUm',
    0,
    200,
    ' µm',
  )
  const raw = requireArray<number>(input.readingsUm, 'readingsUm')
  raw.forEach((r, i) => requireThicknessUm(r, `readingsUm[${i}]`))
  const readings = raw.map((r) => Math.max(0, r - correction))
  const f = (um: number) => formatUm(um, input.displayUnit ?? 'um')
  const floorUm = ISO19840_FLOOR_FACTOR * nominal
  const reasons: string[] = []
  const inScope = atLeast(nominal, ISO19840_MIN_NDFT_UM)
  if (!inScope) {
    reasons.push(
      `Nominal ${f(nominal)} is below 40 µm, outside the scope of ISO 19840; its acceptance ` +
        'criteria were applied as the agreed method.',
    )
  }
  const requiredReadings =
    input.inspectionAreaM2 === undefined ? null : iso19840MinReadings(input.inspectionAreaM2)
  const n = readings.length
  const meanUm = mean(readings)
  const minUm = n ? readings.reduce((a, b) => Math.min(a, b)) : Number.NaN
  const maxUm = n ? readings.reduce((a, b) => Math.max(a, b)) : Number.NaN
  const belowCount = readings.filter((r) => !atLeast(r, nominal)).length
  const belowNominalShare = n ? belowCount / n : Number.NaN
  let fail = false
  if (n > 0) {
    if (!atLeast(meanUm, nominal)) {
      fail = true
      reasons.push(`Mean ${f(meanUm)} is ${f(nominal - meanUm)} below the nominal ${f(nominal)}.`)
    }
    const underFloor = readings.filter((r) => !atLeast(r, floorUm))
    if (underFloor.length) {
      fail = true
      reasons.push(
        `${plural(underFloor.length, 'reading')} below 80 % of nominal (${f(floorUm)}); lowest ${f(minUm)}, ` +
          `${f(floorUm - minUm)} short.`,
      )
    }
    // Integer comparison: count/n < 0.2 ⇔ 5·count < n, exact at the 20 % edge.
    const shareOk = input.allowExactly20Pct ? belowCount * 5 <= n : belowCount * 5 < n
    if (!shareOk) {
      fail = true
      reasons.push(
        `${belowCount} of ${n} readings (${formatPct(belowNominalShare)}) are below nominal; ` +
          (input.allowExactly20Pct ? 'at most 20 % is allowed.' : 'under 20 % is allowed.'),
      )
    }
    const overMax = readings.filter((r) => !atMost(r, maxAllowedUm))
    if (overMax.length) {
      fail = true
      reasons.push(
        `${plural(overMax.length, 'reading')} above the maximum ${f(maxAllowedUm)}; highest ${f(maxUm)}, ` +
          `${f(maxUm - maxAllowedUm)} over.`,
      )
    }
  } else {
    reasons.push('No thickness readings recorded.')
  }
  const short = n === 0 || (requiredReadings !== null && n < requiredReadings)
  if (requiredReadings !== null && n < requiredReadings && n > 0) {
    reasons.push(`${n} of ${requiredReadings} readings required for this inspection area.`)
  }
  const status = fail ? 'fail' : short ? 'incomplete' : 'pass'
  return {
    pass: status === 'pass',
    status,
    meanUm,
    minUm,
    maxUm,
    belowNominalShare,
    maxAllowedUm,
    floorUm,
    requiredReadings,
    inScope,
    reasons,
  }
}

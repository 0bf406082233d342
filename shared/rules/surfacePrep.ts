/**
 * Surface preparation (TRADE.md §4).
 * - Cleanliness: SSPC ⇄ ISO 8501-1 pairs ordered least → most thorough (CLEANLINESS_GRADES,
 *   specContent.ts) [R]; a recorded grade meets a required one when it is at least as thorough.
 * - Profile by ASTM D4417 [R]: A comparator, B depth micrometer, C replica tape. Replica tape:
 *   subtract the 2.0 mil (50.8 µm) backing; Coarse 0.8–2.5 mil, X-Coarse 1.5–4.5 mil [R]; in the
 *   1.5–2.5 mil overlap the older procedure re-tests with the other grade and averages when both
 *   read inside it (a setting: spec `replicaOverlapRetest`) [R].
 * - Location value: A = mean of the comparator readings; B = the largest of the location's
 *   readings (D4417 Method B reports the maximum [M]); C = mean of the tape readings.
 * - Band check [P]: every location value must lie inside the spec's profile min–max.
 */
import { CLEANLINESS_GRADES, type CleanlinessGrade } from '../spec/specContent'
import { atLeast, atMost, mean, RuleInputError, requireThicknessUm } from './errors'
import { formatUm } from './format'
import { milsToMicrons } from './units'

export type ProfileMethod = 'A-comparator' | 'B-depth-micrometer' | 'C-replica-tape'
export type ReplicaTapeGrade = 'coarse' | 'x-coarse'

export const REPLICA_BACKING_UM = milsToMicrons(2.0)
export const REPLICA_RANGES_UM: Record<ReplicaTapeGrade, { min: number; max: number }> = {
  coarse: { min: milsToMicrons(0.8), max: milsToMicrons(2.5) },
  'x-coarse': { min: milsToMicrons(1.5), max: milsToMicrons(4.5) },
}
export const REPLICA_OVERLAP_UM = {
  min: milsToMicrons(1.5),
  max: milsToMicrons(2.5),
}

export function cleanlinessRank(grade: CleanlinessGrade): number {
  const i = CLEANLINESS_GRADES.indexOf(grade)
  if (i < 0) throw new RuleInputError('grade', `unknown cleanliness grade ${String(grade)}`)
  return i
}

/** True when `recorded` is at least as thorough as `required` (e.g. SP 5/Sa 3 meets SP 10/Sa 2½). */
export function cleanlinessMeets(required: CleanlinessGrade, recorded: CleanlinessGrade): boolean {
  return cleanlinessRank(recorded) >= cleanlinessRank(required)
}

/** Replica tape: profile = micrometer reading − 2.0 mil backing. */
export function replicaProfileUm(micrometerReadingUm: number): number {
  return requireThicknessUm(micrometerReadingUm, 'micrometerReadingUm') - REPLICA_BACKING_UM
}

export interface ProfileLocationInput {
  /** µm as read: comparator value, depth-micrometer readings, or replica micrometer readings (with backing). */
  readingsUm: number[]
  /** Method C: grade of tape used for `readingsUm`; default coarse. */
  tapeGrade?: ReplicaTapeGrade
  /** Method C: re-test readings with the other grade (overlap rule). */
  retestReadingsUm?: number[]
}

export interface ProfileLocationResult {
  valueUm: number | null
  status: 'pass' | 'fail' | 'incomplete'
  note: string
}

function replicaLocation(loc: ProfileLocationInput, overlapRetest: boolean, field: string) {
  const grade = loc.tapeGrade ?? 'coarse'
  const other: ReplicaTapeGrade = grade === 'coarse' ? 'x-coarse' : 'coarse'
  const profile = (rs: number[], name: string) =>
    mean(rs.map((r, i) => replicaProfileUm(requireThicknessUm(r, `${field}.${name}[${i}]`))))
  const inRange = (v: number, r: { min: number; max: number }) =>
    atLeast(v, r.min) && atMost(v, r.max)
  const first = profile(loc.readingsUm, 'readingsUm')
  const retest = loc.retestReadingsUm ?? []
  const second = retest.length ? profile(retest, 'retestReadingsUm') : null
  if (!inRange(first, REPLICA_RANGES_UM[grade])) {
    // A tape read outside its own grade's range is not a measurement: the other grade decides.
    if (second !== null && inRange(second, REPLICA_RANGES_UM[other])) {
      return {
        valueUm: second,
        note: `${grade} tape out of range; ${other} re-test used.`,
      }
    }
    return {
      valueUm: null,
      note: `${formatUm(first, 'mil')} is outside the ${grade} tape range: re-test with ${other}.`,
    }
  }
  if (!overlapRetest || !inRange(first, REPLICA_OVERLAP_UM)) return { valueUm: first, note: '' }
  if (second === null) {
    return {
      valueUm: null,
      note: `${formatUm(first, 'mil')} is in the 1.5–2.5 mil overlap: re-test with ${other} tape.`,
    }
  }
  if (inRange(second, REPLICA_OVERLAP_UM))
    return {
      valueUm: (first + second) / 2,
      note: 'Overlap: both tape grades averaged.',
    }
  // The re-test lies outside the overlap: trust it only inside its own grade's range.
  if (!inRange(second, REPLICA_RANGES_UM[other]))
    return { valueUm: first, note: `Overlap: ${grade} reading kept.` }
  return { valueUm: second, note: `Overlap: ${other} re-test used.` }
}

/** Value of one profile location by the D4417 method (see file header). */
export function profileLocationValueUm(
  method: ProfileMethod,
  loc: ProfileLocationInput,
  overlapRetest = false,
  field = 'profileLocation',
): { valueUm: number | null; note: string } {
  if (!Array.isArray(loc.readingsUm) || loc.readingsUm.length === 0) {
    return { valueUm: null, note: 'No readings at this location.' }
  }
  if (method === 'C-replica-tape') return replicaLocation(loc, overlapRetest, field)
  const values = loc.readingsUm.map((r, i) => requireThicknessUm(r, `${field}.readingsUm[${i}]`))
  if (method === 'B-depth-micrometer') return { valueUm: Math.max(...values), note: '' }
  if (method === 'A-comparator') return { valueUm: mean(values), note: '' }
  throw new RuleInputError('profileMethod', `unknown method ${String(method)}`)
}

export interface ProfileBandResult {
  status: 'pass' | 'fail' | 'incomplete'
  meanUm: number
  minUm: number
  maxUm: number
  locations: ProfileLocationResult[]
  reasons: string[]
}

/** Profile band check: every location inside min–max; at least one location. */
export function evaluateProfile(
  method: ProfileMethod,
  locations: ProfileLocationInput[],
  band: { minUm: number; maxUm: number },
  overlapRetest = false,
): ProfileBandResult {
  const reasons: string[] = []
  const results = locations.map((loc, i): ProfileLocationResult => {
    const { valueUm, note } = profileLocationValueUm(
      method,
      loc,
      overlapRetest,
      `profileLocations[${i}]`,
    )
    if (valueUm === null) {
      reasons.push(`Profile location ${i + 1}: ${note}`)
      return { valueUm, status: 'incomplete', note }
    }
    if (!atLeast(valueUm, band.minUm) || !atMost(valueUm, band.maxUm)) {
      const low = valueUm < band.minUm
      const by = low ? band.minUm - valueUm : valueUm - band.maxUm
      reasons.push(
        `Profile location ${i + 1}: ${formatUm(valueUm, 'mil')} is ${formatUm(by)} ${low ? 'below' : 'above'} ` +
          `the ${formatUm(band.minUm, 'mil')} – ${formatUm(band.maxUm, 'mil')} band.`,
      )
      return { valueUm, status: 'fail', note }
    }
    return { valueUm, status: 'pass', note }
  })
  const values = results.map((r) => r.valueUm).filter((v): v is number => v !== null)
  if (locations.length === 0) reasons.push('No profile readings recorded.')
  const status = results.some((r) => r.status === 'fail')
    ? 'fail'
    : locations.length === 0 || results.some((r) => r.status === 'incomplete')
      ? 'incomplete'
      : 'pass'
  return {
    status,
    meanUm: mean(values),
    minUm: values.length ? Math.min(...values) : Number.NaN,
    maxUm: values.length ? Math.max(...values) : Number.NaN,
    locations: results,
    reasons,
  }
}

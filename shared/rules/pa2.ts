/**
 * Dry film thickness by SSPC-PA 2 (TRADE.md §1).
 * - spot measurement = mean of ≥ 3 gauge readings in a 1.5 in (4 cm) circle [R];
 * - area measurement = 5 spot measurements per 100 ft² (10 m²) [R];
 * - individual gauge readings are not restricted; each area mean must be inside the specified
 *   min–max; each spot mean inside the restriction level's limits [R].
 */
import { atLeast, atMost, mean, requirePositive, requireRange, requireThicknessUm } from './errors'
import { RuleInputError } from './errors'
import { formatUm, type DisplayUnit } from './format'

export type Pa2Level = 1 | 2 | 3 | 4 | 5
export const PA2_DEFAULT_LEVEL: Pa2Level = 3
export const PA2_MIN_READINGS_PER_SPOT = 3
export const PA2_SPOTS_PER_AREA = 5

/**
 * Restriction levels as fractions of the specified min / max [M — from memory; the spec picks
 * the level]: L1 100/100, L2 100/120, L3 80/120 (PA 2 default), L4 80/150, L5 80/no maximum.
 */
export const PA2_LEVEL_FACTORS: Record<Pa2Level, { min: number; max: number | null }> = {
  1: { min: 1, max: 1 },
  2: { min: 1, max: 1.2 },
  3: { min: 0.8, max: 1.2 },
  4: { min: 0.8, max: 1.5 },
  5: { min: 0.8, max: null },
}

/**
 * SSPC-PA 2 number of 100 ft² areas to measure [R]: < 300 ft² → one per 100 ft² or part
 * (ceil(A/100)); 300–1,000 ft² → 3; > 1,000 ft² → 3 plus 1 per further 1,000 ft² or part.
 * 2,800 ft² → 5; 28,000 ft² → 30. A part far under 100 ft² is one area.
 */
export function pa2AreaCount(coatedAreaFt2: number): number {
  const a = requirePositive(coatedAreaFt2, 'coatedAreaFt2', 1e9, ' ft²')
  // The small tolerance keeps 200 ft² that went through m² and back from becoming 3 areas.
  const ceilTol = (x: number) => Math.ceil(x - 1e-9)
  if (a < 300) return Math.max(1, ceilTol(a / 100))
  if (a <= 1000) return 3
  return 3 + ceilTol((a - 1000) / 1000)
}

function requireLevel(level: unknown): Pa2Level {
  if (level === 1 || level === 2 || level === 3 || level === 4 || level === 5) return level
  throw new RuleInputError('level', `must be one of 1, 2, 3, 4, 5 (got ${String(level)})`)
}

/** Spot limits for a restriction level. Level 5 has no spot maximum (spotMaxUm = null). */
export function pa2SpotLimits(
  minUm: number,
  maxUm: number | null,
  level: Pa2Level,
): { spotMinUm: number; spotMaxUm: number | null } {
  const min = requireThicknessUm(minUm, 'minUm')
  const max = maxUm === null ? null : requireThicknessUm(maxUm, 'maxUm')
  if (max !== null && max < min) throw new RuleInputError('maxUm', 'must not be below minUm')
  const f = PA2_LEVEL_FACTORS[requireLevel(level)]
  return {
    spotMinUm: min * f.min,
    spotMaxUm: f.max === null || max === null ? null : max * f.max,
  }
}

/** ASTM D7091 type 1 gauge: the base metal reading is the mean of ~10 bare-substrate readings. */
export function baseMetalReadingUm(bareReadingsUm: number[]): number {
  if (!Array.isArray(bareReadingsUm) || bareReadingsUm.length === 0) {
    throw new RuleInputError('baseMetalReadingsUm', 'needs at least one bare-substrate reading')
  }
  bareReadingsUm.forEach((r, i) => requireThicknessUm(r, `baseMetalReadingsUm[${i}]`))
  return mean(bareReadingsUm)
}

/** Subtract the BMR from type-1 readings; a reading below the BMR counts as 0 µm of film. */
export function subtractBaseMetalReading(readingsUm: number[], bmrUm: number): number[] {
  requireRange(bmrUm, 'baseMetalReadingUm', 0, 1000, ' µm')
  return readingsUm.map((r) => Math.max(0, r - bmrUm))
}

export type Pa2Status = 'pass' | 'fail' | 'incomplete'

export interface Pa2SpotResult {
  meanUm: number
  pass: boolean
  status: Pa2Status
  readingCount: number
}

export interface Pa2AreaResult {
  meanUm: number
  pass: boolean
  status: Pa2Status
  spots: Pa2SpotResult[]
}

export interface Pa2Input {
  minUm: number
  maxUm: number | null
  level?: Pa2Level
  /** areas → spots → gauge readings, µm (BMR already subtracted). */
  areas: number[][][]
  /** Spots an area needs before its mean counts; default 1 (evaluatePart passes 5). */
  spotsPerArea?: number
  displayUnit?: DisplayUnit
}

export interface Pa2Result {
  pass: boolean
  status: Pa2Status
  reasons: string[]
  spotMinUm: number
  spotMaxUm: number | null
  areas: Pa2AreaResult[]
}

/**
 * SSPC-PA 2 conformance. A spot with fewer than 3 readings is 'incomplete' (never a pass); an
 * area is judged on the mean of its complete spots once it has `spotsPerArea` of them. Level 5
 * (or a spec with no maximum) has no upper spot limit and no upper area limit. Each failure reason
 * names the area and spot (1-based) and by how much it missed. `reasons` is empty on a pass.
 */
export function evaluatePa2(input: Pa2Input): Pa2Result {
  const level = requireLevel(input.level ?? PA2_DEFAULT_LEVEL)
  const maxUm = input.maxUm ?? null
  const { spotMinUm, spotMaxUm } = pa2SpotLimits(input.minUm, maxUm, level)
  const minUm = input.minUm
  const unit = input.displayUnit ?? 'um'
  const spotsPerArea = input.spotsPerArea ?? 1
  if (!Array.isArray(input.areas)) throw new RuleInputError('areas', 'must be a list of areas')
  const reasons: string[] = []
  const f = (um: number) => formatUm(um, unit)
  const areas = input.areas.map((spots, a) => {
    if (!Array.isArray(spots)) throw new RuleInputError(`areas[${a}]`, 'must be a list of spots')
    const spotResults = spots.map((readings, s): Pa2SpotResult => {
      if (!Array.isArray(readings)) throw new RuleInputError(`areas[${a}][${s}]`, 'must be a list')
      readings.forEach((r, i) => requireThicknessUm(r, `areas[${a}][${s}][${i}]`))
      const m = mean(readings)
      const where = `Area ${a + 1}, spot ${s + 1}`
      if (readings.length < PA2_MIN_READINGS_PER_SPOT) {
        reasons.push(
          `${where}: ${readings.length} of ${PA2_MIN_READINGS_PER_SPOT} gauge readings taken.`,
        )
        return {
          meanUm: m,
          pass: false,
          status: 'incomplete',
          readingCount: readings.length,
        }
      }
      let ok = true
      if (!atLeast(m, spotMinUm)) {
        ok = false
        reasons.push(
          `${where}: mean ${f(m)} is ${f(spotMinUm - m)} below the spot minimum ${f(spotMinUm)} (level ${level}).`,
        )
      }
      if (spotMaxUm !== null && !atMost(m, spotMaxUm)) {
        ok = false
        reasons.push(
          `${where}: mean ${f(m)} is ${f(m - spotMaxUm)} above the spot maximum ${f(spotMaxUm)} (level ${level}).`,
        )
      }
      return {
        meanUm: m,
        pass: ok,
        status: ok ? 'pass' : 'fail',
        readingCount: readings.length,
      }
    })
    const complete = spotResults.filter((s) => s.status !== 'incomplete')
    const areaMean = mean(complete.map((s) => s.meanUm))
    let status: Pa2Status = spotResults.some((s) => s.status === 'fail') ? 'fail' : 'pass'
    if (complete.length < Math.max(1, spotsPerArea)) {
      if (status !== 'fail') status = 'incomplete'
      reasons.push(
        `Area ${a + 1}: ${complete.length} of ${Math.max(1, spotsPerArea)} spot measurements complete.`,
      )
    } else {
      if (!atLeast(areaMean, minUm)) {
        status = 'fail'
        reasons.push(
          `Area ${a + 1}: mean ${f(areaMean)} is ${f(minUm - areaMean)} below the specified minimum ${f(minUm)}.`,
        )
      }
      if (maxUm !== null && !atMost(areaMean, maxUm)) {
        status = 'fail'
        reasons.push(
          `Area ${a + 1}: mean ${f(areaMean)} is ${f(areaMean - maxUm)} above the specified maximum ${f(maxUm)}.`,
        )
      }
      if (spotResults.some((s) => s.status === 'incomplete') && status === 'pass')
        status = 'incomplete'
    }
    return {
      meanUm: areaMean,
      pass: status === 'pass',
      status,
      spots: spotResults,
    }
  })
  let status: Pa2Status = areas.some((a) => a.status === 'fail') ? 'fail' : 'pass'
  if (status === 'pass' && (areas.length === 0 || areas.some((a) => a.status === 'incomplete'))) {
    status = 'incomplete'
  }
  if (areas.length === 0) reasons.push('No thickness areas recorded.')
  return {
    pass: status === 'pass',
    status,
    reasons,
    spotMinUm,
    spotMaxUm,
    areas,
  }
}

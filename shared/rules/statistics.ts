/**
 * Descriptive statistics and process capability (TRADE.md §8).
 * Cp = (USL − LSL)/6σ; Cpk = min(Cpu, Cpl); Cpu = (USL − μ)/3σ; Cpl = (μ − LSL)/3σ [R].
 * Which σ:
 * - `capability()` (and Pp/Ppk everywhere) uses the overall sample standard deviation (n − 1) of
 *   all values — strictly these are the "performance" indices, reported under the Cp names.
 * - `subgroupCapability()` reports Cp/Cpk from the within-subgroup σ̂ = R̄/d₂ and Pp/Ppk from
 *   the overall sample sd. d₂ for subgroup size 2…5 = 1.128, 1.693, 2.059, 2.326 [M]; 6…10 from
 *   the same control-chart table [M].
 * An index is left undefined when σ = 0 or n < 2 (no spread to judge), or when its limit is absent.
 * With one limit only, cpk is the one-sided index.
 */
import { mean, RuleInputError, requireFinite } from './errors'

export const D2_BY_SUBGROUP_SIZE: Record<number, number> = {
  2: 1.128,
  3: 1.693,
  4: 2.059,
  5: 2.326,
  6: 2.534,
  7: 2.704,
  8: 2.847,
  9: 2.97,
  10: 3.078,
}

function checkValues(values: number[], field: string): void {
  if (!Array.isArray(values) || values.length === 0)
    throw new RuleInputError(field, 'needs at least one value')
  values.forEach((v, i) => requireFinite(v, `${field}[${i}]`))
}

/** Sample standard deviation (n − 1); NaN for fewer than 2 values. */
export function sampleSd(values: number[]): number {
  if (values.length < 2) return Number.NaN
  const m = mean(values)
  let ss = 0
  for (const v of values) ss += (v - m) ** 2
  return Math.sqrt(ss / (values.length - 1))
}

export interface Indices {
  cp?: number
  cpk?: number
  cpl?: number
  cpu?: number
}

/**
 * A spread below a billionth of the mean is floating-point noise (for example readings typed in
 * mils and stored in µm), not a measured spread: indices from it would be absurd (Cp ≈ 10¹⁴).
 */
export const SPREAD_NOISE_FRACTION = 1e-9

function indices(mu: number, sigma: number, lsl?: number, usl?: number): Indices {
  if (!Number.isFinite(sigma) || !(sigma > SPREAD_NOISE_FRACTION * Math.max(1, Math.abs(mu))))
    return {}
  const out: Indices = {}
  if (lsl !== undefined) out.cpl = (mu - lsl) / (3 * sigma)
  if (usl !== undefined) out.cpu = (usl - mu) / (3 * sigma)
  if (lsl !== undefined && usl !== undefined) out.cp = (usl - lsl) / (6 * sigma)
  const sides = [out.cpl, out.cpu].filter((v): v is number => v !== undefined)
  if (sides.length) out.cpk = Math.min(...sides)
  return out
}

function checkLimits(lsl?: number, usl?: number): void {
  if (lsl !== undefined) requireFinite(lsl, 'lsl')
  if (usl !== undefined) requireFinite(usl, 'usl')
  if (lsl !== undefined && usl !== undefined && usl <= lsl)
    throw new RuleInputError('usl', 'must be above lsl')
}

export interface Capability extends Indices {
  n: number
  mean: number
  sd: number
}

/** n, mean, sample sd (n − 1) and capability indices from the overall sd. */
export function capability(values: number[], lsl?: number, usl?: number): Capability {
  checkValues(values, 'values')
  checkLimits(lsl, usl)
  const m = mean(values)
  const sd = sampleSd(values)
  return { n: values.length, mean: m, sd, ...indices(m, sd, lsl, usl) }
}

export interface SubgroupCapability {
  n: number
  subgroupSize: number
  mean: number
  /** R̄/d₂ — used for Cp/Cpk. */
  sigmaWithin: number
  /** Overall sample sd (n − 1) — used for Pp/Ppk. */
  sigmaOverall: number
  cp?: number
  cpk?: number
  pp?: number
  ppk?: number
}

/** Cp/Cpk from within-subgroup σ (R̄/d₂, equal subgroups of 2–10) and Pp/Ppk from overall sd. */
export function subgroupCapability(
  subgroups: number[][],
  lsl?: number,
  usl?: number,
): SubgroupCapability {
  if (!Array.isArray(subgroups) || subgroups.length === 0)
    throw new RuleInputError('subgroups', 'needs at least one subgroup')
  const size = subgroups[0]!.length
  const d2 = D2_BY_SUBGROUP_SIZE[size]
  if (d2 === undefined)
    throw new RuleInputError('subgroups', `subgroup size must be 2–10 (got ${size})`)
  subgroups.forEach((g, i) => {
    if (g.length !== size)
      throw new RuleInputError(`subgroups[${i}]`, `must have ${size} values like the first`)
    checkValues(g, `subgroups[${i}]`)
  })
  checkLimits(lsl, usl)
  const all = subgroups.flat()
  const m = mean(all)
  const rBar = mean(subgroups.map((g) => Math.max(...g) - Math.min(...g)))
  const sigmaWithin = rBar / d2
  const sigmaOverall = sampleSd(all)
  const within = indices(m, sigmaWithin, lsl, usl)
  const overall = indices(m, sigmaOverall, lsl, usl)
  return {
    n: all.length,
    subgroupSize: size,
    mean: m,
    sigmaWithin,
    sigmaOverall,
    cp: within.cp,
    cpk: within.cpk,
    pp: overall.cp,
    ppk: overall.cpk,
  }
}

export interface HistogramBin {
  fromUm: number
  toUm: number
  count: number
  /** The bin lies inside the band [lsl, usl]. */
  inBand: boolean
}

/**
 * Histogram with edges aligned to the band: `binsInBand` equal bins between lsl and usl, extended
 * by whole bins on either side to hold every value (at most 200 bins; values further out are
 * counted in the end bins). Bins are [from, to); a value exactly at usl falls in the last band bin.
 */
export function histogramForBand(
  values: number[],
  lsl: number,
  usl: number,
  binsInBand = 10,
): HistogramBin[] {
  checkValues(values, 'values')
  checkLimits(lsl, usl)
  if (!Number.isInteger(binsInBand) || binsInBand < 1 || binsInBand > 100) {
    throw new RuleInputError('binsInBand', 'must be a whole number 1–100')
  }
  const width = (usl - lsl) / binsInBand
  const lo = Math.min(...values)
  const hi = Math.max(...values)
  const extra = Math.floor((200 - binsInBand) / 2)
  const below = Math.min(extra, lo < lsl ? Math.ceil((lsl - lo) / width - 1e-9) : 0)
  const above = Math.min(extra, hi > usl ? Math.ceil((hi - usl) / width - 1e-9) : 0)
  const start = lsl - below * width
  const count = below + binsInBand + above
  const bins: HistogramBin[] = Array.from({ length: count }, (_, i) => ({
    fromUm: start + i * width,
    toUm: start + (i + 1) * width,
    count: 0,
    inBand: i >= below && i < below + binsInBand,
  }))
  for (const v of values) {
    let i = Math.floor((v - start) / width + 1e-9)
    if (Math.abs(v - usl) <= 1e-9 * Math.max(1, Math.abs(usl))) i = below + binsInBand - 1
    bins[Math.max(0, Math.min(count - 1, i))]!.count++
  }
  return bins
}

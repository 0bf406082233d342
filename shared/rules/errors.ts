/**
 * Input guards shared by every rule. A bad number (NaN, Infinity, a negative thickness, an RH of
 * 140 %) is a data-entry or transmission error, not an inspection result, so the rules refuse it
 * with a RuleInputError that names the field; the API turns it into a 400.
 */

export class RuleInputError extends Error {
  /** Path of the offending field, e.g. `relativeHumidityPct` or `areas[1][0][2]`. */
  readonly field: string

  constructor(field: string, message: string) {
    super(`${field}: ${message}`)
    this.name = 'RuleInputError'
    this.field = field
  }
}

/** Largest thickness (µm) any rule accepts; 10 mm of film is not a coating reading. */
export const MAX_THICKNESS_UM = 10000

export function requireFinite(value: unknown, field: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RuleInputError(field, `must be a finite number (got ${String(value)})`)
  }
  return value
}

export function requireRange(
  value: unknown,
  field: string,
  min: number,
  max: number,
  unit = '',
): number {
  const v = requireFinite(value, field)
  if (v < min || v > max) {
    throw new RuleInputError(field, `must be between ${min} and ${max}${unit} (got ${v}${unit})`)
  }
  return v
}

export function requirePositive(value: unknown, field: string, max = Infinity, unit = ''): number {
  const v = requireFinite(value, field)
  if (v <= 0) throw new RuleInputError(field, `must be greater than 0 (got ${v}${unit})`)
  if (v > max) throw new RuleInputError(field, `must not exceed ${max}${unit} (got ${v}${unit})`)
  return v
}

/** A film thickness or profile in µm: 0 … 10,000 µm. */
export function requireThicknessUm(value: unknown, field: string): number {
  return requireRange(value, field, 0, MAX_THICKNESS_UM, ' µm')
}

export function requireArray<T>(value: unknown, field: string): T[] {
  if (!Array.isArray(value)) throw new RuleInputError(field, 'must be a list')
  return value as T[]
}

/**
 * Limits are compared with a relative tolerance of 1e-9 (never less than 1e-9 absolute) so that a
 * value converted from mils (6.4 mil → 162.56 µm) and a limit computed as 80 % of 8 mil (which
 * floating point makes 162.56000000000003) compare as equal. 1e-9 is far below any gauge
 * resolution (0.1 µm), so it can never turn a real nonconformance into a pass.
 */
export const RELATIVE_TOLERANCE = 1e-9

function tolerance(limit: number): number {
  return RELATIVE_TOLERANCE * Math.max(1, Math.abs(limit))
}

/** value ≥ limit, allowing floating-point noise. */
export function atLeast(value: number, limit: number): boolean {
  return value >= limit - tolerance(limit)
}

/** value ≤ limit, allowing floating-point noise. */
export function atMost(value: number, limit: number): boolean {
  return value <= limit + tolerance(limit)
}

/** value < limit by more than floating-point noise. */
export function below(value: number, limit: number): boolean {
  return !atLeast(value, limit)
}

/** value > limit by more than floating-point noise. */
export function above(value: number, limit: number): boolean {
  return !atMost(value, limit)
}

export function mean(values: readonly number[]): number {
  if (values.length === 0) return Number.NaN
  let sum = 0
  for (const v of values) sum += v
  return sum / values.length
}

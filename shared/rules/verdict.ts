/** Result shapes shared by evaluatePart and evaluateLot. */

export const CRITERIA = [
  'surface-prep',
  'climate',
  'thickness',
  'holiday',
  'cure',
  'adhesion',
] as const
export type CriterionName = (typeof CRITERIA)[number]

/**
 * 'not-required': the spec does not ask for this criterion (holiday.required = false, no cure
 * test, no adhesion test). Such criteria are listed, not omitted, so a screen can say so; they
 * never affect the overall status.
 */
export type CriterionStatus = 'pass' | 'fail' | 'incomplete' | 'not-required'
export type OverallStatus = 'pass' | 'fail' | 'incomplete'

export interface CriterionResult {
  criterion: CriterionName
  status: CriterionStatus
  /** Plain language for a supervisor; names the numbers behind the verdict. */
  reason: string
  /** The numbers behind the verdict, µm / °C / V / MPa as the key's suffix says. */
  numbers: Record<string, number | string | boolean | null>
  /** Safety text to show next to the result (holiday test voltages). */
  caution?: string
}

/** fail beats incomplete beats pass; not-required is ignored. */
export function combineStatuses(statuses: CriterionStatus[]): OverallStatus {
  if (statuses.includes('fail')) return 'fail'
  if (statuses.includes('incomplete')) return 'incomplete'
  return 'pass'
}

/** JSON-safe number: NaN / Infinity become null. */
export function num(value: number | null | undefined): number | null {
  return value === null || value === undefined || !Number.isFinite(value) ? null : value
}

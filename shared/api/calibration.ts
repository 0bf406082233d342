import { CALIBRATION_WARNING_DAYS } from './instruments'
import type { CalibrationStatus } from './setup'

/**
 * Calibration dates as the shop reads them: calendar days, no time of day. A calibration due
 * date is the last day the calibration is valid, so an instrument is usable on its due date and
 * overdue from the next day. Pure: the tablet warns with the same code the server refuses with.
 */

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/
const DAY_MS = 86_400_000

/** The local calendar date of `at` as YYYY-MM-DD (the plant's day, not UTC's). */
export function localIsoDate(at: Date = new Date()): string {
  const y = at.getFullYear()
  const m = String(at.getMonth() + 1).padStart(2, '0')
  const d = String(at.getDate()).padStart(2, '0')
  return `${y}-${m}-${d}`
}

function dayNumber(isoDate: string): number {
  const match = ISO_DATE.exec(isoDate)
  if (!match) throw new Error(`Not a YYYY-MM-DD date: ${isoDate}`)
  return Date.UTC(Number(match[1]), Number(match[2]) - 1, Number(match[3])) / DAY_MS
}

/** Whole calendar days from `fromIso` to `toIso` (negative when `toIso` is earlier). */
export function daysBetween(fromIso: string, toIso: string): number {
  return Math.round(dayNumber(toIso) - dayNumber(fromIso))
}

/** `isoDate` moved by `days` calendar days. */
export function addDays(isoDate: string, days: number): string {
  const d = new Date((dayNumber(isoDate) + days) * DAY_MS)
  return d.toISOString().slice(0, 10)
}

export interface CalibrationState {
  calibrationStatus: CalibrationStatus
  /** Days from `today` to the due date; 0 on the due date, negative once overdue. */
  daysUntilDue: number
}

/**
 * 'overdue' once the due date is before today; 'due-soon' within CALIBRATION_WARNING_DAYS
 * days of it (the due date itself included); otherwise 'current'.
 */
export function calibrationState(
  calibrationDueOn: string,
  today: string,
  warningDays: number = CALIBRATION_WARNING_DAYS,
): CalibrationState {
  const daysUntilDue = daysBetween(today, calibrationDueOn)
  const calibrationStatus: CalibrationStatus =
    daysUntilDue < 0 ? 'overdue' : daysUntilDue <= warningDays ? 'due-soon' : 'current'
  return { calibrationStatus, daysUntilDue }
}

/** True while a reading taken on `onDate` falls inside the calibration (due date included). */
export function calibrationValidOn(calibrationDueOn: string, onDate: string): boolean {
  return daysBetween(onDate, calibrationDueOn) >= 0
}

/** The first day an instrument is out of calibration: the day after its due date. */
export function overdueSince(calibrationDueOn: string): string {
  return addDays(calibrationDueOn, 1)
}

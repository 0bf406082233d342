import { describe, it, expect } from 'vitest'
import {
  addDays,
  calibrationState,
  calibrationValidOn,
  daysBetween,
  localIsoDate,
  overdueSince,
} from '../../shared/api/calibration'

// Our own convention, not a standard's: the due date is the last valid day; "due soon" within
// CALIBRATION_WARNING_DAYS = 30 days (shared/api/instruments.ts).
describe('calibration dates', () => {
  it('counts calendar days across month ends, leap days and the DST change', () => {
    expect(daysBetween('2028-02-28', '2028-03-01')).toBe(2) // 2028 is a leap year
    expect(daysBetween('2027-02-28', '2027-03-01')).toBe(1)
    expect(daysBetween('2026-03-28', '2026-03-30')).toBe(2) // EU clocks change on 2026-03-29
    expect(daysBetween('2026-12-31', '2026-12-01')).toBe(-30)
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01')
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28')
  })

  it('classifies by days until due: 31 current, 30..0 due soon, -1 overdue', () => {
    expect(calibrationState('2026-07-02', '2026-06-01')).toEqual({
      calibrationStatus: 'current',
      daysUntilDue: 31,
    })
    expect(calibrationState('2026-07-01', '2026-06-01')).toEqual({
      calibrationStatus: 'due-soon',
      daysUntilDue: 30,
    })
    expect(calibrationState('2026-06-01', '2026-06-01')).toEqual({
      calibrationStatus: 'due-soon',
      daysUntilDue: 0,
    })
    expect(calibrationState('2026-05-31', '2026-06-01')).toEqual({
      calibrationStatus: 'overdue',
      daysUntilDue: -1,
    })
    expect(calibrationState('2026-06-10', '2026-06-01', 7).calibrationStatus).toBe('current')
  })

  it('is usable on its due date and overdue from the next day', () => {
    expect(calibrationValidOn('2026-06-01', '2026-06-01')).toBe(true)
    expect(calibrationValidOn('2026-06-01', '2026-06-02')).toBe(false)
    expect(overdueSince('2026-06-30')).toBe('2026-07-01')
  })

  it('takes the local calendar date, and refuses a malformed date', () => {
    expect(localIsoDate(new Date(2026, 0, 5, 23, 59))).toBe('2026-01-05')
    expect(() => daysBetween('2026-1-5', '2026-01-06')).toThrow(/YYYY-MM-DD/)
  })
})

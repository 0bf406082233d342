/** Display formatting for the certificate. Display only: verdicts are computed in shared/rules. */
import { formatNumber } from '../../shared/rules/format'
import { micronsToMils } from '../../shared/rules/units'

export type ThicknessUnit = 'um' | 'mil'

/** µm with 0 decimals, mils with 1 decimal (1 mil = 25.4 µm exactly, TRADE.md intro [R]). */
export function formatThickness(thicknessUm: number, unit: ThicknessUnit): string {
  return unit === 'mil' ? formatNumber(micronsToMils(thicknessUm), 1) : formatNumber(thicknessUm, 0)
}

/** Column headings: "Min µm", "Min mil". */
export function unitSymbol(unit: ThicknessUnit): string {
  return unit === 'mil' ? 'mil' : 'µm'
}

/** Running text: "in µm", "in mils". */
export function unitName(unit: ThicknessUnit): string {
  return unit === 'mil' ? 'mils' : 'µm'
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec']

/**
 * "14 May 2026": day, month name, year reads the same in every country (03/05 does not).
 * Takes the calendar date written at the start of the string, so a timestamp never shifts a day
 * with the server's time zone. A string without a leading date is printed as given.
 */
export function formatDate(isoDateOrTimestamp: string): string {
  const match = /^(\d{4})-(\d{2})-(\d{2})/.exec(isoDateOrTimestamp)
  const month = match ? MONTHS[Number(match[2]) - 1] : undefined
  if (!match || !month) return isoDateOrTimestamp
  return `${Number(match[3])} ${month} ${match[1]}`
}

/** pdfkit's CreationDate; a bad issuedAt is a bug in the caller, so say so plainly. */
export function issuedAtDate(issuedAt: string): Date {
  const date = new Date(issuedAt)
  if (Number.isNaN(date.getTime()))
    throw new Error(`Certificate issuedAt is not a date: ${issuedAt}`)
  return date
}

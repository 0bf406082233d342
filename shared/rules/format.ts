/** Number formatting for reason texts a supervisor reads. Display only; never used in a verdict. */
import { MICRONS_PER_MIL } from './units'

export type DisplayUnit = 'um' | 'mil'

function trim(value: number, decimals: number): string {
  return Number.isFinite(value) ? value.toFixed(decimals) : '—'
}

/** "162.6 µm", or "6.40 mil (162.6 µm)" when the spec writes its band in mils. */
export function formatUm(um: number, unit: DisplayUnit = 'um'): string {
  if (unit === 'mil') return `${trim(um / MICRONS_PER_MIL, 2)} mil (${trim(um, 1)} µm)`
  return `${trim(um, 1)} µm`
}

export function formatC(c: number): string {
  return `${trim(c, 1)} °C`
}

export function formatNumber(value: number, decimals = 1): string {
  return trim(value, decimals)
}

export function formatPct(share: number): string {
  return `${trim(share * 100, 1)} %`
}

export function plural(count: number, one: string, many = `${one}s`): string {
  return `${count} ${count === 1 ? one : many}`
}

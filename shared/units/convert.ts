/**
 * Display conversions for the client: the API keeps µm, °C and m² as stored; a person may read
 * and type mils, °F and ft². The exact factors live in shared/rules/units.ts (1 mil = 25.4 µm).
 * Pure functions keyed by the user's unit preference, so a view never branches on the unit.
 */
import {
  celsiusDeltaToFahrenheit,
  celsiusToFahrenheit,
  fahrenheitDeltaToCelsius,
  fahrenheitToCelsius,
  micronsToMils,
  milsToMicrons,
  squareFeetToSquareMetres,
  squareMetresToSquareFeet,
} from '../rules/units'

export type ThicknessUnit = 'um' | 'mil'
export type TemperatureUnit = 'C' | 'F'
export type AreaUnit = 'm2' | 'ft2'

export const THICKNESS_UNIT_LABELS: Record<ThicknessUnit, string> = { um: 'µm', mil: 'mil' }
export const TEMPERATURE_UNIT_LABELS: Record<TemperatureUnit, string> = { C: '°C', F: '°F' }
export const AREA_UNIT_LABELS: Record<AreaUnit, string> = { m2: 'm²', ft2: 'ft²' }

/** Decimals shown: whole µm; mils to 0.1 (one tenth of a mil is 2.54 µm). */
export const THICKNESS_DECIMALS: Record<ThicknessUnit, number> = { um: 0, mil: 1 }

export function thicknessFromUm(um: number, unit: ThicknessUnit): number {
  return unit === 'mil' ? micronsToMils(um) : um
}
export function thicknessToUm(value: number, unit: ThicknessUnit): number {
  return unit === 'mil' ? milsToMicrons(value) : value
}

export function temperatureFromC(c: number, unit: TemperatureUnit): number {
  return unit === 'F' ? celsiusToFahrenheit(c) : c
}
export function temperatureToC(value: number, unit: TemperatureUnit): number {
  return unit === 'F' ? fahrenheitToCelsius(value) : value
}

/** Differences (dew-point margin, ΔTg): scaled, never offset by 32°. */
export function temperatureDeltaFromC(deltaC: number, unit: TemperatureUnit): number {
  return unit === 'F' ? celsiusDeltaToFahrenheit(deltaC) : deltaC
}
export function temperatureDeltaToC(delta: number, unit: TemperatureUnit): number {
  return unit === 'F' ? fahrenheitDeltaToCelsius(delta) : delta
}

export function areaFromM2(m2: number, unit: AreaUnit): number {
  return unit === 'ft2' ? squareMetresToSquareFeet(m2) : m2
}
export function areaToM2(value: number, unit: AreaUnit): number {
  return unit === 'ft2' ? squareFeetToSquareMetres(value) : value
}

/** A number for reading: fixed decimals, no "-0", an en dash for nothing. */
export function formatFixed(value: number | null | undefined, decimals: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–'
  const text = value.toFixed(decimals)
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text
}

/** "152 µm" or "6.0 mil". */
export function formatThickness(um: number | null | undefined, unit: ThicknessUnit): string {
  if (um === null || um === undefined) return '–'
  return `${formatFixed(thicknessFromUm(um, unit), THICKNESS_DECIMALS[unit])} ${THICKNESS_UNIT_LABELS[unit]}`
}

/** "250–400 µm", "9.8–15.7 mil", or "≥ 250 µm" when the band has no maximum. */
export function formatThicknessBand(
  minUm: number,
  maxUm: number | null,
  unit: ThicknessUnit,
): string {
  const d = THICKNESS_DECIMALS[unit]
  const label = THICKNESS_UNIT_LABELS[unit]
  const min = formatFixed(thicknessFromUm(minUm, unit), d)
  if (maxUm === null) return `≥ ${min} ${label}`
  return `${min}–${formatFixed(thicknessFromUm(maxUm, unit), d)} ${label}`
}

export function formatTemperature(
  c: number | null | undefined,
  unit: TemperatureUnit,
  decimals = 1,
): string {
  if (c === null || c === undefined) return '–'
  return `${formatFixed(temperatureFromC(c, unit), decimals)} ${TEMPERATURE_UNIT_LABELS[unit]}`
}

export function formatTemperatureDelta(
  deltaC: number,
  unit: TemperatureUnit,
  decimals = 1,
): string {
  return `${formatFixed(temperatureDeltaFromC(deltaC, unit), decimals)} ${TEMPERATURE_UNIT_LABELS[unit]}`
}

export function formatArea(m2: number | null | undefined, unit: AreaUnit, decimals = 2): string {
  if (m2 === null || m2 === undefined) return '–'
  return `${formatFixed(areaFromM2(m2, unit), decimals)} ${AREA_UNIT_LABELS[unit]}`
}

/**
 * Unit conversions. Internally every thickness is µm and every temperature °C; convert only at
 * the edges. Exact factors: 1 mil = 25.4 µm (1 in = 25.4 mm, by definition); 1 ft = 0.3048 m so
 * 1 ft² = 0.09290304 m²; °F = °C × 9/5 + 32; 1 psi = 6.894757 kPa (TRADE.md §6 [C]).
 * Conversions only refuse non-finite numbers: a negative value is legitimate for a temperature
 * or a difference, and range checks belong to the rule that uses the value.
 */
import { requireFinite } from './errors'

export const MICRONS_PER_MIL = 25.4
export const SQUARE_METRES_PER_SQUARE_FOOT = 0.3048 * 0.3048
export const KPA_PER_PSI = 6.894757

export function milsToMicrons(mils: number): number {
  return requireFinite(mils, 'mils') * MICRONS_PER_MIL
}

export function micronsToMils(um: number): number {
  return requireFinite(um, 'um') / MICRONS_PER_MIL
}

export function celsiusToFahrenheit(c: number): number {
  return (requireFinite(c, 'c') * 9) / 5 + 32
}

export function fahrenheitToCelsius(f: number): number {
  return ((requireFinite(f, 'f') - 32) * 5) / 9
}

/** A temperature difference (e.g. the 3 °C dew-point margin ≈ 5.4 °F): no 32° offset. */
export function celsiusDeltaToFahrenheit(deltaC: number): number {
  return (requireFinite(deltaC, 'deltaC') * 9) / 5
}

export function fahrenheitDeltaToCelsius(deltaF: number): number {
  return (requireFinite(deltaF, 'deltaF') * 5) / 9
}

export function squareFeetToSquareMetres(ft2: number): number {
  return requireFinite(ft2, 'ft2') * SQUARE_METRES_PER_SQUARE_FOOT
}

export function squareMetresToSquareFeet(m2: number): number {
  return requireFinite(m2, 'm2') / SQUARE_METRES_PER_SQUARE_FOOT
}

export function psiToMegapascals(psi: number): number {
  return (requireFinite(psi, 'psi') * KPA_PER_PSI) / 1000
}

export function megapascalsToPsi(mpa: number): number {
  return (requireFinite(mpa, 'mpa') * 1000) / KPA_PER_PSI
}

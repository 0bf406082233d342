import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import {
  celsiusDeltaToFahrenheit,
  celsiusToFahrenheit,
  fahrenheitToCelsius,
  megapascalsToPsi,
  micronsToMils,
  milsToMicrons,
  psiToMegapascals,
  RuleInputError,
  squareFeetToSquareMetres,
  squareMetresToSquareFeet,
} from '../../../shared/rules/index'

describe('unit conversions', () => {
  it('1 mil = 25.4 µm exactly', () => {
    // TRADE.md header: 1 mil = 25.4 µm exactly [R]
    expect(milsToMicrons(1)).toBe(25.4)
    expect(milsToMicrons(8)).toBeCloseTo(203.2, 12)
    expect(micronsToMils(50.8)).toBeCloseTo(2, 12) // replica backing 2.0 mil = 50.8 µm [R]
  })

  it('°F = °C × 9/5 + 32', () => {
    // TRADE.md header [R]
    expect(celsiusToFahrenheit(0)).toBe(32)
    expect(celsiusToFahrenheit(100)).toBe(212)
    expect(celsiusToFahrenheit(205)).toBe(401) // FBE preheat ≈ 400 °F (205 °C) [P]
    expect(fahrenheitToCelsius(-40)).toBe(-40)
    // the 3 °C dew-point margin is "about 5 °F" (ISO 8502-4 guidance) [R]
    expect(celsiusDeltaToFahrenheit(3)).toBeCloseTo(5.4, 12)
  })

  it('1 ft = 0.3048 m exactly, so 1 ft² = 0.09290304 m²', () => {
    expect(squareFeetToSquareMetres(1)).toBeCloseTo(0.09290304, 15)
    // 100 ft² ≈ 10 m² as SSPC-PA 2 writes it [R]
    expect(squareFeetToSquareMetres(100)).toBeCloseTo(9.290304, 12)
  })

  it('1 psi = 6.894757 kPa', () => {
    // TRADE.md §6 [C]
    expect(psiToMegapascals(1)).toBeCloseTo(0.006894757, 15)
    expect(psiToMegapascals(1000)).toBeCloseTo(6.894757, 12)
    expect(megapascalsToPsi(6.894757)).toBeCloseTo(1000, 9)
  })

  it('refuses non-finite numbers with RuleInputError naming the field', () => {
    expect(() => milsToMicrons(Number.NaN)).toThrow(RuleInputError)
    expect(() => micronsToMils(Infinity)).toThrow(/um/)
    expect(() => celsiusToFahrenheit(Number.NaN)).toThrow(RuleInputError)
  })

  it('round trips (property)', () => {
    const finite = fc.double({ min: -1e6, max: 1e6, noNaN: true })
    fc.assert(
      fc.property(finite, (x) => {
        const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b))
        return (
          close(micronsToMils(milsToMicrons(x)), x) &&
          close(fahrenheitToCelsius(celsiusToFahrenheit(x)), x) &&
          close(squareMetresToSquareFeet(squareFeetToSquareMetres(x)), x) &&
          close(megapascalsToPsi(psiToMegapascals(x)), x)
        )
      }),
    )
  })
})

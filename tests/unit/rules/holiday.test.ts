import { describe, expect, it } from 'vitest'
import {
  HOLIDAY_SAFETY_CAUTION,
  holidayMethod,
  holidayTestVoltage,
  milsToMicrons as mil,
  openHolidays,
  RuleInputError,
  voltageWithinTolerance,
} from '../../../shared/rules/index'

describe('ASTM D5162 method by thickness [R]', () => {
  it('low-voltage wet sponge up to 500 µm, high-voltage spark above', () => {
    expect(holidayMethod(499.9)).toBe('low-voltage')
    expect(holidayMethod(500)).toBe('low-voltage')
    expect(holidayMethod(500.1)).toBe('high-voltage')
    expect(holidayMethod(mil(16))).toBe('low-voltage') // 406.4 µm
    expect(holidayMethod(mil(20))).toBe('high-voltage') // 20 mils is 508 µm, above the 0.5 mm edge
  })
  it('refuses zero and absurd thickness', () => {
    expect(() => holidayMethod(0)).toThrow(/thicknessUm/)
    expect(() => holidayMethod(10001)).toThrow(RuleInputError)
  })
})

describe('holiday test voltage', () => {
  it('NACE SP0490: 525 √T, 16 mils → 2,100 V [C] (formula from memory [M])', () => {
    expect(holidayTestVoltage(mil(16), 'NACE-SP0490')).toBe(2100)
    expect(holidayTestVoltage(mil(12), 'NACE-SP0490')).toBe(Math.round(525 * Math.sqrt(12))) // 1,819 V
  })

  it('NACE SP0274: 1,250 √T, 2 mm exact (78.74 mils) → 11,092 V [C]', () => {
    expect(holidayTestVoltage(2000, 'NACE-SP0274')).toBe(11092)
    // the manual's 11.18 kV takes 2 mm as 80 mils [R]
    expect(holidayTestVoltage(mil(80), 'NACE-SP0274')).toBe(11180)
  })

  it('NACE SP0274 switches at 40 mils: 525 √T below [M], 1,250 √T at and above [R]', () => {
    expect(holidayTestVoltage(mil(40), 'NACE-SP0274')).toBe(Math.round(1250 * Math.sqrt(40))) // 7,906 V
    expect(holidayTestVoltage(mil(39.99), 'NACE-SP0274')).toBe(Math.round(525 * Math.sqrt(39.99))) // 3,320 V
    expect(holidayTestVoltage(mil(40.01), 'NACE-SP0274')).toBe(Math.round(1250 * Math.sqrt(40.01)))
  })

  it('16 mils: 2,100 V = 131 V/mil, inside the 125–150 V/mil regulator guidance for FBE pipe [R]', () => {
    const vPerMil = holidayTestVoltage(mil(16), 'NACE-SP0490') / 16
    expect(vPerMil).toBeGreaterThanOrEqual(125)
    expect(vPerMil).toBeLessThanOrEqual(150)
  })

  it('rounds to whole volts with Math.round', () => {
    const v = holidayTestVoltage(mil(15), 'NACE-SP0490') // 525 √15 = 2033.3…
    expect(v).toBe(2033)
    expect(Number.isInteger(v)).toBe(true)
  })

  it('refuses a bad rule or thickness', () => {
    expect(() => holidayTestVoltage(400, 'NACE-SP0188' as never)).toThrow(/rule/)
    expect(() => holidayTestVoltage(-1, 'NACE-SP0490')).toThrow(/thicknessUm/)
  })

  it('has a safety caution that defers to the standard and the maker', () => {
    expect(HOLIDAY_SAFETY_CAUTION).toMatch(/injur/)
    expect(HOLIDAY_SAFETY_CAUTION).toMatch(
      /standard.*equipment maker.*local codes.*licensed practice/,
    )
  })
})

describe('voltage used vs required (± spec tolerance, 5 % default [P])', () => {
  it('exactly at the tolerance passes, one volt outside fails', () => {
    expect(voltageWithinTolerance(2100, 2100, 5)).toBe(true)
    expect(voltageWithinTolerance(1995, 2100, 5)).toBe(true)
    expect(voltageWithinTolerance(1994, 2100, 5)).toBe(false)
    expect(voltageWithinTolerance(2205, 2100, 5)).toBe(true)
    expect(voltageWithinTolerance(2206, 2100, 5)).toBe(false)
  })
})

describe('open holidays', () => {
  it('counts unrepaired and repaired-not-retested; ignores locations with no holiday', () => {
    expect(
      openHolidays([
        { found: true, repaired: false, retested: false },
        { found: true, repaired: true, retested: false },
        { found: true, repaired: true, retested: true },
        { found: false, repaired: false, retested: false },
      ]),
    ).toEqual({ unrepaired: 1, notRetested: 1 })
  })
})

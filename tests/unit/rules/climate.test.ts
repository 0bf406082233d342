import { describe, expect, it } from 'vitest'
import { checkClimate, dewPointC, RuleInputError } from '../../../shared/rules/index'

describe('dew point (Magnus 17.62 / 243.12 °C)', () => {
  it('matches the TRADE.md checks', () => {
    // Magnus formula [R], check values [C]
    expect(dewPointC(20, 60)).toBeCloseTo(12.0, 2) // 20 °C / 60 % → 12.00 °C [C]
    expect(dewPointC(30, 55)).toBeCloseTo(19.97, 2) // 30 °C / 55 % → 19.97 °C [C]
    expect(Math.abs(dewPointC(30, 55) - 20)).toBeLessThan(0.1) // published: condensation at about 20 °C [R]
    expect(dewPointC(10, 80)).toBeCloseTo(6.71, 2) // 10 °C / 80 % → 6.71 °C [C]
  })

  it('equals the air temperature at 100 % RH', () => {
    expect(dewPointC(25, 100)).toBeCloseTo(25, 10)
  })

  it('refuses RH outside 0–100 and non-finite input, naming the field', () => {
    for (const rh of [-1, 0, 100.0001, 140, Number.NaN]) {
      expect(() => dewPointC(20, rh)).toThrow(RuleInputError)
      try {
        dewPointC(20, rh)
      } catch (e) {
        expect((e as RuleInputError).field).toBe('relativeHumidityPct')
        expect((e as Error).message).toMatch(/relativeHumidityPct/)
      }
    }
    expect(() => dewPointC(Infinity, 50)).toThrow(/airTempC/)
  })
})

describe('checkClimate — steel ≥ 3 °C above dew point, RH ≤ 85 % (ISO 8502-4, ISO 12944-7) [R]', () => {
  const at = (steelTempC: number, relativeHumidityPct = 60) =>
    checkClimate({ airTempC: 20, relativeHumidityPct, steelTempC })

  it('20 °C / 60 %: steel 15.0 passes, 14.9 fails', () => {
    // Gate [C]
    expect(at(15.0).pass).toBe(true)
    expect(at(14.9).pass).toBe(false)
    expect(at(14.9).reasons.join(' ')).toMatch(/dew point/)
    expect(at(15.0).reasons).toEqual([])
  })

  it('margin exactly at 3 °C passes; a hair below fails', () => {
    const dp = dewPointC(20, 60)
    expect(at(dp + 3).pass).toBe(true)
    expect(at(dp + 3 - 1e-6).pass).toBe(false)
    expect(at(dp + 3).marginC).toBeCloseTo(3, 10)
  })

  it('RH 85 % passes, 85.1 % fails (steel warm enough)', () => {
    expect(at(30, 85).pass).toBe(true)
    expect(at(30, 84.9).pass).toBe(true)
    const r = at(30, 85.1)
    expect(r.pass).toBe(false)
    expect(r.reasons.join(' ')).toMatch(/85\.1 %.*85 %/)
  })

  it('uses the spec limits when given', () => {
    expect(at(14.9).pass).toBe(false)
    expect(
      checkClimate({ airTempC: 20, relativeHumidityPct: 60, steelTempC: 14.9 }, { minMarginC: 2.5 })
        .pass,
    ).toBe(true)
    expect(
      checkClimate(
        { airTempC: 20, relativeHumidityPct: 60, steelTempC: 30 },
        { maxRelativeHumidityPct: 50 },
      ).pass,
    ).toBe(false)
  })

  it('names both problems when both fail', () => {
    expect(
      checkClimate({ airTempC: 20, relativeHumidityPct: 90, steelTempC: 18 }).reasons,
    ).toHaveLength(2)
  })

  it('refuses a non-finite steel temperature', () => {
    expect(() => at(Number.NaN)).toThrow(/steelTempC/)
  })
})

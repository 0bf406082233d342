import { describe, expect, it } from 'vitest'
import {
  evaluateIso19840,
  ISO19840_PROFILE_CORRECTION_UM,
  iso19840MinReadings,
  iso19840ProfileCorrectionUm,
  RuleInputError,
} from '../../../shared/rules/index'

/** n readings: `low` of them at `lowUm`, the rest at `restUm`. */
const set = (n: number, low: number, lowUm: number, restUm: number) => [
  ...Array<number>(low).fill(lowUm),
  ...Array<number>(n - low).fill(restUm),
]

describe('ISO 19840 acceptance (NDFT 100 µm unless said) [R]', () => {
  it('passes a conforming set and reports mean / min / max', () => {
    const r = evaluateIso19840({ nominalUm: 100, readingsUm: [100, 110, 120, 130, 140] })
    expect(r.pass).toBe(true)
    expect(r.meanUm).toBe(120)
    expect(r.minUm).toBe(100)
    expect(r.maxUm).toBe(140)
    expect(r.belowNominalShare).toBe(0)
    expect(r.reasons).toEqual([])
  })

  it('mean ≥ NDFT: exactly at passes, a step below fails', () => {
    expect(evaluateIso19840({ nominalUm: 100, readingsUm: Array(10).fill(100) }).pass).toBe(true)
    const r = evaluateIso19840({ nominalUm: 100, readingsUm: [...Array(9).fill(100), 99.9] })
    // 1 of 10 below nominal is fine, but the mean 99.99 is below 100
    expect(r.pass).toBe(false)
    expect(r.reasons.join(' ')).toMatch(/Mean 100\.0 µm is 0\.0 µm below the nominal/)
  })

  it('every reading ≥ 80 % of NDFT: 80 passes, 79.9 fails', () => {
    expect(evaluateIso19840({ nominalUm: 100, readingsUm: [80, ...Array(9).fill(130)] }).pass).toBe(
      true,
    )
    const r = evaluateIso19840({ nominalUm: 100, readingsUm: [79.9, ...Array(9).fill(130)] })
    expect(r.pass).toBe(false)
    expect(r.reasons.join(' ')).toMatch(/below 80 % of nominal \(80\.0 µm\); lowest 79\.9 µm/)
  })

  it('80 % floor in mils: NDFT 10 mil → 8.0 mil floor', () => {
    const mil = 25.4
    expect(
      evaluateIso19840({ nominalUm: 10 * mil, readingsUm: [8 * mil, ...Array(9).fill(13 * mil)] })
        .pass,
    ).toBe(true)
    expect(
      evaluateIso19840({
        nominalUm: 10 * mil,
        readingsUm: [7.99 * mil, ...Array(9).fill(13 * mil)],
      }).pass,
    ).toBe(false)
  })

  it('share below NDFT: under 20 % (default) — 1 of 10 passes, 2 of 10 fails', () => {
    // editions differ on exactly 20 % [R]: a setting, both sides tested
    expect(evaluateIso19840({ nominalUm: 100, readingsUm: set(10, 1, 90, 130) }).pass).toBe(true)
    const r = evaluateIso19840({ nominalUm: 100, readingsUm: set(10, 2, 90, 130) })
    expect(r.belowNominalShare).toBe(0.2)
    expect(r.pass).toBe(false)
    expect(r.reasons.join(' ')).toMatch(
      /2 of 10 readings \(20\.0 %\) are below nominal; under 20 %/,
    )
  })

  it('share below NDFT: "at most 20 %" setting — 2 of 10 passes, 3 of 10 fails', () => {
    expect(
      evaluateIso19840({ nominalUm: 100, readingsUm: set(10, 2, 90, 130), allowExactly20Pct: true })
        .pass,
    ).toBe(true)
    expect(
      evaluateIso19840({ nominalUm: 100, readingsUm: set(10, 3, 90, 130), allowExactly20Pct: true })
        .pass,
    ).toBe(false)
  })

  it('maximum: 3 × NDFT when none is given — 300 passes, 300.1 fails', () => {
    expect(evaluateIso19840({ nominalUm: 100, readingsUm: [300, 100, 100, 100, 100] }).pass).toBe(
      true,
    )
    const r = evaluateIso19840({ nominalUm: 100, readingsUm: [300.1, 100, 100, 100, 100] })
    expect(r.pass).toBe(false)
    expect(r.maxAllowedUm).toBe(300)
  })

  it('a specified maximum replaces 3 × NDFT', () => {
    expect(
      evaluateIso19840({ nominalUm: 100, maxUm: 200, readingsUm: [200, 100, 100, 100, 100] }).pass,
    ).toBe(true)
    expect(
      evaluateIso19840({ nominalUm: 100, maxUm: 200, readingsUm: [200.1, 100, 100, 100, 100] })
        .pass,
    ).toBe(false)
  })

  it('NDFT below 40 µm: outside the scope, said in a reason, no crash', () => {
    const r = evaluateIso19840({ nominalUm: 30, readingsUm: [30, 35, 40, 32, 31] })
    expect(r.inScope).toBe(false)
    expect(r.reasons.join(' ')).toMatch(/outside the scope of ISO 19840/)
    expect(evaluateIso19840({ nominalUm: 40, readingsUm: [40, 40, 40, 40, 40] }).inScope).toBe(true)
  })

  it('profile correction is subtracted from every reading', () => {
    const r = evaluateIso19840({
      nominalUm: 100,
      readingsUm: [125, 125, 125, 125, 125],
      profileCorrectionUm: 25,
    })
    expect(r.meanUm).toBe(100)
    expect(r.pass).toBe(true)
    expect(
      evaluateIso19840({
        nominalUm: 100,
        readingsUm: [124, 124, 124, 124, 124],
        profileCorrectionUm: 25,
      }).pass,
    ).toBe(false)
  })

  it('too few readings for the inspection area is incomplete', () => {
    const r = evaluateIso19840({
      nominalUm: 100,
      readingsUm: Array(9).fill(120),
      inspectionAreaM2: 2,
    })
    expect(r.status).toBe('incomplete')
    expect(r.reasons.join(' ')).toMatch(/9 of 10 readings/)
    expect(
      evaluateIso19840({ nominalUm: 100, readingsUm: Array(10).fill(120), inspectionAreaM2: 2 })
        .pass,
    ).toBe(true)
  })

  it('no readings is not a pass', () => {
    expect(evaluateIso19840({ nominalUm: 100, readingsUm: [] }).pass).toBe(false)
  })

  it('refuses absurd input naming the field', () => {
    expect(() => evaluateIso19840({ nominalUm: 100, readingsUm: [100, 20000] })).toThrow(
      /readingsUm\[1\]/,
    )
    expect(() => evaluateIso19840({ nominalUm: 0, readingsUm: [100] })).toThrow(RuleInputError)
    expect(() => evaluateIso19840({ nominalUm: Number.NaN, readingsUm: [100] })).toThrow(
      /nominalUm/,
    )
  })
})

describe('ISO 19840 tables — from memory; a setting [M]', () => {
  it('profile correction values: fine 10 / medium 25 / coarse 40 / unknown 25 µm [M]', () => {
    expect(ISO19840_PROFILE_CORRECTION_UM).toEqual({
      fine: 10,
      medium: 25,
      coarse: 40,
      unknown: 25,
    })
    expect(iso19840ProfileCorrectionUm('coarse')).toBe(40)
  })

  it('minimum readings per inspection area, both sides of each step [M]', () => {
    expect(iso19840MinReadings(0.5)).toBe(5)
    expect(iso19840MinReadings(1)).toBe(5)
    expect(iso19840MinReadings(1.01)).toBe(10)
    expect(iso19840MinReadings(3)).toBe(10)
    expect(iso19840MinReadings(3.01)).toBe(15)
    expect(iso19840MinReadings(10)).toBe(15)
    expect(iso19840MinReadings(10.01)).toBe(20)
    expect(iso19840MinReadings(30)).toBe(20)
    expect(iso19840MinReadings(30.01)).toBe(30)
    expect(iso19840MinReadings(100)).toBe(30)
    expect(iso19840MinReadings(100.01)).toBe(40)
    expect(iso19840MinReadings(200)).toBe(40)
    expect(iso19840MinReadings(250)).toBe(50)
  })
})

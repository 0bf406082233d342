import { describe, expect, it } from 'vitest'
import {
  baseMetalReadingUm,
  evaluatePa2,
  milsToMicrons as mil,
  pa2AreaCount,
  pa2SpotLimits,
  RuleInputError,
  subtractBaseMetalReading,
} from '../../../shared/rules/index'

/** A spot of three identical readings, in mils. */
const spot = (mils: number) => [mil(mils), mil(mils), mil(mils)]
const spec812 = { minUm: mil(8), maxUm: mil(12), level: 3 as const }

describe('SSPC-PA 2 area count', () => {
  it('matches the TRADE.md checks', () => {
    expect(pa2AreaCount(2800)).toBe(5) // SSPC-PA 2, area-count rule: 2,800 ft² → 5 areas [R]
    expect(pa2AreaCount(28000)).toBe(30) // SSPC-PA 2, area-count rule: 28,000 ft² → 30 areas [R]
  })

  it('each 100 ft² or part below 300 ft² [R]', () => {
    expect(pa2AreaCount(0.5)).toBe(1) // a small valve body is one area
    expect(pa2AreaCount(100)).toBe(1)
    expect(pa2AreaCount(100.01)).toBe(2)
    expect(pa2AreaCount(200)).toBe(2)
    expect(pa2AreaCount(200.01)).toBe(3)
    expect(pa2AreaCount(299.99)).toBe(3)
  })

  it('3 areas for 300–1,000 ft², then one per further 1,000 ft² or part [R]', () => {
    expect(pa2AreaCount(300)).toBe(3)
    expect(pa2AreaCount(1000)).toBe(3)
    expect(pa2AreaCount(1000.01)).toBe(4)
    expect(pa2AreaCount(2000)).toBe(4)
    expect(pa2AreaCount(2000.01)).toBe(5)
  })

  it('is not fooled by an area that went through m² and back', () => {
    expect(pa2AreaCount((200 * 0.09290304) / 0.09290304)).toBe(2)
  })

  it('refuses zero, negative and non-finite areas', () => {
    expect(() => pa2AreaCount(0)).toThrow(RuleInputError)
    expect(() => pa2AreaCount(-5)).toThrow(/coatedAreaFt2/)
    expect(() => pa2AreaCount(Number.NaN)).toThrow(/coatedAreaFt2/)
  })
})

describe('SSPC-PA 2 restriction levels', () => {
  it('level 3: spec 8–12 mils → spot min 6.4, spot max 14.4 mils', () => {
    // SSPC-PA 2, level 3 check [R]
    const l = pa2SpotLimits(mil(8), mil(12), 3)
    expect(l.spotMinUm).toBeCloseTo(mil(6.4), 9)
    expect(l.spotMaxUm!).toBeCloseTo(mil(14.4), 9)
  })

  it('levels 1–5 as % of min / max — from memory; a setting (spec field pa2Level) [M]', () => {
    const limits = ([1, 2, 3, 4, 5] as const).map((lv) => pa2SpotLimits(100, 200, lv))
    expect(limits[0]!.spotMinUm).toBeCloseTo(100, 9) // L1 100 / 100 [M]
    expect(limits[0]!.spotMaxUm!).toBeCloseTo(200, 9)
    expect(limits[1]!.spotMinUm).toBeCloseTo(100, 9) // L2 100 / 120 [M]
    expect(limits[1]!.spotMaxUm!).toBeCloseTo(240, 9)
    expect(limits[2]!.spotMinUm).toBeCloseTo(80, 9) // L3 80 / 120 [M]
    expect(limits[2]!.spotMaxUm!).toBeCloseTo(240, 9)
    expect(limits[3]!.spotMinUm).toBeCloseTo(80, 9) // L4 80 / 150 [M]
    expect(limits[3]!.spotMaxUm!).toBeCloseTo(300, 9)
    expect(limits[4]!.spotMinUm).toBeCloseTo(80, 9) // L5 80 / no maximum [M]
    expect(limits[4]!.spotMaxUm).toBeNull()
  })
})

describe('evaluatePa2 — spec 8–12 mils, level 3', () => {
  it('worked example: readings 7.0/7.5/8.0 → spot 7.5 mils conforms [C]', () => {
    const r = evaluatePa2({ ...spec812, areas: [[[mil(7), mil(7.5), mil(8)]]] })
    expect(r.areas[0]!.spots[0]!.meanUm).toBeCloseTo(mil(7.5), 9)
    expect(r.areas[0]!.spots[0]!.pass).toBe(true)
    // ...but an area of that one spot has a mean below 8 mils
    expect(r.areas[0]!.pass).toBe(false)
    expect(r.pass).toBe(false)
  })

  it('worked example: spots 7.5, 9, 10, 11, 12.5 → area mean 10.0 passes [C]', () => {
    const r = evaluatePa2({ ...spec812, areas: [[7.5, 9, 10, 11, 12.5].map(spot)] })
    expect(r.areas[0]!.meanUm).toBeCloseTo(mil(10), 9)
    expect(r.pass).toBe(true)
    expect(r.reasons).toEqual([])
  })

  it('worked example: any spot of 6.3 fails whatever the mean [C]', () => {
    const r = evaluatePa2({ ...spec812, areas: [[6.3, 11, 11, 11, 11].map(spot)] })
    expect(r.areas[0]!.meanUm).toBeGreaterThan(mil(8))
    expect(r.areas[0]!.spots[0]!.pass).toBe(false)
    expect(r.pass).toBe(false)
    // names the spot and by how much: 6.4 − 6.3 = 0.10 mil
    expect(r.reasons[0]).toMatch(/Area 1, spot 1/)
    expect(r.reasons[0]).toMatch(/2\.5 µm below the spot minimum 162\.6 µm/)
  })

  it('spot limit boundaries in mils: 6.4 and 14.4 pass, one step outside fails', () => {
    const area = (s: number) => [[s, 10, 10, 10, 10].map(spot)]
    expect(evaluatePa2({ ...spec812, areas: area(6.4) }).pass).toBe(true) // exactly at spot min
    expect(evaluatePa2({ ...spec812, areas: area(6.41) }).pass).toBe(true)
    expect(evaluatePa2({ ...spec812, areas: area(6.39) }).pass).toBe(false)
    expect(evaluatePa2({ ...spec812, areas: area(14.4) }).pass).toBe(true) // exactly at spot max
    expect(evaluatePa2({ ...spec812, areas: area(14.39) }).pass).toBe(true)
    expect(evaluatePa2({ ...spec812, areas: area(14.41) }).pass).toBe(false)
  })

  it('spot limit boundaries in µm (spec 200–300 µm, L3 → 160 / 360 µm)', () => {
    const s = { minUm: 200, maxUm: 300, level: 3 as const }
    const area = (um: number) => [[[um, um, um], ...Array(4).fill([250, 250, 250])]]
    expect(evaluatePa2({ ...s, areas: area(160) }).pass).toBe(true)
    expect(evaluatePa2({ ...s, areas: area(159.9) }).pass).toBe(false)
    expect(evaluatePa2({ ...s, areas: area(160.1) }).pass).toBe(true)
    expect(evaluatePa2({ ...s, areas: area(360) }).pass).toBe(true)
    expect(evaluatePa2({ ...s, areas: area(360.1) }).pass).toBe(false)
  })

  it('area mean boundaries: exactly 8.0 and 12.0 mils pass, one step outside fails', () => {
    const area = (m: number) => [[m, m, m, m, m].map(spot)]
    expect(evaluatePa2({ ...spec812, areas: area(8) }).pass).toBe(true)
    expect(evaluatePa2({ ...spec812, areas: area(7.99) }).pass).toBe(false)
    expect(evaluatePa2({ ...spec812, areas: area(12) }).pass).toBe(true)
    const high = evaluatePa2({ ...spec812, areas: area(12.01) })
    expect(high.pass).toBe(false)
    expect(high.reasons[0]).toMatch(/Area 1: mean .* above the specified maximum/)
  })

  it('individual gauge readings are not restricted [R]', () => {
    const r = evaluatePa2({
      ...spec812,
      areas: [[[mil(4), mil(10), mil(16)], ...[10, 10, 10, 10].map(spot)]],
    })
    expect(r.pass).toBe(true)
  })

  it('a spot with fewer than 3 readings is incomplete, never a pass', () => {
    const r = evaluatePa2({
      ...spec812,
      areas: [[[mil(10), mil(10)], ...[10, 10, 10, 10].map(spot)]],
    })
    expect(r.areas[0]!.spots[0]!.status).toBe('incomplete')
    expect(r.areas[0]!.spots[0]!.pass).toBe(false)
    expect(r.status).toBe('incomplete')
    expect(r.pass).toBe(false)
    expect(r.reasons[0]).toMatch(/2 of 3 gauge readings/)
  })

  it('level 5 has no spot maximum; the area mean still must not exceed the max', () => {
    const l5 = { minUm: mil(8), maxUm: mil(12), level: 5 as const }
    expect(
      evaluatePa2({ ...l5, areas: [[40, 6.4, 6.4, 6.4, 6.4].map(spot)] }).areas[0]!.spots[0]!.pass,
    ).toBe(true)
    expect(evaluatePa2({ ...l5, areas: [[40, 6.4, 6.4, 6.4, 6.4].map(spot)] }).areas[0]!.pass).toBe(
      false,
    )
    expect(evaluatePa2({ ...l5, areas: [[16, 10, 10, 10, 6.4].map(spot)] }).pass).toBe(true)
  })

  it('a spec with no maximum has no area or spot maximum', () => {
    const r = evaluatePa2({ minUm: 100, maxUm: null, level: 3, areas: [[[900, 900, 900]]] })
    expect(r.spotMaxUm).toBeNull()
    expect(r.pass).toBe(true)
  })

  it('defaults to level 3', () => {
    expect(
      evaluatePa2({ minUm: mil(8), maxUm: mil(12), areas: [[spot(10)]] }).spotMinUm,
    ).toBeCloseTo(mil(6.4), 9)
  })

  it('spotsPerArea makes a short area incomplete', () => {
    const r = evaluatePa2({ ...spec812, areas: [[10, 10, 10].map(spot)], spotsPerArea: 5 })
    expect(r.status).toBe('incomplete')
    expect(r.reasons.join(' ')).toMatch(/3 of 5 spot measurements/)
  })

  it('no areas is not a pass', () => {
    expect(evaluatePa2({ ...spec812, areas: [] }).pass).toBe(false)
  })

  it('names the second area when only it fails', () => {
    const r = evaluatePa2({
      ...spec812,
      areas: [[10, 10, 10, 10, 10].map(spot), [10, 10, 15, 10, 10].map(spot)],
    })
    expect(r.areas[0]!.pass).toBe(true)
    expect(r.areas[1]!.pass).toBe(false)
    expect(r.reasons).toHaveLength(1)
    expect(r.reasons[0]).toMatch(
      /Area 2, spot 3: mean 381\.0 µm is 15\.2 µm above the spot maximum 365\.8 µm/,
    )
  })

  it('refuses absurd readings with the field path', () => {
    expect(() => evaluatePa2({ ...spec812, areas: [[[100, 100, 10001]]] })).toThrow(RuleInputError)
    expect(() => evaluatePa2({ ...spec812, areas: [[[100, -1, 100]]] })).toThrow(
      /areas\[0\]\[0\]\[1\]/,
    )
    expect(() => evaluatePa2({ ...spec812, areas: [[[100, Number.NaN, 100]]] })).toThrow(
      /areas\[0\]\[0\]\[1\]/,
    )
    expect(() => evaluatePa2({ minUm: 300, maxUm: 200, areas: [] })).toThrow(/maxUm/)
  })
})

describe('type 1 gauge base metal reading (ASTM D7091 via SSPC-PA 2) [R]', () => {
  it('BMR is the mean of the bare-substrate readings and is subtracted', () => {
    const bmr = baseMetalReadingUm([20, 22, 18, 21, 19, 20, 20, 22, 18, 20])
    expect(bmr).toBeCloseTo(20, 10)
    expect(subtractBaseMetalReading([300, 310, 15], bmr)).toEqual([280, 290, 0])
  })
  it('needs at least one reading', () => {
    expect(() => baseMetalReadingUm([])).toThrow(/baseMetalReadingsUm/)
  })
})

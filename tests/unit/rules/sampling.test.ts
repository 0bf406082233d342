import { describe, expect, it } from 'vitest'
import { samplingPlan } from '../../../shared/rules/index'

const spots = (n: number, readings = 3) =>
  Array.from({ length: n }, () => Array<number>(readings).fill(300))

describe('sampling plan — SSPC-PA 2 [R]', () => {
  it('2,800 ft² → 5 areas, 25 spots, ≥ 75 readings [R]', () => {
    const p = samplingPlan('SSPC-PA2', 2800, {})
    expect([p.areasRequired, p.spotsRequired, p.readingsRequired]).toEqual([5, 25, 75])
    expect(p.progress).toBe('0 of 25 spots')
    expect(p.derivation).toMatch(/3 areas for the first 1,000 ft²/)
  })
  it('28,000 ft² → 30 areas, 150 spots [R]', () => {
    const p = samplingPlan('SSPC-PA2', 28000, {})
    expect([p.areasRequired, p.spotsRequired]).toEqual([30, 150])
  })
  it('a small part under 100 ft² is one area, and the plan says so', () => {
    const p = samplingPlan('SSPC-PA2', 12, { areas: [spots(4)] })
    expect(p.areasRequired).toBe(1)
    expect(p.derivation).toMatch(/Small part under 100 ft².*= one area/)
    expect(p.progress).toBe('4 of 5 spots')
    expect(p.complete).toBe(false)
  })
  it('progress "9 of 15 spots" for 250 ft² (3 areas)', () => {
    const p = samplingPlan('SSPC-PA2', 250, { areas: [spots(5), spots(4)] })
    expect(p.progress).toBe('9 of 15 spots')
    expect(p.areasRecorded).toBe(1)
  })
  it('spots with fewer than 3 readings and extra spots in one area do not count', () => {
    const p = samplingPlan('SSPC-PA2', 150, { areas: [[...spots(7), ...spots(2, 2)]] })
    expect(p.progress).toBe('5 of 10 spots')
  })
  it('no coated area: planned as one area, with a note', () => {
    expect(samplingPlan('SSPC-PA2', undefined, {}).derivation).toMatch(
      /not recorded: planned as one area/,
    )
  })
})

describe('sampling plan — ISO 19840 (table from memory; a setting [M])', () => {
  it('2 m² (21.5 ft²) → 10 readings', () => {
    const p = samplingPlan('ISO-19840', 2 / 0.09290304, { readingCount: 7 })
    expect(p.readingsRequired).toBe(10)
    expect(p.progress).toBe('7 of 10 readings')
  })
})

import { describe, expect, it } from 'vitest'
import { westernElectricViolations as we } from '../../../shared/rules/index'

// Western Electric rules [R]; centre 0, σ 1 so values are in σ.
describe('Western Electric rules', () => {
  it('rule 1: one point beyond 3σ (exactly 3σ is not beyond)', () => {
    expect(we([0, 3.01, 0, -3.5], 0, 1)).toEqual([
      { index: 1, rule: 1 },
      { index: 3, rule: 1 },
    ])
    expect(we([0, 3, -3], 0, 1)).toEqual([])
  })

  it('rule 2: 2 of 3 beyond 2σ on one side, reported at the completing point', () => {
    expect(we([0, 2.5, 0, 2.5, 0], 0, 1)).toEqual([{ index: 3, rule: 2 }])
    expect(we([0, 2.5, -2.5, 0], 0, 1)).toEqual([]) // opposite sides
    expect(we([2.5, 0, 0, 2.5], 0, 1)).toEqual([]) // 4 apart
  })

  it('rule 3: 4 of 5 beyond 1σ on one side', () => {
    expect(we([1.5, 1.5, 0, 1.5, 1.5], 0, 1)).toEqual([{ index: 4, rule: 3 }])
    expect(we([1.5, 1.5, 0, 1.5, -1.5], 0, 1)).toEqual([])
  })

  it('rule 4: 8 in a row on one side, reported once at the 8th point', () => {
    expect(we(Array(7).fill(0.5), 0, 1)).toEqual([])
    expect(we(Array(8).fill(0.5), 0, 1)).toEqual([{ index: 7, rule: 4 }])
    expect(we(Array(12).fill(-0.5), 0, 1)).toEqual([{ index: 7, rule: 4 }])
    // a point on the centre line breaks the run
    expect(we([...Array(4).fill(0.5), 0, ...Array(4).fill(0.5)], 0, 1)).toEqual([])
  })

  it('works in real units (µm) with a centre and σ', () => {
    const v = [300, 301, 299, 300, 345, 300]
    expect(we(v, 300, 10)).toEqual([{ index: 4, rule: 1 }])
  })

  it('a run breaking and re-forming is reported again', () => {
    const run = Array(8).fill(0.5)
    expect(we([...run, -0.5, ...run], 0, 1)).toEqual([
      { index: 7, rule: 4 },
      { index: 16, rule: 4 },
    ])
  })

  it('refuses sigma ≤ 0 and non-finite values', () => {
    expect(() => we([1], 0, 0)).toThrow(/sigma/)
    expect(() => we([1, Number.NaN], 0, 1)).toThrow(/values\[1\]/)
  })
})

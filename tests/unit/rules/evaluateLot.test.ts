import { describe, expect, it } from 'vitest'
import { evaluateLot, evaluatePart, RuleInputError } from '../../../shared/rules/index'
import { fbeInput, fbeSpec } from './fbeFixture'

const spec = fbeSpec()
const good = (label: string) => evaluatePart(spec, { coatedAreaFt2: 12, label }, fbeInput())
const cold = (label: string) => {
  const input = fbeInput()
  input.climate!.steelTempC = 14.9
  return evaluatePart(spec, { coatedAreaFt2: 12, label }, input)
}
const open = (label: string) =>
  evaluatePart(spec, { coatedAreaFt2: 12, label }, { ...fbeInput(), cure: {} })

describe('evaluateLot', () => {
  it('passes when every part passes', () => {
    const lot = evaluateLot([good('A1'), good('A2')], { lotSize: 2 })
    expect(lot.status).toBe('pass')
    expect(lot.reason).toMatch(/All 2 inspected part\(s\) of 2 required conform/)
  })

  it('one failing part fails the lot and is named with its criteria', () => {
    const lot = evaluateLot([good('A1'), cold('A2'), good('A3')])
    expect(lot.status).toBe('fail')
    expect(lot.failedParts).toEqual([{ index: 1, partLabel: 'A2', criteria: ['climate'] }])
    expect(lot.byCriterion.climate).toMatchObject({ pass: 2, fail: 1 })
    expect(lot.reason).toMatch(/A2/)
  })

  it('a fail outranks an open part; an open part keeps the lot incomplete', () => {
    expect(evaluateLot([open('A1'), cold('A2')]).status).toBe('fail')
    expect(evaluateLot([good('A1'), open('A2')]).status).toBe('incomplete')
  })

  it('sampling: fewer parts than the sample size is incomplete; at the sample size it passes', () => {
    const sampling = { mode: 'sample' as const, sampleSize: 3 }
    expect(evaluateLot([good('A1'), good('A2')], { sampling }).status).toBe('incomplete')
    expect(evaluateLot([good('A1'), good('A2'), good('A3')], { sampling }).status).toBe('pass')
  })

  it('every-part: a lot of 4 with 3 verdicts is incomplete', () => {
    expect(evaluateLot([good('A1'), good('A2'), good('A3')], { lotSize: 4 }).reason).toMatch(
      /3 part\(s\) inspected of 4 required/,
    )
  })

  it('an empty lot is not a pass; a bad lot size throws', () => {
    expect(evaluateLot([]).status).toBe('incomplete')
    expect(() => evaluateLot([], { lotSize: 0 })).toThrow(RuleInputError)
  })
})

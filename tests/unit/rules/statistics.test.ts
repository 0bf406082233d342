import { describe, expect, it } from 'vitest'
import fc from 'fast-check'
import * as ss from 'simple-statistics'
import {
  capability,
  histogramForBand,
  RuleInputError,
  subgroupCapability,
} from '../../../shared/rules/index'
import { indicesFrom } from '../../../server/api/trends/capability'

const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b))

describe('capability — overall sample sd (n − 1) [R formulas; cross-checked with simple-statistics]', () => {
  it('matches simple-statistics on random data (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 100, max: 700, noNaN: true }), { minLength: 2, maxLength: 200 }),
        (values) => {
          const c = capability(values, 300, 500)
          const sd = ss.sampleStandardDeviation(values)
          const mu = ss.mean(values)
          // Two sd algorithms agree to rounding of the values themselves, not of the tiny sd
          const sdClose = Math.abs(c.sd - sd) <= 1e-9 * Math.max(1, Math.abs(mu))
          if (!close(c.mean, mu) || !sdClose || c.n !== values.length) return false
          if (sd <= 1e-10 * mu) return c.cp === undefined
          if (sd <= 1e-8 * mu) return true // near the noise floor either answer is fair
          return (
            close(c.cp!, 200 / (6 * sd)) &&
            close(c.cpl!, (mu - 300) / (3 * sd)) &&
            close(c.cpu!, (500 - mu) / (3 * sd)) &&
            close(c.cpk!, Math.min((mu - 300) / (3 * sd), (500 - mu) / (3 * sd)))
          )
        },
      ),
    )
  })

  it('known values: 8–12 mil band, mean 10, sd 0.5 → Cp = Cpk = 1.333', () => {
    const v = [9.5, 10.5, 9.5, 10.5, 10, 10].map((x) => x * 25.4)
    const sd = ss.sampleStandardDeviation(v)
    const c = capability(v, 8 * 25.4, 12 * 25.4)
    expect(c.cp).toBeCloseTo((4 * 25.4) / (6 * sd), 12)
    expect(c.cpk).toBeCloseTo(c.cp!, 12)
  })

  it('one-sided: only LSL gives cpl and cpk = cpl, no cp', () => {
    const c = capability([300, 320, 340], 250)
    expect(c.cp).toBeUndefined()
    expect(c.cpu).toBeUndefined()
    expect(c.cpk).toBe(c.cpl)
  })

  it('zero spread or a single value leaves the indices undefined', () => {
    expect(capability([300, 300, 300], 250, 350).cp).toBeUndefined()
    // float noise is no spread: CI once found Cp ≈ 10¹⁴ for these
    expect(capability([100.00000000000004, 100, 100.00000000000014], 50, 150).cp).toBeUndefined()
    // the same film typed as 10.1 mil on one tablet (× 25.4, TRADE.md intro [R]) and as 256.54 µm
    // on two others: 256.53999999999996 vs 256.54, an sd of 6e-14 µm that once gave Cp ≈ 10¹²
    expect(capability([10.1 * 25.4, 256.54, 256.54], 200, 300).cpk).toBeUndefined()
    // the trends page (σ from the database) draws the same line
    expect(indicesFrom(100, 7e-14, 50, 150).cpk).toBeNull()
    expect(indicesFrom(100, 0.5, 50, 150).cp).toBeCloseTo(100 / 3, 12)
    expect(capability([300], 250, 350).cpk).toBeUndefined()
  })

  it('refuses empty or non-finite data and reversed limits', () => {
    expect(() => capability([])).toThrow(RuleInputError)
    expect(() => capability([1, Number.NaN])).toThrow(/values\[1\]/)
    expect(() => capability([1, 2], 5, 4)).toThrow(/usl/)
  })
})

describe('subgroup capability — Cp/Cpk from R̄/d₂, Pp/Ppk from overall sd', () => {
  it('d₂ = 1.128, 1.693, 2.059, 2.326 for n = 2…5 — from memory [M]', () => {
    const groups = { 2: 1.128, 3: 1.693, 4: 2.059, 5: 2.326 } as const
    for (const [n, d2] of Object.entries(groups)) {
      const size = Number(n)
      const subgroups = [0, 1, 2].map((k) =>
        Array.from({ length: size }, (_, i) => 300 + k + i * 2),
      )
      const rBar = ss.mean(subgroups.map((g) => Math.max(...g) - Math.min(...g)))
      const r = subgroupCapability(subgroups, 250, 400)
      expect(r.sigmaWithin).toBeCloseTo(rBar / d2, 12)
      expect(r.cp).toBeCloseTo(150 / (6 * (rBar / d2)), 12)
      const sd = ss.sampleStandardDeviation(subgroups.flat())
      expect(r.sigmaOverall).toBeCloseTo(sd, 12)
      expect(r.pp).toBeCloseTo(150 / (6 * sd), 12)
      expect(r.ppk).toBeCloseTo(
        Math.min(400 - ss.mean(subgroups.flat()), ss.mean(subgroups.flat()) - 250) / (3 * sd),
        12,
      )
    }
  })
  it('refuses unequal subgroups', () => {
    expect(() =>
      subgroupCapability([
        [1, 2],
        [1, 2, 3],
      ]),
    ).toThrow(/subgroups\[1\]/)
  })
})

describe('histogram aligned to the band', () => {
  it('counts every value once and marks the band bins', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 0, max: 1000, noNaN: true }), { minLength: 1, maxLength: 300 }),
        (values) => {
          const bins = histogramForBand(values, 300, 500, 10)
          return (
            bins.reduce((s, b) => s + b.count, 0) === values.length &&
            bins.filter((b) => b.inBand).length === 10
          )
        },
      ),
    )
  })
  it('puts edge values in the right bins', () => {
    const bins = histogramForBand([300, 500, 299, 501], 300, 500, 4)
    const band = bins.filter((b) => b.inBand)
    expect(band[0]!.fromUm).toBe(300)
    expect(band[0]!.count).toBe(1) // 300
    expect(band[3]!.count).toBe(1) // 500 falls in the last band bin
    expect(bins[0]!.count).toBe(1) // 299 below the band
    expect(bins[bins.length - 1]!.count).toBe(1) // 501 above
  })
})

import { beforeAll, describe, expect, it } from 'vitest'
import request from 'supertest'
import * as ss from 'simple-statistics'
import { createApp } from '../../../server/app'
import { createUser, tokenFor } from '../support/fixtures'
import { buildHistory, PERIOD, TA_VALUES } from './trendsHistory'
import { capability, histogramForBand, subgroupCapability } from '../../../shared/rules/statistics'
import { westernElectricViolations } from '../../../shared/rules/westernElectric'
import type { ThicknessSection, TrendsReport } from '../../../shared/api/trends'

const app = createApp()
let auth = ''
let t: ThicknessSection

async function thickness(query: string): Promise<ThicknessSection> {
  const res = await request(app).get(`/api/trends?${query}`).set('Authorization', auth)
  expect(res.status, JSON.stringify(res.body)).toBe(200)
  return (res.body as TrendsReport).thickness!
}

beforeAll(async () => {
  await buildHistory()
  auth = await tokenFor(app, await createUser('supervisor'))
  t = await thickness(PERIOD)
})

// TA-1 band 300–500 µm; 17 part means (TA_VALUES); subgroups of 5 within a lot in time order:
// L1 → (400 410 390 420 380) (350 360 340 370 330); L2 → (450 470 430 460 440) + 290, 505 left over.
const FULL_SUBGROUPS = [
  [400, 410, 390, 420, 380],
  [350, 360, 340, 370, 330],
  [450, 470, 430, 460, 440],
]

describe('Line health: capability from SQL aggregates (TRADE.md §8)', () => {
  it('matches the hand-computed figures', () => {
    // n = 17; Σ = 2000 + 1750 + 2250 + 290 + 505 = 6795; mean = 6795 / 17 = 399.70588
    expect(t.n).toBe(17)
    expect(t.meanUm).toBeCloseTo(399.70588, 4)
    // Σ(x − mean)² = 51 123.529; sd = √(51 123.529 / 16) = 56.52628 (overall, n − 1) [R]
    expect(t.sigmaOverallUm).toBeCloseTo(56.52628, 4)
    // Pp = 200 / (6 × 56.52628) = 0.58970; Ppl = 99.70588 / 169.57885 = 0.58796 = Ppk
    expect(t.overall.cp).toBeCloseTo(0.5897, 4)
    expect(t.overall.cpk).toBeCloseTo(0.58796, 4)
    // R̄ = (40 + 40 + 40) / 3 = 40; σ̂ = R̄ / d₂(5) = 40 / 2.326 = 17.19690 (d₂ [M])
    expect(t.subgroupCount).toBe(3)
    expect(t.rBarUm).toBe(40)
    expect(t.d2).toBe(2.326)
    expect(t.sigmaWithinUm).toBeCloseTo(17.1969, 4)
    // Cp = 200 / (6 × 17.19690) = 1.93833; Cpl = 99.70588 / 51.59071 = 1.93263 = Cpk (thin side)
    expect(t.within.cp).toBeCloseTo(1.93833, 4)
    expect(t.within.cpk).toBeCloseTo(1.93263, 4)
    expect(t.within.cpl).toBe(t.within.cpk)
    expect([t.belowMin, t.aboveMax]).toEqual([1, 1])
  })

  it('agrees with shared/rules capability() and with simple-statistics to the last digit shown', () => {
    const rules = capability(TA_VALUES, 300, 500)
    expect(t.meanUm).toBeCloseTo(rules.mean, 10)
    expect(t.sigmaOverallUm!).toBeCloseTo(rules.sd, 10)
    expect(t.overall.cp!.toFixed(2)).toBe(rules.cp!.toFixed(2))
    expect(t.overall.cpk!).toBeCloseTo(rules.cpk!, 10)
    expect(t.overall.cpl!).toBeCloseTo(rules.cpl!, 10)
    expect(t.overall.cpu!).toBeCloseTo(rules.cpu!, 10)
    // An independent package from the npm registry for the descriptive statistics.
    expect(t.meanUm).toBeCloseTo(ss.mean(TA_VALUES), 10)
    expect(t.sigmaOverallUm!).toBeCloseTo(ss.sampleStandardDeviation(TA_VALUES), 10)
    expect([t.minUm, t.maxUm]).toEqual([ss.min(TA_VALUES), ss.max(TA_VALUES)])
    // Cp does not depend on the mean: equal to subgroupCapability() on the three full subgroups.
    const sub = subgroupCapability(FULL_SUBGROUPS, 300, 500)
    expect(t.sigmaWithinUm!).toBeCloseTo(sub.sigmaWithin, 12)
    expect(t.within.cp!).toBeCloseTo(sub.cp!, 12)
  })

  it('reads the indices in plain words, naming the σ behind each', () => {
    expect(t.reading).toContain(
      'Capable: Cpk 1.93 — the band holds the process with room to spare.',
    )
    // Pp 0.59 < 0.8 × Cp 1.94: the means move between subgroups (350 vs 450).
    expect(
      t.reading.some((s) => s.startsWith('Pp 0.59 is well below Cp 1.94: the process drifts')),
    ).toBe(true)
    expect(t.reading.some((s) => s.includes('Only 17 parts'))).toBe(true)
  })

  it('bins the part means against the band like histogramForBand()', () => {
    // Width (500 − 300) / 10 = 20; 290 needs one bin below, 505 one above: 12 bins from 280.
    expect(t.histogram.map((b) => b.count)).toEqual([1, 0, 1, 2, 2, 2, 2, 2, 2, 2, 0, 1])
    expect(t.histogram[0]).toEqual({ fromUm: 280, toUm: 300, count: 1, inBand: false })
    expect(t.histogram.filter((b) => b.inBand)).toHaveLength(10)
    expect(t.histogram).toEqual(histogramForBand(TA_VALUES, 300, 500, 10))
  })

  it('draws the X̄ chart with limits from R̄ and marks the rule-1 points', () => {
    const c = t.controlChart!
    // Subgroup means 400, 350, 450 in time order; X̄̄ = 400; σ(X̄) = 17.19690 / √5 = 7.69069;
    // limits 400 ± 23.07207 → 376.92793 … 423.07207.
    expect(c.points.map((p) => [p.meanUm, p.rangeUm])).toEqual([
      [400, 40],
      [350, 40],
      [450, 40],
    ])
    expect(c.centerUm).toBe(400)
    expect(c.sigmaMeanUm).toBeCloseTo(7.69069, 4)
    expect(c.uclUm).toBeCloseTo(423.07207, 4)
    expect(c.lclUm).toBeCloseTo(376.92793, 4)
    // 350 and 450 are 6.5 σ from the centre: rule 1 (beyond 3σ) at points 2 and 3.
    expect(c.violations.map((v) => [v.index, v.rule])).toEqual([
      [1, 1],
      [2, 1],
    ])
    expect(c.violations[0]!.text).toBe('Rule 1: one point beyond 3σ (thin side)')
    const rules = westernElectricViolations([400, 350, 450], c.centerUm, c.sigmaMeanUm)
    expect(c.violations.map(({ index, rule }) => ({ index, rule }))).toEqual(rules)
  })

  it('finds "2 of 3 beyond 2σ" with subgroups of 2 (Western Electric rule 2 [R])', async () => {
    const c = (await thickness('from=2026-05-04&to=2026-05-10&subgroupSize=2')).controlChart!
    // Means 100 ×7, 104, 104: X̄̄ = 908 / 9 = 100.88889; R̄ = 2; σ̂ = 2 / 1.128 = 1.77305 (d₂ [M]);
    // σ(X̄) = 1.77305 / √2 = 1.25373. 104 → z = 3.11111 / 1.25373 = 2.48 (beyond 2σ, inside 3σ);
    // 100 → z = −0.71. The second 104 completes 2 of 3 beyond 2σ: rule 2 at point 9 (index 8).
    expect(c.points).toHaveLength(9)
    expect(c.centerUm).toBeCloseTo(100.88889, 4)
    expect(c.sigmaMeanUm).toBeCloseTo(1.25373, 4)
    expect(c.violations.map((v) => [v.index, v.rule])).toEqual([[8, 2]])
    expect(c.violations[0]!.text).toContain('thick side')
  })
})

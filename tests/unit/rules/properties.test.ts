import { describe, it } from 'vitest'
import fc from 'fast-check'
import { evaluateIso19840, evaluatePa2 } from '../../../shared/rules/index'

const reading = fc.double({ min: 0, max: 1000, noNaN: true })
const spotArb = fc.array(reading, { minLength: 3, maxLength: 5 })
const areaArb = fc.array(spotArb, { minLength: 1, maxLength: 6 })

describe('SSPC-PA 2 properties', () => {
  it('never passes when an area mean is outside the specified band', () => {
    fc.assert(
      fc.property(
        fc.array(areaArb, { minLength: 1, maxLength: 4 }),
        fc.double({ min: 50, max: 400, noNaN: true }),
        fc.double({ min: 0, max: 400, noNaN: true }),
        fc.constantFrom(1, 2, 3, 4, 5),
        (areas, minUm, width, level) => {
          const maxUm = minUm + width
          const r = evaluatePa2({ minUm, maxUm, level: level as 1 | 2 | 3 | 4 | 5, areas })
          const outside = areas.some((a) => {
            const m =
              a.map((s) => s.reduce((x, y) => x + y, 0) / s.length).reduce((x, y) => x + y, 0) /
              a.length
            return m < minUm * (1 - 1e-6) || m > maxUm * (1 + 1e-6)
          })
          return !(outside && r.pass)
        },
      ),
      { numRuns: 500 },
    )
  })

  it('never passes when a spot is below the level minimum', () => {
    fc.assert(
      fc.property(areaArb, fc.double({ min: 50, max: 400, noNaN: true }), (area, minUm) => {
        const r = evaluatePa2({ minUm, maxUm: minUm * 2, level: 3, areas: [area] })
        const lowSpot = area.some(
          (s) => s.reduce((x, y) => x + y, 0) / s.length < 0.8 * minUm * (1 - 1e-6),
        )
        return !(lowSpot && r.pass)
      }),
    )
  })
})

describe('ISO 19840 properties', () => {
  it('the verdict and statistics do not depend on the order of readings', () => {
    fc.assert(
      fc.property(
        fc.array(reading, { minLength: 1, maxLength: 60 }),
        fc.double({ min: 40, max: 400, noNaN: true }),
        fc.boolean(),
        fc.integer(),
        (readings, nominalUm, allowExactly20Pct, seed) => {
          const shuffled = [...readings]
          let s = seed
          for (let i = shuffled.length - 1; i > 0; i--) {
            s = (s * 1103515245 + 12345) & 0x7fffffff
            const j = s % (i + 1)
            ;[shuffled[i], shuffled[j]] = [shuffled[j]!, shuffled[i]!]
          }
          const a = evaluateIso19840({ nominalUm, readingsUm: readings, allowExactly20Pct })
          const b = evaluateIso19840({ nominalUm, readingsUm: shuffled, allowExactly20Pct })
          return (
            a.pass === b.pass &&
            a.minUm === b.minUm &&
            a.maxUm === b.maxUm &&
            a.belowNominalShare === b.belowNominalShare &&
            Math.abs(a.meanUm - b.meanUm) <= 1e-9 * Math.max(1, a.meanUm)
          )
        },
      ),
      { numRuns: 500 },
    )
  })

  it('never passes with a reading under 80 % of nominal', () => {
    fc.assert(
      fc.property(
        fc.array(reading, { minLength: 1, maxLength: 40 }),
        fc.double({ min: 40, max: 400, noNaN: true }),
        (readings, nominalUm) => {
          const r = evaluateIso19840({ nominalUm, readingsUm: readings })
          return !(readings.some((x) => x < 0.8 * nominalUm * (1 - 1e-6)) && r.pass)
        },
      ),
    )
  })
})

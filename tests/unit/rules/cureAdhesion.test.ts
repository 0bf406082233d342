import { describe, expect, it } from 'vitest'
import {
  checkCrossCut,
  checkDsc,
  checkKnife,
  checkOven,
  checkPullOff,
  checkSolventRub,
  d3359GradeFromPercentRemoved,
  iso2409ToD3359,
  parseD3359Grade,
  psiToMegapascals,
} from '../../../shared/rules/index'

describe('ASTM D5402 solvent rub — solvent, count and criterion are spec fields [R]', () => {
  const spec = { solvent: 'MEK', minDoubleRubs: 50 }
  it('at the count passes, one short fails, removal fails, wrong solvent fails', () => {
    expect(
      checkSolventRub(spec, { solvent: 'mek', doubleRubs: 50, coatingRemoved: false }).pass,
    ).toBe(true)
    expect(
      checkSolventRub(spec, { solvent: 'MEK', doubleRubs: 49, coatingRemoved: false }).reason,
    ).toMatch(/49 double rubs.*50/)
    expect(
      checkSolventRub(spec, { solvent: 'MEK', doubleRubs: 50, coatingRemoved: true }).pass,
    ).toBe(false)
    expect(
      checkSolventRub(spec, { solvent: 'xylene', doubleRubs: 60, coatingRemoved: false }).pass,
    ).toBe(false)
  })
})

describe('FBE DSC ΔTg window — spec field, e.g. −2…+3 °C from memory [M]', () => {
  const spec = { minDeltaTgC: -2, maxDeltaTgC: 3 }
  it('both edges pass, a step outside fails', () => {
    expect(checkDsc(spec, { deltaTgC: -2 }).pass).toBe(true)
    expect(checkDsc(spec, { deltaTgC: 3 }).pass).toBe(true)
    expect(checkDsc(spec, { deltaTgC: -2.1 }).pass).toBe(false)
    expect(checkDsc(spec, { deltaTgC: 3.1 }).reason).toMatch(
      /3\.1 °C is outside the -2\.0 … 3\.0 °C/,
    )
  })
})

describe('oven window — powder maker data sheet, spec field [P]', () => {
  const spec = { minTempC: 200, maxTempC: 245, minMinutes: 2, maxMinutes: 10 }
  it('inside passes; each limit one step outside fails', () => {
    expect(checkOven(spec, { tempC: 200, minutes: 2 }).pass).toBe(true)
    expect(checkOven(spec, { tempC: 245, minutes: 10 }).pass).toBe(true)
    expect(checkOven(spec, { tempC: 199.9, minutes: 5 }).pass).toBe(false)
    expect(checkOven(spec, { tempC: 245.1, minutes: 5 }).pass).toBe(false)
    expect(checkOven(spec, { tempC: 220, minutes: 1.9 }).pass).toBe(false)
    expect(checkOven(spec, { tempC: 220, minutes: 10.1 }).reason).toMatch(/10\.1 min/)
  })
})

describe('ASTM D3359 [R]', () => {
  it('method B grade from % removed: 5B none; 4B < 5; 3B 5–15; 2B 15–35; 1B 35–65; 0B > 65', () => {
    const cases: [number, number][] = [
      [0, 5],
      [0.1, 4],
      [4.9, 4],
      [5, 3],
      [14.9, 3],
      [15, 2],
      [34.9, 2],
      [35, 1],
      [65, 1],
      [65.1, 0],
      [100, 0],
    ]
    for (const [pct, grade] of cases)
      expect(d3359GradeFromPercentRemoved(pct), `${pct} %`).toBe(grade)
  })
  it('parses 5B…0B and 5A…0A', () => {
    expect(parseD3359Grade('4B')).toEqual({ grade: 4, method: 'B' })
    expect(parseD3359Grade('3a')).toEqual({ grade: 3, method: 'A' })
    expect(() => parseD3359Grade('6B')).toThrow(/grade/)
  })
  it('ISO 2409 0/1/2/3 ≈ 5B/4B/3B/2B [R]', () => {
    expect([0, 1, 2, 3].map(iso2409ToD3359)).toEqual([5, 4, 3, 2])
  })
  it('meets the minimum at the minimum, fails one grade below or by the wrong method', () => {
    const spec = { method: 'B' as const, minGrade: 4 }
    expect(checkCrossCut(spec, { grade: '4B' }).status).toBe('pass')
    expect(checkCrossCut(spec, { grade: '5B' }).status).toBe('pass')
    expect(checkCrossCut(spec, { grade: '3B' }).reason).toMatch(/3B is below the minimum 4B/)
    expect(checkCrossCut(spec, { grade: '5A' }).status).toBe('fail')
    expect(checkCrossCut(spec, { percentRemoved: 4.9 }).status).toBe('pass')
    expect(checkCrossCut(spec, { percentRemoved: 5 }).status).toBe('fail')
  })
})

describe('ASTM D6677 knife, 0–10 (10 best) [R]', () => {
  it('at the minimum passes, below fails', () => {
    expect(checkKnife({ minRating: 8 }, { rating: 8 }).status).toBe('pass')
    expect(checkKnife({ minRating: 8 }, { rating: 6 }).status).toBe('fail')
    expect(() => checkKnife({ minRating: 8 }, { rating: 11 })).toThrow(/rating/)
  })
})

describe('ASTM D4541 pull-off [R]', () => {
  const spec = { minMPa: psiToMegapascals(1000) } // 1,000 psi = 6.894757 MPa [C]
  it('every pull at or above the minimum passes; a low pull fails', () => {
    expect(checkPullOff(spec, [{ valueMPa: 6.894757 }, { valueMPa: 9 }]).status).toBe('pass')
    expect(checkPullOff(spec, [{ valueMPa: 6.89 }, { valueMPa: 9 }]).reason).toMatch(
      /pull 1 6\.89 MPa/,
    )
  })
  it('a glue failure below the minimum did not test the coating: repeat (incomplete)', () => {
    expect(checkPullOff(spec, [{ valueMPa: 5, gluePct: 100 }]).status).toBe('incomplete')
    expect(checkPullOff(spec, [{ valueMPa: 8, gluePct: 100 }]).status).toBe('pass')
    expect(checkPullOff(spec, []).status).toBe('incomplete')
  })
})

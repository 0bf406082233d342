import { describe, it, expect } from 'vitest'
import { parseGaugeCsv } from '../../../shared/import/gaugeCsv'

// 1 mil = 25.4 µm exactly (TRADE.md, units) [R].
describe('gauge CSV import', () => {
  it('groups a single column into spots of 3 and areas of 5 spots (SSPC-PA 2: 5 spots × ≥ 3 readings per area [R])', () => {
    const text = ['Reading']
      .concat(Array.from({ length: 18 }, (_, i) => String(400 + i)))
      .join('\n')
    const r = parseGaugeCsv(text)
    expect(r.layout).toBe('single-column')
    expect(r.errors).toEqual([])
    expect(r.rows).toHaveLength(18)
    expect(r.rows.slice(0, 4).map((x) => [x.areaNo, x.spotNo])).toEqual([
      [1, 1],
      [1, 1],
      [1, 1],
      [1, 2],
    ])
    // readings 16–18 are the 6th spot: area 2, spot 1
    expect(r.rows[15]).toMatchObject({ areaNo: 2, spotNo: 1, thicknessUm: 415, row: 17 })
  })

  it('reads a flat list for ISO 19840 as area 1, spot 0', () => {
    const r = parseGaugeCsv('310\n295\n330\n', { rule: 'ISO-19840' })
    expect(r.rows.map((x) => [x.areaNo, x.spotNo, x.thicknessUm])).toEqual([
      [1, 0, 310],
      [1, 0, 295],
      [1, 0, 330],
    ])
  })

  it('converts mils from the header, and names the row of each bad value', () => {
    const r = parseGaugeCsv('reading (mils)\n15.0\n16\nabc\n-2\n14.5\n')
    expect(r.unit).toBe('mil')
    expect(r.rows.map((x) => x.thicknessUm)).toEqual([15 * 25.4, 16 * 25.4, 14.5 * 25.4])
    expect(r.errors).toEqual([
      "row 4: 'abc' is not a number",
      'row 5: -2 mil is outside 0–10000 µm',
    ])
  })

  it('reads area, spot, reading columns in any order and case, with a unit column per row', () => {
    const text = 'Spot,READING,Unit,Area\n1,15.5,mils,1\n2,400,µm,1\n3,410,um,2\nx,400,um,2\n'
    const r = parseGaugeCsv(text)
    expect(r.layout).toBe('area-spot-reading')
    expect(r.rows).toEqual([
      { areaNo: 1, spotNo: 1, thicknessUm: 15.5 * 25.4, row: 2 },
      { areaNo: 1, spotNo: 2, thicknessUm: 400, row: 3 },
      { areaNo: 2, spotNo: 3, thicknessUm: 410, row: 4 },
    ])
    expect(r.errors).toEqual(["row 5: spot 'x' is not a whole number"])
  })

  it('understands a semicolon export with decimal commas and the default unit', () => {
    const r = parseGaugeCsv('area;spot;dft\n1;1;15,2\n1;1;15,8\n', { defaultUnit: 'mil' })
    expect(r.rows.map((x) => x.thicknessUm)).toEqual([15.2 * 25.4, 15.8 * 25.4])
  })

  it('takes a headerless single column in the default unit', () => {
    const r = parseGaugeCsv('12.1\n12.9\n', { defaultUnit: 'mil' })
    expect(r.unit).toBe('mil')
    expect(r.rows[1]!.thicknessUm).toBeCloseTo(327.66, 10)
  })
})

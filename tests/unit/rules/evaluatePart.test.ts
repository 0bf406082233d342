import { describe, expect, it } from 'vitest'
import {
  evaluatePart,
  milsToMicrons as mil,
  RuleInputError,
  type CriterionName,
  type PartVerdict,
} from '../../../shared/rules/index'
import { fbeInput, fbeSpec } from './fbeFixture'

const part = { coatedAreaFt2: 12, label: 'HFW-VB-0042' }
const statusOf = (v: PartVerdict, c: CriterionName) => v.criteria.find((x) => x.criterion === c)!
const statuses = (v: PartVerdict) =>
  Object.fromEntries(v.criteria.map((c) => [c.criterion, c.status]))
const allPass = {
  'surface-prep': 'pass',
  climate: 'pass',
  thickness: 'pass',
  holiday: 'pass',
  cure: 'pass',
  adhesion: 'pass',
}

/** Only `criterion` differs from the conforming record's all-pass verdict. */
function expectOnly(v: PartVerdict, criterion: CriterionName, status: string) {
  expect(statuses(v)).toEqual({ ...allPass, [criterion]: status })
  expect(v.status).toBe(status)
}

describe('evaluatePart — a complete conforming FBE part', () => {
  const v = evaluatePart(fbeSpec(), part, fbeInput())

  it('passes every criterion', () => {
    expect(statuses(v)).toEqual(allPass)
    expect(v.status).toBe('pass')
    expect(v.partLabel).toBe('HFW-VB-0042')
  })

  it('computes the holiday voltage from the measured mean: 16 mils → 2,100 V [C]', () => {
    const h = statusOf(v, 'holiday')
    expect(h.numbers.requiredVoltageV).toBe(2100)
    expect(h.numbers.thicknessBasisUm).toBeCloseTo(mil(16), 9)
    expect(h.caution).toMatch(/injur/)
  })

  it('subtracts the type-1 base metal reading and uses the level 3 limits [R]', () => {
    const t = statusOf(v, 'thickness')
    expect(t.numbers.baseMetalReadingUm).toBe(20)
    expect(t.numbers.meanUm).toBeCloseTo(mil(16), 9)
    expect(t.numbers.spotMinUm).toBeCloseTo(mil(9.6), 9)
    expect(t.numbers.progress).toBe('5 of 5 spots')
    expect(v.samplingPlan.derivation).toMatch(/Small part under 100 ft²/)
  })

  it('the numbers a supervisor reads: spots 15, 16, 17, 16, 16 mils → lowest 15, highest 17, area mean 16 [R: SSPC-PA 2 spot = mean of its readings, area = mean of its spots]', () => {
    const n = statusOf(v, 'thickness').numbers
    expect(n.lowestSpotUm as number).toBeCloseTo(mil(15), 9)
    expect(n.highestSpotUm as number).toBeCloseTo(mil(17), 9)
    expect(n.lowestAreaUm as number).toBeCloseTo(mil(16), 9)
    expect(n).toMatchObject({
      rule: 'SSPC-PA2',
      gaugeType: 'type-1',
      suspectReadings: false,
      level: 3,
      areasRequired: 1, // 12 ft², under 100 ft²: one area [R: SSPC-PA 2]
      spotsRequired: 5, // 5 spots per area [R: SSPC-PA 2]
      readingsRequired: 15,
      readingsRecorded: 15,
    })
    expect(n.spotMaxUm as number).toBeCloseTo(mil(24), 9) // level 3: 120 % of the 20 mil maximum [M: level factors from memory, as shared/rules/pa2.ts says]
  })

  it('climate numbers: dew point 12.00 °C at 20 °C / 60 % [C]', () => {
    expect(statusOf(v, 'climate').numbers.dewPointC as number).toBeCloseTo(12.0, 2)
  })
})

describe('evaluatePart — each criterion failing alone flips only that criterion', () => {
  it('surface prep: commercial blast where near-white is required', () => {
    const input = fbeInput()
    input.surfacePrep!.gradeRecorded = 'SSPC-SP6/Sa2'
    const v = evaluatePart(fbeSpec(), part, input)
    expectOnly(v, 'surface-prep', 'fail')
    expect(statusOf(v, 'surface-prep').reason).toMatch(
      /SSPC-SP6\/Sa2 is less thorough than the required SSPC-SP10\/Sa2\.5/,
    )
  })

  it('surface prep: a profile above the 4 mil band', () => {
    const input = fbeInput()
    input.surfacePrep!.profileLocations.push({ readingsUm: [mil(6.2)], tapeGrade: 'x-coarse' })
    const v = evaluatePart(fbeSpec(), part, input)
    expectOnly(v, 'surface-prep', 'fail')
    expect(statusOf(v, 'surface-prep').reason).toMatch(/location 4: 4\.20 mil .* above/)
  })

  it('climate: steel 14.9 °C at 20 °C / 60 % RH', () => {
    const input = fbeInput()
    input.climate!.steelTempC = 14.9
    const v = evaluatePart(fbeSpec(), part, input)
    expectOnly(v, 'climate', 'fail')
    expect(statusOf(v, 'climate').reason).toMatch(
      /14\.9 °C.*2\.90 °C above the dew point 12\.00 °C.*3\.0 °C/,
    )
  })

  it('thickness: one spot at 9.5 mils under the 9.6 mil spot minimum', () => {
    const input = fbeInput()
    input.thickness!.areas![0]!.spots[1] = { readingsUm: [0, 0, 0].map(() => mil(9.5) + 20) }
    const v = evaluatePart(fbeSpec(), part, input)
    expectOnly(v, 'thickness', 'fail')
    expect(statusOf(v, 'thickness').reason).toMatch(
      /Area 1, spot 2: mean 9\.50 mil .* is 0\.10 mil .* below the spot minimum 9\.60 mil/,
    )
  })

  it('holiday: tested at 1,900 V when 2,100 V is required', () => {
    const input = fbeInput()
    input.holiday!.voltageUsedV = 1900
    const v = evaluatePart(fbeSpec(), part, input)
    expectOnly(v, 'holiday', 'fail')
    expect(statusOf(v, 'holiday').reason).toMatch(/1900 V, 200 V below the required 2100 V/)
  })

  it('holiday: a holiday left unrepaired fails; repaired but not re-tested is incomplete', () => {
    const input = fbeInput()
    input.holiday!.holidays = [{ found: true, repaired: false, retested: false }]
    expectOnly(evaluatePart(fbeSpec(), part, input), 'holiday', 'fail')
    input.holiday!.holidays = [{ found: true, repaired: true, retested: false }]
    const v = evaluatePart(fbeSpec(), part, input)
    expectOnly(v, 'holiday', 'incomplete')
    expect(statusOf(v, 'holiday').reason).toMatch(/1 repaired but not re-tested/)
  })

  it('holiday: wet sponge used where the spec asks for high voltage', () => {
    const input = fbeInput()
    input.holiday!.method = 'low-voltage'
    expectOnly(evaluatePart(fbeSpec(), part, input), 'holiday', 'fail')
  })

  it('cure: ΔTg 3.5 °C outside −2…+3 °C', () => {
    const input = fbeInput()
    input.cure!.dsc = { deltaTgC: 3.5 }
    const v = evaluatePart(fbeSpec(), part, input)
    expectOnly(v, 'cure', 'fail')
    expect(statusOf(v, 'cure').reason).toMatch(/ΔTg 3\.5 °C is outside/)
  })

  it('adhesion: a pull-off at 5.2 MPa under the 6.9 MPa minimum', () => {
    const input = fbeInput()
    input.adhesion!.pullOff!.pulls.push({ valueMPa: 5.2 })
    const v = evaluatePart(fbeSpec(), part, input)
    expectOnly(v, 'adhesion', 'fail')
    expect(statusOf(v, 'adhesion').reason).toMatch(/below the 6\.90 MPa minimum: pull 3 5\.20 MPa/)
  })
})

describe('evaluatePart — incomplete and not-required', () => {
  it('an empty record is incomplete everywhere the spec asks', () => {
    const v = evaluatePart(fbeSpec(), part, {})
    expect(v.status).toBe('incomplete')
    expect(v.criteria.every((c) => c.status === 'incomplete')).toBe(true)
    expect(v.reason).toMatch(/Still open: surface preparation, climate, thickness/)
  })

  it('criteria the spec does not ask for are not-required and do not block a pass', () => {
    const spec = fbeSpec({ holiday: { required: false }, cure: {}, adhesion: {} })
    const input = fbeInput()
    delete input.holiday
    delete input.cure
    delete input.adhesion
    const v = evaluatePart(spec, part, input)
    expect(statuses(v)).toMatchObject({
      holiday: 'not-required',
      cure: 'not-required',
      adhesion: 'not-required',
    })
    expect(v.status).toBe('pass')
  })

  it('suspect readings (failed post-check) leave thickness incomplete', () => {
    const input = fbeInput()
    input.thickness!.suspectReadings = true
    const v = evaluatePart(fbeSpec(), part, input)
    expectOnly(v, 'thickness', 'incomplete')
    expect(statusOf(v, 'thickness').reason).toMatch(/re-measure/)
    expect(statusOf(v, 'thickness').numbers.suspectReadings).toBe(true)
  })

  it('a type-1 gauge without a base metal reading leaves thickness incomplete', () => {
    const input = fbeInput()
    delete input.thickness!.baseMetalReadingsUm
    const v = evaluatePart(fbeSpec(), part, input)
    expect(statusOf(v, 'thickness').status).toBe('incomplete')
    expect(statusOf(v, 'thickness').reason).toMatch(/base metal reading/)
  })

  it('a 250 ft² spool needs 3 areas: one recorded area is "5 of 15 spots"', () => {
    const v = evaluatePart(fbeSpec(), { coatedAreaFt2: 250 }, fbeInput())
    const t = statusOf(v, 'thickness')
    expect(t.status).toBe('incomplete')
    expect(t.numbers.progress).toBe('5 of 15 spots')
    expect(t.reason).toMatch(/5 of 15 spots.*one area per 100 ft² or part = 3 areas/)
  })

  it('ISO 19840 spec: flat readings judged against NDFT', () => {
    const spec = fbeSpec({
      thickness: { rule: 'ISO-19840', minUm: 350, maxUm: null, isoProfileCorrectionUm: 25 },
    })
    const input = fbeInput()
    input.thickness = { gaugeType: 'type-2', readingsUm: [380, 390, 400, 410, 420] }
    input.holiday!.voltageUsedV = Math.round(525 * Math.sqrt(375 / 25.4))
    const v = evaluatePart(spec, { coatedAreaFt2: 5 }, input)
    expect(statusOf(v, 'thickness').status).toBe('pass')
    expect(statusOf(v, 'thickness').numbers.meanUm).toBe(375) // 400 − 25 µm correction
    expect(v.status).toBe('pass')
  })
})

describe('evaluatePart — holiday method and voltage from the spec', () => {
  it('by thickness: a 16 mil film is tested wet-sponge (ASTM D5162, ≤ 500 µm [R]); 5–90 V from memory [M]', () => {
    const spec = fbeSpec({ holiday: { method: 'by-thickness' } })
    const input = fbeInput()
    input.holiday = { method: 'low-voltage', voltageUsedV: 67.5, holidays: [] }
    const v = evaluatePart(spec, part, input)
    expect(statusOf(v, 'holiday').status).toBe('pass')
    expect(statusOf(v, 'holiday').numbers.requiredMethod).toBe('low-voltage')
    input.holiday.voltageUsedV = 95
    expect(statusOf(evaluatePart(spec, part, input), 'holiday').status).toBe('fail')
  })

  it("the spec's fixed voltage overrides the formula (NACE SP0188 changed in 2024 [R])", () => {
    const spec = fbeSpec({
      holiday: { method: 'high-voltage', voltageRule: 'fixed', fixedVoltageV: 2500 },
    })
    const input = fbeInput()
    expect(statusOf(evaluatePart(spec, part, input), 'holiday').status).toBe('fail') // 2,100 V used
    input.holiday!.voltageUsedV = 2500
    expect(statusOf(evaluatePart(spec, part, input), 'holiday').status).toBe('pass')
  })

  it('ISO 19840 spec with NDFT < 40 µm says it is outside the scope', () => {
    const spec = fbeSpec({ thickness: { rule: 'ISO-19840', minUm: 30, maxUm: null } })
    const input = fbeInput()
    input.thickness = { gaugeType: 'type-2', readingsUm: [32, 33, 34, 35, 36] }
    const t = statusOf(evaluatePart(spec, { coatedAreaFt2: 5 }, input), 'thickness')
    expect(t.reason).toMatch(/outside the scope of ISO 19840/)
    expect(t.numbers.inScope).toBe(false)
  })
})

describe('evaluatePart — bad input throws RuleInputError naming the field', () => {
  it('a reading over 10,000 µm', () => {
    const input = fbeInput()
    input.thickness!.areas![0]!.spots[0]!.readingsUm[1] = 12000
    expect(() => evaluatePart(fbeSpec(), part, input)).toThrow(RuleInputError)
    try {
      evaluatePart(fbeSpec(), part, input)
    } catch (e) {
      expect((e as RuleInputError).field).toBe('thickness.areas[0].spots[0].readingsUm[1]')
    }
  })
  it('RH over 100 % and a non-finite steel temperature', () => {
    const input = fbeInput()
    input.climate!.relativeHumidityPct = 120
    expect(() => evaluatePart(fbeSpec(), part, input)).toThrow(/climate\.relativeHumidityPct/)
    input.climate = { airTempC: 20, relativeHumidityPct: 50, steelTempC: Number.NaN }
    expect(() => evaluatePart(fbeSpec(), part, input)).toThrow(/climate\.steelTempC/)
  })
  it('a negative coated area', () => {
    expect(() => evaluatePart(fbeSpec(), { coatedAreaFt2: -3 }, fbeInput())).toThrow(
      /coatedAreaFt2/,
    )
  })
  it('the input survives a JSON round trip unchanged in verdict', () => {
    const input = JSON.parse(JSON.stringify(fbeInput()))
    expect(evaluatePart(fbeSpec(), part, input).status).toBe('pass')
  })
})

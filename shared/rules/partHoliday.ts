/**
 * The holiday criterion of one part (ASTM D5162 method, NACE SP0490 / SP0274 voltage or the
 * spec's fixed voltage; see holiday.ts). Thickness basis for the voltage: the record's
 * `thicknessBasisUm`, else the part's measured mean DFT, else the spec minimum.
 * Verdict: the method and the voltage used must match the requirement (± spec tolerance) — a test
 * at the wrong voltage is not a pass; an unrepaired holiday fails the part; a repaired holiday not
 * yet re-tested leaves it incomplete.
 */
import type { SpecContent } from '../spec/specContent'
import { formatUm } from './format'
import {
  HOLIDAY_SAFETY_CAUTION,
  holidayMethod,
  holidayTestVoltage,
  holidayVoltageDerivation,
  openHolidays,
  voltageWithinTolerance,
  WET_SPONGE_RANGE_V,
  type HolidayMethod,
} from './holiday'
import type { PartInspectionInput } from './partInput'
import type { CriterionResult } from './verdict'

export function evaluateHolidayCriterion(
  spec: SpecContent,
  input: PartInspectionInput,
  measuredMeanUm: number | null,
): CriterionResult {
  const h = spec.holiday
  if (!h.required) {
    return {
      criterion: 'holiday',
      status: 'not-required',
      reason: 'The spec does not ask for a holiday test.',
      numbers: {},
    }
  }
  const rec = input.holiday
  const basisUm = rec?.thicknessBasisUm ?? measuredMeanUm ?? spec.thickness.minUm
  const basisFrom =
    rec?.thicknessBasisUm !== undefined
      ? 'as recorded'
      : measuredMeanUm !== null
        ? 'measured mean DFT'
        : 'spec minimum DFT'
  const method: HolidayMethod = h.method === 'by-thickness' ? holidayMethod(basisUm) : h.method
  let requiredV: number | null = null
  let derivation: string
  if (h.voltageRule === 'fixed') {
    requiredV = h.fixedVoltageV
    derivation =
      requiredV === null
        ? 'the spec says fixed voltage but gives none'
        : `spec fixed voltage ${requiredV} V`
  } else if (method === 'high-voltage') {
    requiredV = holidayTestVoltage(basisUm, h.voltageRule)
    derivation = `${holidayVoltageDerivation(basisUm, h.voltageRule)} = ${requiredV} V`
  } else {
    requiredV = h.fixedVoltageV
    derivation =
      requiredV === null
        ? `wet sponge, ${WET_SPONGE_RANGE_V.min}–${WET_SPONGE_RANGE_V.max} V`
        : `spec wet-sponge voltage ${requiredV} V`
  }
  if (h.standardEdition) derivation += ` (${h.standardEdition})`
  const numbers: CriterionResult['numbers'] = {
    requiredMethod: method,
    recordedMethod: rec?.method ?? null,
    thicknessBasisUm: basisUm,
    thicknessBasis: basisFrom,
    requiredVoltageV: requiredV,
    voltageUsedV: rec?.voltageUsedV ?? null,
    tolerancePct: h.voltageTolerancePct,
    voltageRule: h.voltageRule,
  }
  const out = (status: CriterionResult['status'], reason: string): CriterionResult => ({
    criterion: 'holiday',
    status,
    reason: `${reason} Required: ${method}, ${derivation}; thickness basis ${formatUm(basisUm, spec.thickness.bandUnit)} (${basisFrom}).`,
    numbers,
    caution: HOLIDAY_SAFETY_CAUTION,
  })
  if (h.voltageRule === 'fixed' && requiredV === null)
    return out('incomplete', 'The spec needs a voltage before this test can be judged.')
  if (!rec) return out('incomplete', 'No holiday test recorded.')
  if (rec.method !== method)
    return out('fail', `Tested ${rec.method}; the spec asks for ${method}.`)
  if (rec.voltageUsedV === null) return out('incomplete', 'Voltage used not recorded.')
  const used = rec.voltageUsedV
  if (requiredV !== null) {
    if (!voltageWithinTolerance(used, requiredV, h.voltageTolerancePct)) {
      const off = used - requiredV
      return out(
        'fail',
        `Tested at ${used} V, ${Math.abs(off)} V ${off < 0 ? 'below' : 'above'} the required ${requiredV} V (± ${h.voltageTolerancePct} % allowed); re-test at the required voltage.`,
      )
    }
  } else if (used < WET_SPONGE_RANGE_V.min || used > WET_SPONGE_RANGE_V.max) {
    return out(
      'fail',
      `Wet-sponge test at ${used} V is outside ${WET_SPONGE_RANGE_V.min}–${WET_SPONGE_RANGE_V.max} V.`,
    )
  }
  const { unrepaired, notRetested } = openHolidays(rec.holidays)
  const found = rec.holidays.filter((x) => x.found).length
  numbers.holidaysFound = found
  numbers.unrepaired = unrepaired
  numbers.notRetested = notRetested
  if (unrepaired > 0)
    return out('fail', `${found} holiday(s) found at ${used} V; ${unrepaired} not repaired.`)
  if (notRetested > 0)
    return out(
      'incomplete',
      `${found} holiday(s) found at ${used} V; ${notRetested} repaired but not re-tested.`,
    )
  const summary = found === 0 ? 'No holidays' : `${found} holiday(s) repaired and re-tested clear`
  return out('pass', `${summary} at ${used} V.`)
}

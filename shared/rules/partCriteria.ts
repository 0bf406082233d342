/** Surface-prep, climate, cure and adhesion criteria of one part (rules in their own files). */
import type { SpecContent } from '../spec/specContent'
import { checkCrossCut, checkKnife, checkPullOff, type AdhesionOutcome } from './adhesion'
import { checkClimate } from './climate'
import { checkDsc, checkOven, checkSolventRub } from './cure'
import { formatUm } from './format'
import type { PartInspectionInput } from './partInput'
import { cleanlinessMeets, evaluateProfile } from './surfacePrep'
import { combineStatuses, num, type CriterionResult } from './verdict'

export function evaluateSurfacePrepCriterion(
  spec: SpecContent,
  input: PartInspectionInput,
): CriterionResult {
  const s = spec.surfacePrep
  const rec = input.surfacePrep
  const numbers: CriterionResult['numbers'] = {
    requiredGrade: s.grade,
    recordedGrade: rec?.gradeRecorded ?? null,
    profileMethod: rec?.profileMethod ?? s.profileMethod,
    profileMinUm: s.profileMinUm,
    profileMaxUm: s.profileMaxUm,
  }
  if (!rec)
    return {
      criterion: 'surface-prep',
      status: 'incomplete',
      reason: 'No surface preparation recorded.',
      numbers,
    }
  const parts: string[] = []
  const statuses: CriterionResult['status'][] = []
  if (rec.gradeRecorded === null) {
    statuses.push('incomplete')
    parts.push('Cleanliness grade not recorded.')
  } else if (!cleanlinessMeets(s.grade, rec.gradeRecorded)) {
    statuses.push('fail')
    parts.push(`Cleanliness ${rec.gradeRecorded} is less thorough than the required ${s.grade}.`)
  } else {
    statuses.push('pass')
    parts.push(`Cleanliness ${rec.gradeRecorded} meets ${s.grade}.`)
  }
  const method = rec.profileMethod ?? s.profileMethod
  if (method !== s.profileMethod) {
    statuses.push('fail')
    parts.push(`Profile measured by ASTM D4417 ${method}; the spec asks for ${s.profileMethod}.`)
  }
  const p = evaluateProfile(
    method,
    rec.profileLocations,
    { minUm: s.profileMinUm, maxUm: s.profileMaxUm },
    s.replicaOverlapRetest,
  )
  numbers.profileMeanUm = num(p.meanUm)
  numbers.profileLowestUm = num(p.minUm)
  numbers.profileHighestUm = num(p.maxUm)
  numbers.profileLocations = rec.profileLocations.length
  statuses.push(p.status)
  if (p.status === 'pass') {
    parts.push(
      `Profile ${formatUm(p.minUm, 'mil')} – ${formatUm(p.maxUm, 'mil')} at ${rec.profileLocations.length} location(s), inside ${formatUm(s.profileMinUm, 'mil')} – ${formatUm(s.profileMaxUm, 'mil')}.`,
    )
  } else parts.push(...p.reasons)
  return {
    criterion: 'surface-prep',
    status: combineStatuses(statuses),
    reason: parts.join(' '),
    numbers,
  }
}

export function evaluateClimateCriterion(
  spec: SpecContent,
  input: PartInspectionInput,
): CriterionResult {
  const c = spec.climate
  const rec = input.climate
  const numbers: CriterionResult['numbers'] = {
    minMarginC: c.minSteelAboveDewPointC,
    maxRelativeHumidityPct: c.maxRelativeHumidityPct,
  }
  if (!rec)
    return {
      criterion: 'climate',
      status: 'incomplete',
      reason: 'No climate reading recorded.',
      numbers,
    }
  const r = checkClimate(rec, {
    minMarginC: c.minSteelAboveDewPointC,
    maxRelativeHumidityPct: c.maxRelativeHumidityPct,
  })
  numbers.airTempC = rec.airTempC
  numbers.relativeHumidityPct = rec.relativeHumidityPct
  numbers.steelTempC = rec.steelTempC
  numbers.dewPointC = r.dewPointC
  numbers.marginC = r.marginC
  const reason = r.pass
    ? `Steel ${rec.steelTempC.toFixed(1)} °C is ${r.marginC.toFixed(2)} °C above the dew point ${r.dewPointC.toFixed(2)} °C (≥ ${c.minSteelAboveDewPointC} °C) at ${rec.relativeHumidityPct} % RH (≤ ${c.maxRelativeHumidityPct} %).`
    : r.reasons.join(' ')
  return {
    criterion: 'climate',
    status: r.pass ? 'pass' : 'fail',
    reason,
    numbers,
  }
}

type Item = { status: CriterionResult['status']; reason: string }

function summarise(
  criterion: 'cure' | 'adhesion',
  items: Item[],
  numbers: CriterionResult['numbers'],
): CriterionResult {
  if (items.length === 0) {
    return {
      criterion,
      status: 'not-required',
      reason: `The spec asks for no ${criterion} test.`,
      numbers,
    }
  }
  const status = combineStatuses(items.map((i) => i.status))
  // Lead with what is wrong, so the first words a supervisor reads are the problem.
  const order = { fail: 0, incomplete: 1, pass: 2, 'not-required': 3 }
  const sorted = [...items].sort((a, b) => order[a.status] - order[b.status])
  return {
    criterion,
    status,
    reason: sorted.map((i) => i.reason).join(' '),
    numbers,
  }
}

export function evaluateCureCriterion(
  spec: SpecContent,
  input: PartInspectionInput,
): CriterionResult {
  const c = spec.cure
  const rec = input.cure ?? {}
  const items: Item[] = []
  const numbers: CriterionResult['numbers'] = {}
  const pf = (o: { pass: boolean; reason: string }): Item => ({
    status: o.pass ? 'pass' : 'fail',
    reason: o.reason,
  })
  if (c.solventRub) {
    numbers.minDoubleRubs = c.solventRub.minDoubleRubs
    numbers.solvent = c.solventRub.solvent
    numbers.doubleRubs = rec.solventRub?.doubleRubs ?? null
    items.push(
      rec.solventRub
        ? pf(checkSolventRub(c.solventRub, rec.solventRub))
        : {
            status: 'incomplete',
            reason: 'ASTM D5402 solvent rub not recorded.',
          },
    )
  }
  if (c.dsc) {
    numbers.minDeltaTgC = c.dsc.minDeltaTgC
    numbers.maxDeltaTgC = c.dsc.maxDeltaTgC
    numbers.deltaTgC = rec.dsc?.deltaTgC ?? null
    items.push(
      rec.dsc
        ? pf(checkDsc(c.dsc, rec.dsc))
        : { status: 'incomplete', reason: 'DSC ΔTg not recorded.' },
    )
  }
  if (c.oven) {
    numbers.minTempC = c.oven.minTempC
    numbers.maxTempC = c.oven.maxTempC
    numbers.minMinutes = c.oven.minMinutes
    numbers.maxMinutes = c.oven.maxMinutes
    numbers.ovenTempC = rec.oven?.tempC ?? null
    numbers.ovenMinutes = rec.oven?.minutes ?? null
    items.push(
      rec.oven
        ? pf(checkOven(c.oven, rec.oven))
        : {
            status: 'incomplete',
            reason: 'Oven temperature and time not recorded.',
          },
    )
  }
  return summarise('cure', items, numbers)
}

export function evaluateAdhesionCriterion(
  spec: SpecContent,
  input: PartInspectionInput,
): CriterionResult {
  const a = spec.adhesion
  const rec = input.adhesion ?? {}
  const items: AdhesionOutcome[] = []
  const numbers: CriterionResult['numbers'] = {}
  if (a.crossCut) {
    numbers.crossCutMinGrade = `${a.crossCut.minGrade}${a.crossCut.method}`
    numbers.crossCutGrade = rec.crossCut?.grade ?? null
    numbers.percentRemoved = rec.crossCut?.percentRemoved ?? null
    items.push(
      rec.crossCut
        ? checkCrossCut(a.crossCut, rec.crossCut)
        : { status: 'incomplete', reason: 'ASTM D3359 test not recorded.' },
    )
  }
  if (a.knife) {
    numbers.knifeMinRating = a.knife.minRating
    numbers.knifeRating = rec.knife?.rating ?? null
    items.push(
      rec.knife
        ? checkKnife(a.knife, rec.knife)
        : {
            status: 'incomplete',
            reason: 'ASTM D6677 knife test not recorded.',
          },
    )
  }
  if (a.pullOff) {
    const pulls = rec.pullOff?.pulls ?? []
    numbers.pullOffMinMPa = a.pullOff.minMPa
    numbers.pullOffLowestMPa = pulls.length ? Math.min(...pulls.map((p) => p.valueMPa)) : null
    items.push(checkPullOff(a.pullOff, pulls))
  }
  return summarise('adhesion', items, numbers)
}

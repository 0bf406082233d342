/**
 * The thickness criterion of one part: SSPC-PA 2 or ISO 19840 as the spec says, after the
 * type-1 gauge base metal reading (ASTM D7091 via PA 2 [R]) or the ISO 19840 profile correction
 * [M — spec field] is taken off. A type-1 BMR replaces the ISO correction (it measures the
 * profile's effect directly), so the two are never both subtracted.
 * Suspect readings (failed post-measurement gauge check) make the criterion incomplete.
 */
import type { SpecContent } from '../spec/specContent'
import { mean } from './errors'
import { formatUm } from './format'
import { evaluateIso19840 } from './iso19840'
import {
  baseMetalReadingUm,
  evaluatePa2,
  PA2_SPOTS_PER_AREA,
  subtractBaseMetalReading,
} from './pa2'
import type { PartInfo, PartInspectionInput } from './partInput'
import { samplingPlan, type SamplingPlan } from './sampling'
import { num, type CriterionResult } from './verdict'

export interface ThicknessOutcome {
  result: CriterionResult
  /** Mean measured DFT (µm) when any complete measurement exists — the holiday voltage basis. */
  measuredMeanUm: number | null
  plan: SamplingPlan
}

export function evaluateThicknessCriterion(
  spec: SpecContent,
  part: PartInfo,
  input: PartInspectionInput,
): ThicknessOutcome {
  const t = spec.thickness
  const unit = t.bandUnit
  const f = (v: number) => formatUm(v, unit)
  const rec = input.thickness
  const areasRaw = (rec?.areas ?? []).map((a) => a.spots.map((s) => s.readingsUm))
  const flatRaw = rec?.readingsUm ?? []
  const plan = samplingPlan(t.rule, part.coatedAreaFt2, {
    areas: areasRaw,
    readingCount: flatRaw.length,
  })
  // The numbers start as one object literal and grow by plain property stores, in the order a
  // supervisor reads them (plan, record, then the rule's). Not spread into a new object nor
  // Object.assign-ed: either made this criterion three times slower (8–10 → 28–35 µs for a part
  // of 15 readings, bundled, node 20), and it runs on every readings POST.
  const numbers: CriterionResult['numbers'] = {
    rule: t.rule,
    progress: plan.progress,
    areasRequired: plan.areasRequired,
    spotsRequired: plan.spotsRequired,
    readingsRequired: plan.readingsRequired,
    readingsRecorded: plan.readingsRecorded,
  }
  if (!rec) {
    const reason = `No thickness readings yet. Plan: ${plan.derivation}`
    return {
      result: { criterion: 'thickness', status: 'incomplete', reason, numbers },
      measuredMeanUm: null,
      plan,
    }
  }
  let bmrUm: number | null = null
  if (rec.gaugeType === 'type-1') {
    if (rec.baseMetalReadingsUm?.length) bmrUm = baseMetalReadingUm(rec.baseMetalReadingsUm)
    else if (rec.baseMetalReadingUm !== undefined) bmrUm = rec.baseMetalReadingUm
  }
  const needsBmr = rec.gaugeType === 'type-1' && bmrUm === null
  const correct = (rs: number[]) => (bmrUm === null ? rs : subtractBaseMetalReading(rs, bmrUm))
  numbers.gaugeType = rec.gaugeType
  numbers.baseMetalReadingUm = num(bmrUm)
  numbers.suspectReadings = rec.suspectReadings === true
  let status: 'pass' | 'fail' | 'incomplete'
  let detail: string[]
  let measuredMeanUm: number | null
  if (t.rule === 'SSPC-PA2') {
    const r = evaluatePa2({
      minUm: t.minUm,
      maxUm: t.maxUm,
      level: t.pa2Level,
      areas: areasRaw.map((a) => a.map(correct)),
      spotsPerArea: PA2_SPOTS_PER_AREA,
      displayUnit: unit,
    })
    const spotMeans = r.areas.flatMap((a) =>
      a.spots.filter((s) => s.status !== 'incomplete').map((s) => s.meanUm),
    )
    measuredMeanUm = spotMeans.length ? mean(spotMeans) : null
    numbers.minUm = t.minUm
    numbers.maxUm = t.maxUm
    numbers.level = t.pa2Level
    numbers.spotMinUm = r.spotMinUm
    numbers.spotMaxUm = r.spotMaxUm
    numbers.meanUm = num(measuredMeanUm)
    numbers.lowestSpotUm = spotMeans.length ? Math.min(...spotMeans) : null
    numbers.highestSpotUm = spotMeans.length ? Math.max(...spotMeans) : null
    numbers.lowestAreaUm = num(Math.min(...r.areas.map((a) => a.meanUm).filter(Number.isFinite)))
    status =
      r.status === 'incomplete' || (r.status === 'pass' && !plan.complete) ? 'incomplete' : r.status
    detail = r.reasons
    if (status === 'pass') {
      const band = `${f(t.minUm)} – ${t.maxUm === null ? 'no maximum' : f(t.maxUm)}`
      const spotBand = `${f(r.spotMinUm)} – ${r.spotMaxUm === null ? 'no maximum' : f(r.spotMaxUm)}`
      detail = [
        `SSPC-PA 2: every area mean inside ${band}; every spot inside the level ${t.pa2Level} limits ${spotBand}; mean ${f(measuredMeanUm ?? NaN)}.`,
      ]
    }
  } else {
    const useBmr = rec.gaugeType === 'type-1' && bmrUm !== null
    const correctionUm = useBmr ? 0 : t.isoProfileCorrectionUm
    const r = evaluateIso19840({
      nominalUm: t.minUm,
      maxUm: t.maxUm,
      readingsUm: correct(flatRaw),
      allowExactly20Pct: t.isoAllowExactly20Pct,
      profileCorrectionUm: correctionUm,
      displayUnit: unit,
    })
    measuredMeanUm = num(r.meanUm)
    numbers.nominalUm = t.minUm
    numbers.maxAllowedUm = r.maxAllowedUm
    numbers.floorUm = r.floorUm
    numbers.profileCorrectionUm = correctionUm
    numbers.meanUm = num(r.meanUm)
    numbers.lowestUm = num(r.minUm)
    numbers.highestUm = num(r.maxUm)
    numbers.belowNominalShare = num(r.belowNominalShare)
    numbers.inScope = r.inScope
    status =
      r.status === 'fail'
        ? 'fail'
        : r.status === 'incomplete' || !plan.complete
          ? 'incomplete'
          : 'pass'
    detail = r.reasons
    if (status === 'pass') {
      detail = [
        `ISO 19840: mean ${f(r.meanUm)} ≥ nominal ${f(t.minUm)}; lowest ${f(r.minUm)} ≥ ${f(r.floorUm)}; ` +
          `highest ${f(r.maxUm)} ≤ ${f(r.maxAllowedUm)}.`,
        ...r.reasons,
      ]
    }
  }
  const notes: string[] = []
  if (needsBmr)
    notes.push(
      'Type 1 gauge: record the base metal reading (about 10 bare-steel readings) before the readings count.',
    )
  if (rec.suspectReadings)
    notes.push(
      'The gauge failed its post-measurement check: re-measure every reading since the last good check.',
    )
  if ((needsBmr || rec.suspectReadings) && status !== 'incomplete') status = 'incomplete'
  if (status === 'incomplete' && !plan.complete)
    notes.push(`Progress ${plan.progress}. ${plan.derivation}`)
  if (status === 'incomplete' && detail.length === 0 && !needsBmr && !rec.suspectReadings) {
    detail.push('The readings recorded so far conform.')
  }
  const reason = [...notes, ...detail].join(' ')
  return { result: { criterion: 'thickness', status, reason, numbers }, measuredMeanUm, plan }
}

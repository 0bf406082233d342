/**
 * The certificate's result lines, worded from the parts' stored verdicts (the authoritative
 * numbers the shared rules computed): one line per test, ranges across the lot's parts. Pure.
 */
import type { CertificateData } from '../../../shared/api/certificates'
import type { PartVerdict } from '../../../shared/rules/evaluatePart'
import type { CriterionName, CriterionResult } from '../../../shared/rules/verdict'
import type { CleanlinessGrade, SpecContent } from '../../../shared/spec/specContent'
import { formatThickness, unitSymbol, type ThicknessUnit } from '../../pdf/format'

/** SSPC and ISO 8501-1 designations as written on paper (TRADE.md §4 [R]). */
export const GRADE_LABELS: Record<CleanlinessGrade, string> = {
  'SSPC-SP7/Sa1': 'SSPC-SP 7 / Sa 1 (ISO 8501-1)',
  'SSPC-SP6/Sa2': 'SSPC-SP 6 / Sa 2 (ISO 8501-1)',
  'SSPC-SP14': 'SSPC-SP 14',
  'SSPC-SP10/Sa2.5': 'SSPC-SP 10 / Sa 2½ (ISO 8501-1)',
  'SSPC-SP5/Sa3': 'SSPC-SP 5 / Sa 3 (ISO 8501-1)',
}
const PROFILE_METHOD_LABELS: Record<string, string> = {
  'A-comparator': 'ASTM D4417 method A, comparator',
  'B-depth-micrometer': 'ASTM D4417 method B, depth micrometer',
  'C-replica-tape': 'ASTM D4417 method C, replica tape',
}

type Numbers = CriterionResult['numbers']

/** The numbers of one criterion from every part whose verdict has it passing. */
export function passedNumbers(verdicts: PartVerdict[], criterion: CriterionName): Numbers[] {
  return verdicts.flatMap((v) =>
    v.criteria
      .filter((c) => c.criterion === criterion && c.status === 'pass')
      .map((c) => c.numbers),
  )
}

function values(rows: Numbers[], key: string): number[] {
  return rows
    .map((r) => r[key])
    .filter((v): v is number => typeof v === 'number' && Number.isFinite(v))
}

const grouped = (v: number, decimals: number) =>
  v.toLocaleString('en-GB', { minimumFractionDigits: decimals, maximumFractionDigits: decimals })

/** "8.1–11.0" or "9.0" when every part read the same; null without values. */
export function range(vs: number[], decimals: number): string | null {
  if (vs.length === 0) return null
  const lo = grouped(Math.min(...vs), decimals)
  const hi = grouped(Math.max(...vs), decimals)
  if (lo === hi) return lo
  // "-0.8–1.1" reads as a subtraction: below zero the range is written with "to".
  return Math.min(...vs) < 0 ? `${lo} to ${hi}` : `${lo}–${hi}`
}

function thicknessRange(vs: number[], unit: ThicknessUnit): string | null {
  if (vs.length === 0) return null
  const lo = formatThickness(Math.min(...vs), unit)
  const hi = formatThickness(Math.max(...vs), unit)
  return `${lo === hi ? lo : `${lo}–${hi}`} ${unitSymbol(unit)}`
}

export function bandText(spec: SpecContent, unit: ThicknessUnit): string {
  const t = spec.thickness
  const f = (um: number) => formatThickness(um, unit)
  const sym = unitSymbol(unit)
  if (t.rule === 'ISO-19840') {
    return `nominal ${f(t.minUm)} ${sym}${t.maxUm === null ? '' : `, maximum ${f(t.maxUm)} ${sym}`}`
  }
  return t.maxUm === null ? `${f(t.minUm)} ${sym} minimum` : `${f(t.minUm)}–${f(t.maxUm)} ${sym}`
}

export function acceptanceRuleText(spec: SpecContent): string {
  const t = spec.thickness
  if (t.rule === 'SSPC-PA2') return `SSPC-PA 2, restriction level ${t.pa2Level}`
  const share = t.isoAllowExactly20Pct ? 'at most 20 %' : 'under 20 %'
  return `ISO 19840: mean ≥ nominal, every reading ≥ 80 % of nominal, ${share} of readings below nominal`
}

export function surfacePrepSummary(
  spec: SpecContent,
  verdicts: PartVerdict[],
  unit: ThicknessUnit,
): CertificateData['surfacePrep'] {
  const rows = passedNumbers(verdicts, 'surface-prep')
  const sp = spec.surfacePrep
  const grades = [...new Set(rows.map((r) => r.recordedGrade).filter((g) => typeof g === 'string'))]
  const gradesRecorded =
    grades.length === 0
      ? 'Not recorded'
      : grades.length === 1 && rows.length === verdicts.length
        ? `${GRADE_LABELS[grades[0] as CleanlinessGrade] ?? grades[0]} on every inspected part`
        : grades.map((g) => GRADE_LABELS[g as CleanlinessGrade] ?? g).join('; ')
  const lows = values(rows, 'profileLowestUm')
  const highs = values(rows, 'profileHighestUm')
  const recorded = thicknessRange([...lows, ...highs], unit)
  return {
    gradeRequired: GRADE_LABELS[sp.grade],
    gradesRecorded,
    profileBand: `${formatThickness(sp.profileMinUm, unit)}–${formatThickness(sp.profileMaxUm, unit)} ${unitSymbol(unit)}`,
    profileRecorded: recorded
      ? `${recorded} (${PROFILE_METHOD_LABELS[sp.profileMethod] ?? sp.profileMethod})`
      : 'Not recorded',
  }
}

export function climateSummary(
  spec: SpecContent,
  verdicts: PartVerdict[],
): CertificateData['climate'] {
  const rows = passedNumbers(verdicts, 'climate')
  if (rows.length === 0) return null
  const margin = range(values(rows, 'marginC'), 1)
  const rh = range(values(rows, 'relativeHumidityPct'), 0)
  const air = range(values(rows, 'airTempC'), 1)
  const steel = range(values(rows, 'steelTempC'), 1)
  const c = spec.climate
  return {
    summary:
      `Steel ${steel} °C, ${margin} °C above the dew point (at least ${c.minSteelAboveDewPointC} °C required); ` +
      `relative humidity ${rh} % (at most ${c.maxRelativeHumidityPct} %); air ${air} °C.`,
  }
}

export function holidaySummary(
  spec: SpecContent,
  verdicts: PartVerdict[],
): CertificateData['holiday'] {
  if (!spec.holiday.required) return null
  const rows = passedNumbers(verdicts, 'holiday')
  if (rows.length === 0) return null
  const methods = new Set(rows.map((r) => r.recordedMethod))
  const method = [...methods]
    .map((m) =>
      m === 'low-voltage'
        ? 'Low-voltage wet sponge (ASTM D5162 method A)'
        : 'High-voltage spark (ASTM D5162 method B)',
    )
    .join('; ')
  const used = range(values(rows, 'voltageUsedV'), 0)
  const required = range(values(rows, 'requiredVoltageV'), 0)
  const found = values(rows, 'holidaysFound').reduce((a, b) => a + b, 0)
  return {
    method,
    voltage: `${used} V${required ? ` (required ${required} V, ± ${spec.holiday.voltageTolerancePct} %)` : ''}`,
    result:
      found === 0
        ? 'No holidays found'
        : `${found} holiday${found === 1 ? '' : 's'} found, repaired and re-tested clear`,
  }
}

export function cureLines(spec: SpecContent, verdicts: PartVerdict[]): string[] {
  const rows = passedNumbers(verdicts, 'cure')
  const c = spec.cure
  const lines: string[] = []
  if (c.solventRub && rows.length) {
    lines.push(
      `ASTM D5402 solvent rub (${c.solventRub.solvent}): ${range(values(rows, 'doubleRubs'), 0)} double rubs without removing the coating (at least ${c.solventRub.minDoubleRubs})`,
    )
  }
  if (c.dsc && rows.length) {
    lines.push(
      `DSC ΔTg ${range(values(rows, 'deltaTgC'), 1)} °C (limits ${c.dsc.minDeltaTgC} to ${c.dsc.maxDeltaTgC} °C)`,
    )
  }
  if (c.oven && rows.length) {
    lines.push(
      `Oven cure ${range(values(rows, 'ovenTempC'), 0)} °C for ${range(values(rows, 'ovenMinutes'), 0)} min ` +
        `(window ${c.oven.minTempC}–${c.oven.maxTempC} °C, ${c.oven.minMinutes}–${c.oven.maxMinutes} min)`,
    )
  }
  return lines
}

export function adhesionLines(spec: SpecContent, verdicts: PartVerdict[]): string[] {
  const rows = passedNumbers(verdicts, 'adhesion')
  const a = spec.adhesion
  const lines: string[] = []
  if (a.crossCut && rows.length) {
    const grades = [
      ...new Set(rows.map((r) => r.crossCutGrade).filter((g) => typeof g === 'string')),
    ]
    lines.push(
      `ASTM D3359 method ${a.crossCut.method}: ${grades.join(', ') || '—'} (at least ${a.crossCut.minGrade}${a.crossCut.method})`,
    )
  }
  if (a.knife && rows.length) {
    lines.push(
      `ASTM D6677 knife adhesion: rating ${range(values(rows, 'knifeRating'), 0)} (at least ${a.knife.minRating})`,
    )
  }
  if (a.pullOff && rows.length) {
    lines.push(
      `ASTM D4541 pull-off: lowest ${range(values(rows, 'pullOffLowestMPa'), 1)} MPa (at least ${a.pullOff.minMPa} MPa)`,
    )
  }
  return lines
}

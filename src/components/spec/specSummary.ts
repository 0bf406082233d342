import type { SpecContent } from '@shared/spec/specContent'
import {
  COATING_TYPE_LABELS,
  CROSS_CUT_LABELS,
  GRADE_LABELS,
  HOLIDAY_METHOD_LABELS,
  PA2_LEVEL_LABELS,
  PROFILE_METHOD_LABELS,
  SAMPLING_LABELS,
  THICKNESS_RULE_LABELS,
  VOLTAGE_RULE_LABELS,
} from './specLabels'

export interface SummaryFormatters {
  thickness: (um: number) => string
  band: (minUm: number, maxUm: number | null) => string
  temperature: (c: number) => string
  temperatureDelta: (c: number) => string
}
export interface SummaryGroup {
  title: string
  rows: [label: string, value: string][]
  caution?: boolean
}

/** Every setting of a spec version in reading order, in the reader's units. */
export function summarizeSpec(c: SpecContent, f: SummaryFormatters): SummaryGroup[] {
  const t = c.thickness
  const p = c.surfacePrep
  const h = c.holiday
  const thicknessRows: [string, string][] = [
    ['Coating', COATING_TYPE_LABELS[c.coatingType]],
    ['Rule', THICKNESS_RULE_LABELS[t.rule]],
    [t.rule === 'ISO-19840' ? 'NDFT – maximum' : 'Band', f.band(t.minUm, t.maxUm)],
    ['Band written in', t.bandUnit === 'mil' ? 'mils' : 'µm'],
  ]
  if (t.rule === 'SSPC-PA2')
    thicknessRows.push(['Restriction level', PA2_LEVEL_LABELS[t.pa2Level] ?? String(t.pa2Level)])
  else {
    thicknessRows.push(['Profile correction', f.thickness(t.isoProfileCorrectionUm)])
    thicknessRows.push([
      '80–100 % NDFT readings',
      t.isoAllowExactly20Pct ? 'at most 20 %' : 'under 20 %',
    ])
  }
  const prepRows: [string, string][] = [
    ['Cleanliness', GRADE_LABELS[p.grade]],
    ['Profile', `${f.thickness(p.profileMinUm)} – ${f.thickness(p.profileMaxUm)}`],
    ['Profile method', PROFILE_METHOD_LABELS[p.profileMethod]],
  ]
  if (p.profileMethod === 'C-replica-tape')
    prepRows.push(['Tape overlap re-test', p.replicaOverlapRetest ? 'yes' : 'no'])

  const holidayRows: [string, string][] = h.required
    ? [
        ['Method', HOLIDAY_METHOD_LABELS[h.method]],
        ['Required voltage', VOLTAGE_RULE_LABELS[h.voltageRule]],
        ['Spec voltage', h.fixedVoltageV === null ? '—' : `${h.fixedVoltageV} V`],
        ['Tolerance', `± ${h.voltageTolerancePct} %`],
        ['Edition', h.standardEdition || '—'],
      ]
    : [['Holiday test', 'not required by this spec']]

  const cureRows: [string, string][] = []
  const { solventRub, dsc, oven } = c.cure
  if (solventRub)
    cureRows.push([
      'Solvent rub (ASTM D5402)',
      `${solventRub.solvent}, at least ${solventRub.minDoubleRubs} double rubs`,
    ])
  if (dsc)
    cureRows.push([
      'DSC ΔTg',
      `${f.temperatureDelta(dsc.minDeltaTgC)} to ${f.temperatureDelta(dsc.maxDeltaTgC)}`,
    ])
  if (oven)
    cureRows.push([
      'Oven',
      `${f.temperature(oven.minTempC)} – ${f.temperature(oven.maxTempC)}, ${oven.minMinutes}–${oven.maxMinutes} min`,
    ])
  if (!cureRows.length) cureRows.push(['Cure checks', 'none asked'])

  const adhesionRows: [string, string][] = []
  const { crossCut, knife, pullOff } = c.adhesion
  if (crossCut)
    adhesionRows.push([
      CROSS_CUT_LABELS[crossCut.method],
      `${crossCut.minGrade}${crossCut.method} or better`,
    ])
  if (knife) adhesionRows.push(['Knife (ASTM D6677)', `rating ${knife.minRating} or better`])
  if (pullOff) adhesionRows.push(['Pull-off (ASTM D4541)', `at least ${pullOff.minMPa} MPa`])
  if (!adhesionRows.length) adhesionRows.push(['Adhesion tests', 'none asked'])

  return [
    { title: 'Dry film thickness', rows: thicknessRows },
    { title: 'Surface preparation', rows: prepRows },
    {
      title: 'Climate',
      rows: [
        [
          'Steel above dew point',
          `at least ${f.temperatureDelta(c.climate.minSteelAboveDewPointC)}`,
        ],
        ['Relative humidity', `at most ${c.climate.maxRelativeHumidityPct} %`],
      ],
    },
    { title: 'Holiday test', rows: holidayRows, caution: h.required },
    { title: 'Cure', rows: cureRows },
    { title: 'Adhesion', rows: adhesionRows },
    {
      title: 'Sampling',
      rows: [
        [
          'Parts inspected',
          c.sampling.mode === 'sample'
            ? `${c.sampling.sampleSize} per lot`
            : SAMPLING_LABELS['every-part'],
        ],
        ...(c.notes ? ([['Notes', c.notes]] as [string, string][]) : []),
      ],
    },
  ]
}

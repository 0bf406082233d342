/**
 * One round of invented inspection records for a part: gauge readings around the spec's band and
 * the other sections, with the trouble chosen for it (thin spot, holiday, ...). Pure.
 */
import type { Line } from '../../../shared/api/lots'
import { holidayTestVoltage } from '../../../shared/rules/holiday'
import type { SpecContent } from '../../../shared/spec/specContent'
import type { PlannedReading, PlannedSection, Rng, Trouble } from './floorHistory.plan'

const MIL = 25.4

export const r1 = (x: number) => Math.round(x * 10) / 10

export function thicknessReadings(
  rng: Rng,
  spec: SpecContent,
  areaM2: number,
  trouble: Trouble,
): PlannedReading[] {
  const t = spec.thickness
  const out: PlannedReading[] = []
  let minute = 0
  if (t.rule === 'ISO-19840') {
    // At least the ISO 19840 minimum for the area (TRADE.md §2 table [M]).
    const n = areaM2 <= 1 ? 5 : areaM2 <= 3 ? 10 : areaM2 <= 10 ? 15 : areaM2 <= 30 ? 20 : 30
    const target = t.minUm * rng.between(1.15, 1.3)
    for (let i = 0; i < n; i++)
      out.push({
        areaNo: 1,
        spotNo: 0,
        thicknessUm: r1(rng.normal(target, t.minUm * 0.06)),
        minuteOffset: minute++,
      })
    if (trouble === 'thin-spot') out[1]!.thicknessUm = r1(t.minUm * 0.72)
    return out
  }
  const areas = areaM2 < 9.29 ? 1 : Math.ceil(areaM2 / 9.29)
  const target = (t.minUm + (t.maxUm ?? t.minUm * 1.5)) / 2 + rng.normal(0, 15)
  const badSpot =
    trouble === 'thin-spot' || trouble === 'thick-spot' ? rng.pick([1, 2, 3, 4, 5]) : 0
  for (let a = 1; a <= areas; a++) {
    for (let s = 1; s <= 5; s++) {
      let spotTarget = rng.normal(target, 18)
      if (a === 1 && s === badSpot)
        spotTarget = trouble === 'thin-spot' ? t.minUm * 0.74 : (t.maxUm ?? t.minUm) * 1.26
      for (let k = 0; k < 3; k++)
        out.push({
          areaNo: a,
          spotNo: s,
          thicknessUm: r1(rng.normal(spotTarget, 9)),
          minuteOffset: minute++,
        })
    }
  }
  return out
}

function meanOf(readings: PlannedReading[]) {
  return readings.reduce((s, r) => s + r.thicknessUm, 0) / readings.length
}

export function sectionsFor(
  rng: Rng,
  spec: SpecContent,
  line: Line,
  trouble: Trouble,
  readings: PlannedReading[],
): PlannedSection[] {
  const air = r1(rng.between(14, 27))
  const rh = Math.round(rng.between(38, 72))
  const steel = trouble === 'climate' ? r1(air - 6) : r1(air + rng.between(3, 9))
  const sp = spec.surfacePrep
  const profileUm = () => r1(rng.between(Math.max(sp.profileMinUm, 40) + 8, sp.profileMaxUm - 15))
  const prep: PlannedSection =
    sp.profileMethod === 'C-replica-tape'
      ? {
          section: 'surface-prep',
          instrument: 'HFW-RTM-0119',
          // Replica tape: the micrometer reads profile + 2.0 mil backing (ASTM D4417 C).
          data: {
            gradeRecorded: sp.grade,
            profileMethod: sp.profileMethod,
            profileLocations: [0, 1, 2].map(() => ({
              readingsUm: [r1(profileUm() + 2 * MIL)],
              tapeGrade: 'x-coarse',
            })),
          },
        }
      : {
          section: 'surface-prep',
          instrument: 'HFW-PRF-0206',
          data: {
            gradeRecorded: sp.grade,
            profileMethod: sp.profileMethod,
            profileLocations: [0, 1, 2].map(() => ({
              readingsUm: [0, 1, 2].map(() =>
                r1(rng.between(sp.profileMinUm + 3, sp.profileMaxUm - 3)),
              ),
            })),
          },
        }
  const out: PlannedSection[] = [
    prep,
    {
      section: 'climate',
      instrument: 'HFW-STH-0342',
      data: { airTempC: air, relativeHumidityPct: rh, steelTempC: steel },
    },
    {
      section: 'thickness-gauge',
      instrument: line === 'fbe-powder' ? 'HFW-DFT2-0417' : 'HFW-DFT2-0523',
      data: { gaugeType: 'type-2' },
    },
  ]
  if (spec.holiday.required) {
    const meanUm = meanOf(readings)
    const high =
      spec.holiday.method === 'high-voltage' ||
      (spec.holiday.method === 'by-thickness' && meanUm > 500)
    const holidays =
      trouble === 'holiday-repaired'
        ? [{ found: true, repaired: true, retested: true, location: 'flange face' }]
        : trouble === 'holiday-open'
          ? [{ found: true, repaired: false, retested: false, location: 'bonnet boss' }]
          : []
    out.push({
      section: 'holiday',
      instrument: high ? 'HFW-HV-0031' : 'HFW-LV-0014',
      data: high
        ? {
            method: 'high-voltage',
            voltageUsedV:
              Math.round(
                holidayTestVoltage(
                  meanUm,
                  spec.holiday.voltageRule === 'fixed' ? 'NACE-SP0490' : spec.holiday.voltageRule,
                ) / 10,
              ) * 10,
            holidays,
          }
        : { method: 'low-voltage', voltageUsedV: spec.holiday.fixedVoltageV ?? 67.5, holidays },
    })
  }
  const cure: Record<string, unknown> = {}
  if (spec.cure.dsc) cure.dsc = { deltaTgC: trouble === 'cure' ? -4.2 : r1(rng.between(-1, 2)) }
  if (spec.cure.oven)
    cure.oven = { tempC: Math.round(rng.between(212, 236)), minutes: Math.round(rng.between(3, 8)) }
  if (spec.cure.solventRub)
    cure.solventRub = {
      solvent: spec.cure.solventRub.solvent,
      doubleRubs: spec.cure.solventRub.minDoubleRubs + 10,
      coatingRemoved: false,
    }
  if (Object.keys(cure).length)
    out.push({ section: 'cure', instrument: spec.cure.oven ? 'HFW-OVN-0009' : null, data: cure })
  const adhesion: Record<string, unknown> = {}
  if (spec.adhesion.crossCut) adhesion.crossCut = { grade: `5${spec.adhesion.crossCut.method}` }
  if (spec.adhesion.knife) adhesion.knife = { rating: rng.pick([8, 9, 9, 10]) }
  if (spec.adhesion.pullOff)
    adhesion.pullOff = {
      pulls: [0, 1].map(() => ({
        valueMPa: r1(rng.between(7, 13)),
        fracture: 'cohesive in coating',
      })),
    }
  if (Object.keys(adhesion).length)
    out.push({ section: 'adhesion', instrument: null, data: adhesion })
  return out
}

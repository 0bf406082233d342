/**
 * Months of invented shop-floor history for Harrowgate Flow Works, generated deterministically
 * (seeded PRNG): the same seed day always makes the same lots and readings. Pure: no database.
 * Values are plausible, not sourced; the rules that judge them are (see shared/rules).
 */
import type { Line, SectionName, Shift } from '../../../shared/api/lots'
import { holidayTestVoltage } from '../../../shared/rules/holiday'
import type { SpecContent } from '../../../shared/spec/specContent'

const MIL = 25.4

/** mulberry32: small, fast, and the same sequence on every machine. */
export function prng(seed: number) {
  let a = seed >>> 0
  const next = () => {
    a = (a + 0x6d2b79f5) >>> 0
    let t = a
    t = Math.imul(t ^ (t >>> 15), t | 1)
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61)
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296
  }
  const between = (lo: number, hi: number) => lo + (hi - lo) * next()
  const normal = (mean: number, sd: number) => {
    const u = Math.max(next(), 1e-12)
    return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * next())
  }
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(next() * xs.length)]!
  const chance = (p: number) => next() < p
  return { next, between, normal, pick, chance }
}
export type Rng = ReturnType<typeof prng>

export interface PlannedReading {
  areaNo: number
  spotNo: number
  thicknessUm: number
  minuteOffset: number
}
export interface PlannedSection {
  section: SectionName
  data: unknown
  instrument: string | null
}
export interface PlannedRound {
  round: number
  sections: PlannedSection[]
  readings: PlannedReading[]
}
/** What goes wrong on a part, so the demo shows each kind of reject. */
export type Trouble = 'none' | 'thin-spot' | 'thick-spot' | 'holiday-repaired' | 'holiday-open' | 'climate' | 'cure'

export interface PlannedPart {
  partNumber: string
  description: string
  heatNumber: string
  coatedAreaM2: number
  sampled: boolean
  rounds: PlannedRound[]
  trouble: Trouble
}

const r1 = (x: number) => Math.round(x * 10) / 10

function thicknessReadings(rng: Rng, spec: SpecContent, areaM2: number, trouble: Trouble): PlannedReading[] {
  const t = spec.thickness
  const out: PlannedReading[] = []
  let minute = 0
  if (t.rule === 'ISO-19840') {
    // At least the ISO 19840 minimum for the area (TRADE.md §2 table [M]).
    const n = areaM2 <= 1 ? 5 : areaM2 <= 3 ? 10 : areaM2 <= 10 ? 15 : areaM2 <= 30 ? 20 : 30
    const target = t.minUm * rng.between(1.15, 1.3)
    for (let i = 0; i < n; i++) out.push({ areaNo: 1, spotNo: 0, thicknessUm: r1(rng.normal(target, t.minUm * 0.06)), minuteOffset: minute++ })
    if (trouble === 'thin-spot') out[1]!.thicknessUm = r1(t.minUm * 0.72)
    return out
  }
  const areas = areaM2 < 9.29 ? 1 : Math.ceil(areaM2 / 9.29)
  const target = (t.minUm + (t.maxUm ?? t.minUm * 1.5)) / 2 + rng.normal(0, 15)
  const badSpot = trouble === 'thin-spot' || trouble === 'thick-spot' ? rng.pick([1, 2, 3, 4, 5]) : 0
  for (let a = 1; a <= areas; a++) {
    for (let s = 1; s <= 5; s++) {
      let spotTarget = rng.normal(target, 18)
      if (a === 1 && s === badSpot) spotTarget = trouble === 'thin-spot' ? t.minUm * 0.74 : (t.maxUm ?? t.minUm) * 1.26
      for (let k = 0; k < 3; k++) out.push({ areaNo: a, spotNo: s, thicknessUm: r1(rng.normal(spotTarget, 9)), minuteOffset: minute++ })
    }
  }
  return out
}

function meanOf(readings: PlannedReading[]) {
  return readings.reduce((s, r) => s + r.thicknessUm, 0) / readings.length
}

function sectionsFor(rng: Rng, spec: SpecContent, line: Line, trouble: Trouble, readings: PlannedReading[]): PlannedSection[] {
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
          data: { gradeRecorded: sp.grade, profileMethod: sp.profileMethod, profileLocations: [0, 1, 2].map(() => ({ readingsUm: [r1(profileUm() + 2 * MIL)], tapeGrade: 'x-coarse' })) },
        }
      : {
          section: 'surface-prep',
          instrument: 'HFW-PRF-0206',
          data: { gradeRecorded: sp.grade, profileMethod: sp.profileMethod, profileLocations: [0, 1, 2].map(() => ({ readingsUm: [0, 1, 2].map(() => r1(rng.between(sp.profileMinUm + 3, sp.profileMaxUm - 3))) })) },
        }
  const out: PlannedSection[] = [
    prep,
    { section: 'climate', instrument: 'HFW-STH-0342', data: { airTempC: air, relativeHumidityPct: rh, steelTempC: steel } },
    { section: 'thickness-gauge', instrument: line === 'fbe-powder' ? 'HFW-DFT2-0417' : 'HFW-DFT2-0523', data: { gaugeType: 'type-2' } },
  ]
  if (spec.holiday.required) {
    const meanUm = meanOf(readings)
    const high = spec.holiday.method === 'high-voltage' || (spec.holiday.method === 'by-thickness' && meanUm > 500)
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
        ? { method: 'high-voltage', voltageUsedV: Math.round(holidayTestVoltage(meanUm, spec.holiday.voltageRule === 'fixed' ? 'NACE-SP0490' : spec.holiday.voltageRule) / 10) * 10, holidays }
        : { method: 'low-voltage', voltageUsedV: spec.holiday.fixedVoltageV ?? 67.5, holidays },
    })
  }
  const cure: Record<string, unknown> = {}
  if (spec.cure.dsc) cure.dsc = { deltaTgC: trouble === 'cure' ? -4.2 : r1(rng.between(-1, 2)) }
  if (spec.cure.oven) cure.oven = { tempC: Math.round(rng.between(212, 236)), minutes: Math.round(rng.between(3, 8)) }
  if (spec.cure.solventRub) cure.solventRub = { solvent: spec.cure.solventRub.solvent, doubleRubs: spec.cure.solventRub.minDoubleRubs + 10, coatingRemoved: false }
  if (Object.keys(cure).length) out.push({ section: 'cure', instrument: spec.cure.oven ? 'HFW-OVN-0009' : null, data: cure })
  const adhesion: Record<string, unknown> = {}
  if (spec.adhesion.crossCut) adhesion.crossCut = { grade: `5${spec.adhesion.crossCut.method}` }
  if (spec.adhesion.knife) adhesion.knife = { rating: rng.pick([8, 9, 9, 10]) }
  if (spec.adhesion.pullOff) adhesion.pullOff = { pulls: [0, 1].map(() => ({ valueMPa: r1(rng.between(7, 13)), fracture: 'cohesive in coating' })) }
  if (Object.keys(adhesion).length) out.push({ section: 'adhesion', instrument: null, data: adhesion })
  return out
}

/** A fresh round of records after a repair (re-blast and recoat, or touch-up and re-measure). */
export function repairRound(rng: Rng, spec: SpecContent, line: Line, part: PlannedPart): PlannedRound {
  const readings = thicknessReadings(rng, spec, part.coatedAreaM2, 'none')
  const round = Math.max(1, ...part.rounds.map((r) => r.round)) + 1
  return { round, readings, sections: sectionsFor(rng, spec, line, 'none', readings) }
}

const FBE_PARTS = [
  ['VB-100-PN16', 'Gate valve body DN100', 0.45],
  ['VB-150-PN16', 'Gate valve body DN150', 0.8],
  ['VB-200-PN16', 'Gate valve body DN200', 1.3],
  ['BC-150', 'Bonnet cover DN150', 0.35],
  ['BF-300-DISC', 'Butterfly valve disc DN300', 0.6],
  ['TEE-200-FL', 'Flanged tee DN200', 1.1],
] as const
const LIQUID_PARTS = [
  ['SP-400-6M', 'Pipe spool DN400 × 6 m, interior', 12.5],
  ['RED-300-200', 'Concentric reducer DN300/200', 0.9],
  ['BND-250-90', 'Bend 90° DN250', 1.6],
  ['MHV-600', 'Manway cover DN600', 2.4],
] as const

/** Parts of one lot with each round's records; a failed round 1 is repaired and passes round 2 when `repair`. */
export function planParts(rng: Rng, spec: SpecContent, line: Line, count: number, troubleRate: number, repair: boolean, forceTrouble?: Trouble): PlannedPart[] {
  const family: readonly (readonly [string, string, number])[] = line === 'fbe-powder' ? FBE_PARTS : LIQUID_PARTS
  const heatBase = Math.floor(rng.between(10000, 99999))
  return Array.from({ length: count }, (_, i) => {
    const [partNumber, description, areaM2] = rng.pick(family)
    const sampled = spec.sampling.mode === 'every-part' || i < spec.sampling.sampleSize
    const troubles: Trouble[] = spec.holiday.required
      ? ['thin-spot', 'thin-spot', 'thick-spot', 'holiday-repaired', 'holiday-repaired', 'holiday-open', 'climate', 'cure']
      : ['thin-spot', 'thick-spot', 'climate']
    let trouble: Trouble = forceTrouble && i === 0 ? forceTrouble : rng.chance(troubleRate) ? rng.pick(troubles) : 'none'
    if (trouble === 'cure' && !spec.cure.dsc) trouble = 'none'
    const area = r1(areaM2 * rng.between(0.95, 1.05) * 100) / 100
    const rounds: PlannedRound[] = []
    if (sampled) {
      const readings = thicknessReadings(rng, spec, area, trouble)
      rounds.push({ round: 1, readings, sections: sectionsFor(rng, spec, line, trouble, readings) })
      // A holiday found and repaired at once is a round-1 pass; the other troubles go round 2.
    }
    const part = { partNumber, description, heatNumber: `HT-${heatBase + i * 7}-${String.fromCharCode(65 + (i % 6))}`, coatedAreaM2: area, sampled, rounds, trouble }
    if (repair && sampled && trouble !== 'none' && trouble !== 'holiday-repaired') rounds.push(repairRound(rng, spec, line, part))
    return part
  })
}

export interface PlannedLot {
  day: string
  line: Line
  shift: Shift
  specCode: string
  customerCode: string
  parts: PlannedPart[]
  status: 'open' | 'awaiting-review' | 'released'
}

export const SHIFT_START_HOUR: Record<Shift, number> = { '1': 6, '2': 14, '3': 22 }

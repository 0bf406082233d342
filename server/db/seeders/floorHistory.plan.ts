/**
 * Months of invented shop-floor history for Harrowgate Flow Works, generated deterministically
 * (seeded PRNG): the same seed day always makes the same lots and readings. Pure: no database.
 * Values are plausible, not sourced; the rules that judge them are (see shared/rules).
 */
import type { Line, SectionName, Shift } from '../../../shared/api/lots'
import type { SpecContent } from '../../../shared/spec/specContent'
import { r1, sectionsFor, thicknessReadings } from './floorHistory.records'

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
export type Trouble =
  'none' | 'thin-spot' | 'thick-spot' | 'holiday-repaired' | 'holiday-open' | 'climate' | 'cure'

export interface PlannedPart {
  partNumber: string
  description: string
  heatNumber: string
  coatedAreaM2: number
  sampled: boolean
  rounds: PlannedRound[]
  trouble: Trouble
}

/** A fresh round of records after a repair (re-blast and recoat, or touch-up and re-measure). */
export function repairRound(
  rng: Rng,
  spec: SpecContent,
  line: Line,
  part: PlannedPart,
): PlannedRound {
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
export function planParts(
  rng: Rng,
  spec: SpecContent,
  line: Line,
  count: number,
  troubleRate: number,
  repair: boolean,
  forceTrouble?: Trouble,
): PlannedPart[] {
  const family: readonly (readonly [string, string, number])[] =
    line === 'fbe-powder' ? FBE_PARTS : LIQUID_PARTS
  const heatBase = Math.floor(rng.between(10000, 99999))
  return Array.from({ length: count }, (_, i) => {
    const [partNumber, description, areaM2] = rng.pick(family)
    const sampled = spec.sampling.mode === 'every-part' || i < spec.sampling.sampleSize
    const troubles: Trouble[] = spec.holiday.required
      ? [
          'thin-spot',
          'thin-spot',
          'thick-spot',
          'holiday-repaired',
          'holiday-repaired',
          'holiday-open',
          'climate',
          'cure',
        ]
      : ['thin-spot', 'thick-spot', 'climate']
    let trouble: Trouble =
      forceTrouble && i === 0 ? forceTrouble : rng.chance(troubleRate) ? rng.pick(troubles) : 'none'
    if (trouble === 'cure' && !spec.cure.dsc) trouble = 'none'
    const area = r1(areaM2 * rng.between(0.95, 1.05) * 100) / 100
    const rounds: PlannedRound[] = []
    if (sampled) {
      const readings = thicknessReadings(rng, spec, area, trouble)
      rounds.push({ round: 1, readings, sections: sectionsFor(rng, spec, line, trouble, readings) })
      // A holiday found and repaired at once is a round-1 pass; the other troubles go round 2.
    }
    const part = {
      partNumber,
      description,
      heatNumber: `HT-${heatBase + i * 7}-${String.fromCharCode(65 + (i % 6))}`,
      coatedAreaM2: area,
      sampled,
      rounds,
      trouble,
    }
    if (repair && sampled && trouble !== 'none' && trouble !== 'holiday-repaired')
      rounds.push(repairRound(rng, spec, line, part))
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

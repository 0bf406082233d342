/** Which lots ran on which day, and what happened to their parts. Pure: no database. */
import { addDays } from '../../../shared/api/calibration'
import type { SpecContent } from '../../../shared/spec/specContent'
import { verdictFromRows } from '../../api/parts/partVerdict'
import {
  planParts,
  repairRound,
  type PlannedLot,
  type PlannedPart,
  type Rng,
} from './floorHistory.plan'

export const HISTORY_DAYS = 112

function isWeekday(day: string) {
  const d = new Date(`${day}T12:00:00`).getDay()
  return d >= 1 && d <= 5
}

/** Which lots ran on which day: both lines, three shifts, the seeded customers and their specs. */
export function planLots(rng: Rng, today: string): PlannedLot[] {
  const lots: PlannedLot[] = []
  for (let back = HISTORY_DAYS; back >= 2; back--) {
    const day = addDays(today, -back)
    if (!isWeekday(day)) continue
    const fbeCount = rng.pick([1, 1, 2, 2, 3])
    for (let i = 0; i < fbeCount; i++) {
      const ashvale = rng.chance(0.3)
      const customerCode = ashvale ? 'AWB' : rng.pick(['WWA', 'BWC', 'OPC', 'AWB'])
      const specCode = ashvale ? 'AWB-FBE-2' : 'HFW-FBE-01'
      lots.push({
        day,
        line: 'fbe-powder',
        shift: rng.pick(['1', '2', '3'] as const),
        specCode,
        customerCode,
        parts: [],
        status: 'released',
      })
    }
    if (rng.chance(0.7)) {
      const primer = rng.chance(0.3)
      lots.push({
        day,
        line: 'liquid-epoxy',
        shift: rng.pick(['1', '2'] as const),
        specCode: primer ? 'OPC-PR-75' : 'HFW-LE-300',
        customerCode: primer ? 'OPC' : rng.pick(['WWA', 'BWC', 'OPC']),
        parts: [],
        status: 'released',
      })
    }
  }
  const yesterday = addDays(today, -1)
  lots.push({
    day: yesterday,
    line: 'fbe-powder',
    shift: '2',
    specCode: 'AWB-FBE-2',
    customerCode: 'AWB',
    parts: [],
    status: 'awaiting-review',
  })
  lots.push({
    day: yesterday,
    line: 'liquid-epoxy',
    shift: '1',
    specCode: 'HFW-LE-300',
    customerCode: 'WWA',
    parts: [],
    status: 'awaiting-review',
  })
  lots.push({
    day: today,
    line: 'fbe-powder',
    shift: '1',
    specCode: 'HFW-FBE-01',
    customerCode: 'BWC',
    parts: [],
    status: 'open',
  })
  lots.push({
    day: today,
    line: 'liquid-epoxy',
    shift: '1',
    specCode: 'HFW-LE-300',
    customerCode: 'OPC',
    parts: [],
    status: 'open',
  })
  return lots
}

/** The part's verdict for one round, through the same function the server uses after every write. */
const judged = new WeakMap<object, ReturnType<typeof verdictFromRows>>()

export function judge(spec: SpecContent, p: PlannedPart, round: number) {
  const r = p.rounds.find((x) => x.round === round)
  // A round's rows never change once planned: judge each round once.
  const memo = r && judged.get(r)
  if (memo) return memo
  const result = judgeRound(spec, p, round, r)
  if (r) judged.set(r, result)
  return result
}

function judgeRound(
  spec: SpecContent,
  p: PlannedPart,
  round: number,
  r: PlannedPart['rounds'][number] | undefined,
) {
  const sections = (r?.sections ?? []).map((s) => ({ ...s, round }))
  const readings = (r?.readings ?? []).map((x) => ({
    ...x,
    round,
    discarded: false,
    suspect: false,
    instrumentKind: 'dft-gauge-type2' as const,
  }))
  return verdictFromRows(
    spec,
    {
      id: 0,
      round,
      partNumber: p.partNumber,
      heatNumber: p.heatNumber,
      coatedAreaM2: p.coatedAreaM2,
    },
    sections,
    readings,
  )
}

export const lastRound = (p: PlannedPart) => Math.max(1, ...p.rounds.map((r) => r.round))

export function fillParts(rng: Rng, lot: PlannedLot, spec: SpecContent) {
  const count = spec.sampling.mode === 'sample' ? rng.pick([4, 5, 6]) : rng.pick([2, 3, 3, 4, 5])
  if (lot.status === 'released') {
    lot.parts = planParts(rng, spec, lot.line, count, 0.09, true)
    // A released lot's parts all conform in the end: whatever failed was repaired and re-measured.
    for (const p of lot.parts) {
      while (
        p.sampled &&
        judge(spec, p, lastRound(p)).verdict.status !== 'pass' &&
        lastRound(p) < 4
      ) {
        p.rounds.push(repairRound(rng, spec, lot.line, p))
      }
    }
  } else if (lot.status === 'awaiting-review') {
    // The review queue's first lot: one part with a thin spot, not yet dispositioned.
    lot.parts = planParts(
      rng,
      spec,
      lot.line,
      3,
      0,
      false,
      lot.line === 'fbe-powder' ? 'thin-spot' : undefined,
    )
  } else {
    lot.parts = planParts(rng, spec, lot.line, lot.line === 'fbe-powder' ? 3 : 2, 0, false)
    // Open for the operator: one part done, one half-way, the rest not started.
    const [, half, ...rest] = lot.parts
    if (lot.line === 'liquid-epoxy') for (const p of lot.parts) p.rounds = []
    if (half?.rounds[0]) {
      half.rounds[0].readings = half.rounds[0].readings.slice(0, 6)
      half.rounds[0].sections = half.rounds[0].sections.filter(
        (s) => s.section === 'climate' || s.section === 'surface-prep',
      )
    }
    for (const p of rest) p.rounds = []
  }
}

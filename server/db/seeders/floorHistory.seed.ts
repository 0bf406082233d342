import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../index'
import { CoatingSpec, Customer, Instrument, User } from '../models'
import { recordAudit } from '../../audit/audit.service'
import { addDays } from '../../../shared/api/calibration'
import type { Line, Shift } from '../../../shared/api/lots'
import type { SpecContent } from '../../../shared/spec/specContent'
import { lockSpecVersion } from '../../api/specs/specs.service'
import { specContentFor } from '../../api/lots/specCache'
import { nextLotNumber } from '../../api/lots/lotNumber'
import { verdictFromRows } from '../../api/parts/partVerdict'
import { planParts, prng, repairRound, SHIFT_START_HOUR, type PlannedLot, type PlannedPart, type Rng } from './floorHistory.plan'
import type { Seeder } from './seeder'

const HISTORY_DAYS = 112
const SEED = 20260415

/** Multi-row INSERTs in chunks under PostgreSQL's bind-parameter limit. */
async function insertMany(t: Transaction, table: string, columns: string[], rows: unknown[][], returning = '') {
  const out: Record<string, unknown>[] = []
  const per = Math.floor(30000 / columns.length)
  for (let i = 0; i < rows.length; i += per) {
    const chunk = rows.slice(i, i + per)
    const bind: unknown[] = []
    const values = chunk.map((r) => `(${r.map((v) => (bind.push(v), `$${bind.length}`)).join(',')})`).join(',')
    const sql = `INSERT INTO ${table} (${columns.join(',')}) VALUES ${values}${returning ? ` RETURNING ${returning}` : ''}`
    const res = await sequelize.query(sql, { bind, transaction: t, type: returning ? QueryTypes.SELECT : QueryTypes.INSERT })
    if (returning) out.push(...(res as unknown as Record<string, unknown>[]))
  }
  return out
}

function isWeekday(day: string) {
  const d = new Date(`${day}T12:00:00`).getDay()
  return d >= 1 && d <= 5
}

/** Which lots ran on which day: both lines, three shifts, the seeded customers and their specs. */
function planLots(rng: Rng, today: string): PlannedLot[] {
  const lots: PlannedLot[] = []
  for (let back = HISTORY_DAYS; back >= 2; back--) {
    const day = addDays(today, -back)
    if (!isWeekday(day)) continue
    const fbeCount = rng.pick([1, 1, 2, 2, 3])
    for (let i = 0; i < fbeCount; i++) {
      const ashvale = rng.chance(0.3)
      const customerCode = ashvale ? 'AWB' : rng.pick(['WWA', 'BWC', 'OPC', 'AWB'])
      const specCode = ashvale ? 'AWB-FBE-2' : 'HFW-FBE-01'
      lots.push({ day, line: 'fbe-powder', shift: rng.pick(['1', '2', '3'] as const), specCode, customerCode, parts: [], status: 'released' })
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
  lots.push({ day: yesterday, line: 'fbe-powder', shift: '2', specCode: 'AWB-FBE-2', customerCode: 'AWB', parts: [], status: 'awaiting-review' })
  lots.push({ day: yesterday, line: 'liquid-epoxy', shift: '1', specCode: 'HFW-LE-300', customerCode: 'WWA', parts: [], status: 'awaiting-review' })
  lots.push({ day: today, line: 'fbe-powder', shift: '1', specCode: 'HFW-FBE-01', customerCode: 'BWC', parts: [], status: 'open' })
  lots.push({ day: today, line: 'liquid-epoxy', shift: '1', specCode: 'HFW-LE-300', customerCode: 'OPC', parts: [], status: 'open' })
  return lots
}

/** The part's verdict for one round, through the same function the server uses after every write. */
function judge(spec: SpecContent, p: PlannedPart, round: number) {
  const r = p.rounds.find((x) => x.round === round)
  const sections = (r?.sections ?? []).map((s) => ({ ...s, round }))
  const readings = (r?.readings ?? []).map((x) => ({ ...x, round, discarded: false, suspect: false, instrumentKind: 'dft-gauge-type2' as const }))
  return verdictFromRows(spec, { id: 0, round, partNumber: p.partNumber, heatNumber: p.heatNumber, coatedAreaM2: p.coatedAreaM2 }, sections, readings)
}

const lastRound = (p: PlannedPart) => Math.max(1, ...p.rounds.map((r) => r.round))

function fillParts(rng: Rng, lot: PlannedLot, spec: SpecContent) {
  const count = spec.sampling.mode === 'sample' ? rng.pick([4, 5, 6]) : rng.pick([2, 3, 3, 4, 5])
  if (lot.status === 'released') {
    lot.parts = planParts(rng, spec, lot.line, count, 0.09, true)
    // A released lot's parts all conform in the end: whatever failed was repaired and re-measured.
    for (const p of lot.parts) {
      while (p.sampled && judge(spec, p, lastRound(p)).verdict.status !== 'pass' && lastRound(p) < 4) {
        p.rounds.push(repairRound(rng, spec, lot.line, p))
      }
    }
  } else if (lot.status === 'awaiting-review') {
    // The review queue's first lot: one part with a thin spot, not yet dispositioned.
    lot.parts = planParts(rng, spec, lot.line, 3, 0, false, lot.line === 'fbe-powder' ? 'thin-spot' : undefined)
  } else {
    lot.parts = planParts(rng, spec, lot.line, lot.line === 'fbe-powder' ? 3 : 2, 0, false)
    // Open for the operator: one part done, one half-way, the rest not started.
    const [, half, ...rest] = lot.parts
    if (lot.line === 'liquid-epoxy') for (const p of lot.parts) p.rounds = []
    if (half?.rounds[0]) {
      half.rounds[0].readings = half.rounds[0].readings.slice(0, 6)
      half.rounds[0].sections = half.rounds[0].sections.filter((s) => s.section === 'climate' || s.section === 'surface-prep')
    }
    for (const p of rest) p.rounds = []
  }
}

export const floorHistorySeeder: Seeder = {
  name: 'floor-history',
  once: true,
  async run(ctx) {
    const { t, today } = ctx
    const rng = prng(SEED)
    const customers = new Map((await Customer.findAll({ transaction: t })).map((c) => [c.code, c]))
    const specs = new Map((await CoatingSpec.findAll({ transaction: t })).map((s) => [s.code, s]))
    const instruments = new Map((await Instrument.findAll({ transaction: t })).map((i) => [i.serial, i]))
    const operator = await User.findOne({ where: { email: 'operator@harrowgate.example' }, transaction: t })
    const supervisor = await User.findOne({ where: { email: 'supervisor@harrowgate.example' }, transaction: t })
    if (!operator || !supervisor) throw new Error('Seed order: the demo users must come before the floor history')
    const contents = new Map<string, { specId: number; version: number; content: SpecContent }>()
    for (const code of ['HFW-FBE-01', 'AWB-FBE-2', 'HFW-LE-300', 'OPC-PR-75']) {
      const spec = specs.get(code)
      if (!spec) throw new Error(`Seed order: coating spec ${code} must come before the floor history`)
      const v = await lockSpecVersion(spec.id, spec.currentVersion, t)
      contents.set(code, { specId: spec.id, version: v.version, content: await specContentFor(spec.id, v.version, t) })
    }
    const serialId = (serial: string | null) => {
      if (serial === null) return null
      const i = instruments.get(serial)
      if (!i) throw new Error(`Seed order: instrument ${serial} must come before the floor history`)
      return i.id
    }

    const lots = planLots(rng, today)
    for (const lot of lots) fillParts(rng, lot, contents.get(lot.specCode)!.content)
    const lotRows: unknown[][] = []
    const openedAt: Date[] = []
    for (const lot of lots) {
      const at = new Date(`${lot.day}T${String(SHIFT_START_HOUR[lot.shift]).padStart(2, '0')}:40:00`)
      openedAt.push(at)
      const s = contents.get(lot.specCode)!
      const batch = lot.line === 'fbe-powder' ? `PB-${2200 + Math.floor(rng.between(0, 90))}` : `LE-${5100 + Math.floor(rng.between(0, 60))}`
      lotRows.push([
        await nextLotNumber(lot.line as Line, at, t),
        customers.get(lot.customerCode)!.id,
        `PO-${lot.customerCode}-${Math.floor(rng.between(40000, 99999))}`,
        s.specId,
        s.version,
        lot.line,
        lot.shift as Shift,
        lot.line === 'fbe-powder' ? 'Harrowmark FBE 7-200, green (fictional)' : 'Two-part amine epoxy HX-300, buff (fictional)',
        batch,
        addDays(lot.day, 200),
        lot.status,
        operator.id,
        crypto.randomUUID(),
        at,
        at,
      ])
    }
    const lotIds = await insertMany(
      t,
      'lots',
      ['lot_number', 'customer_id', 'order_ref', 'spec_id', 'spec_version', 'line', 'shift', 'coating_material', 'batch_number', 'batch_expires_on', 'status', 'opened_by', 'client_id', 'created_at', 'updated_at'],
      lotRows,
      'id, lot_number',
    )
    await writeParts(t, ctx, lots, lotIds, openedAt, contents, serialId, operator.id, supervisor.id)
  },
}

async function writeParts(
  t: Transaction,
  ctx: Parameters<Seeder['run']>[0],
  lots: PlannedLot[],
  lotIds: Record<string, unknown>[],
  openedAt: Date[],
  contents: Map<string, { content: SpecContent }>,
  serialId: (s: string | null) => number | null,
  operatorId: number,
  supervisorId: number,
) {
  const partRows: unknown[][] = []
  const owners: { lotIndex: number; partIndex: number }[] = []
  lots.forEach((lot, li) => {
    const spec = contents.get(lot.specCode)!.content
    lot.parts.forEach((p, pi) => {
      const final = lastRound(p)
      const first = judge(spec, p, 1)
      const last = final === 1 ? first : judge(spec, p, final)
      const at = openedAt[li]!
      partRows.push([lotIds[li]!.id, p.partNumber, p.description, p.heatNumber, 1, p.coatedAreaM2, p.sampled, final, JSON.stringify(last.verdict), last.verdict.status, first.verdict.status, last.thicknessMeanUm, crypto.randomUUID(), at, at])
      owners.push({ lotIndex: li, partIndex: pi })
    })
  })
  const partIds = await insertMany(
    t,
    'parts',
    ['lot_id', 'part_number', 'description', 'heat_number', 'quantity', 'coated_area_m2', 'sampled', 'round', 'verdict', 'verdict_status', 'first_pass_status', 'thickness_mean_um', 'client_id', 'created_at', 'updated_at'],
    partRows,
    'id',
  )
  const sectionRows: unknown[][] = []
  const readingRows: unknown[][] = []
  const checks = new Map<string, unknown[]>()
  owners.forEach(({ lotIndex, partIndex }, k) => {
    const lot = lots[lotIndex]!
    const part = lot.parts[partIndex]!
    const partId = partIds[k]!.id
    const lotId = lotIds[lotIndex]!.id
    for (const round of part.rounds) {
      // Round 2 (after a repair) is recorded the next working morning.
      const start = new Date(openedAt[lotIndex]!.getTime() + partIndex * 25 * 60_000 + (round.round - 1) * 18 * 3600_000)
      round.sections.forEach((s, i) => {
        sectionRows.push([partId, round.round, s.section, JSON.stringify(s.data), serialId(s.instrument), operatorId, new Date(start.getTime() + i * 60_000), crypto.randomUUID()])
      })
      const gauge = serialId(lot.line === 'fbe-powder' ? 'HFW-DFT2-0417' : 'HFW-DFT2-0523')!
      for (const r of round.readings) {
        const takenAt = new Date(start.getTime() + 8 * 60_000 + r.minuteOffset * 20_000)
        readingRows.push([partId, lotId, round.round, r.areaNo, r.spotNo, r.thicknessUm, gauge, operatorId, new Date(takenAt.getTime() + 2000), takenAt, crypto.randomUUID()])
      }
      // The gauge's start-of-shift check on a reference shim, passed, before its first reading.
      const key = `${gauge}:${start.toISOString().slice(0, 13)}`
      if (round.readings.length && !checks.has(key)) {
        const at = new Date(start.getTime() - 10 * 60_000)
        checks.set(key, [gauge, 250, 10, 250 + Math.round((partIndex % 5) - 2), true, 'start-of-shift', partIndex % 2 ? supervisorId : operatorId, at, crypto.randomUUID()])
      }
    }
  })
  await insertMany(t, 'section_records', ['part_id', 'round', 'section', 'data', 'instrument_id', 'recorded_by', 'recorded_at', 'client_id'], sectionRows)
  await insertMany(t, 'gauge_readings', ['part_id', 'lot_id', 'round', 'area_no', 'spot_no', 'thickness_um', 'instrument_id', 'recorded_by', 'recorded_at', 'taken_at', 'client_id'], readingRows)
  await insertMany(t, 'instrument_verifications', ['instrument_id', 'reference_nominal_um', 'tolerance_um', 'reading_um', 'passed', 'occasion', 'verified_by', 'verified_at', 'client_id'], [...checks.values()])
  for (let i = 0; i < lots.length; i++) {
    const lot = lots[i]!
    await recordAudit(t, null, {
      action: 'lot.open',
      entityType: 'lot',
      entityId: lotIds[i]!.id as number,
      lotId: lotIds[i]!.id as number,
      after: { lotNumber: lotIds[i]!.lot_number, status: lot.status, parts: lot.parts.length },
      note: 'Demo seed',
    })
  }
  ctx.tally['lots'] = { created: lots.length, kept: 0 }
  ctx.tally['parts'] = { created: partRows.length, kept: 0 }
  ctx.tally['section records'] = { created: sectionRows.length, kept: 0 }
  ctx.tally['gauge readings'] = { created: readingRows.length, kept: 0 }
  ctx.tally['gauge checks'] = { created: checks.size, kept: 0 }
}

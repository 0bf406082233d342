/** Writes the planned history with multi-row INSERTs: parts carry the verdict judged from their rows. */
import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../index'
import type { SpecContent } from '../../../shared/spec/specContent'
import { judge, lastRound } from './floorHistory.lots'
import type { PlannedLot } from './floorHistory.plan'
import type { Seeder } from './seeder'

/** Multi-row INSERTs in chunks under PostgreSQL's bind-parameter limit. */
export async function insertMany(
  t: Transaction,
  table: string,
  columns: string[],
  rows: unknown[][],
  returning = '',
) {
  const out: Record<string, unknown>[] = []
  const per = Math.floor(30000 / columns.length)
  for (let i = 0; i < rows.length; i += per) {
    const chunk = rows.slice(i, i + per)
    const bind: unknown[] = []
    const values = chunk
      .map((r) => `(${r.map((v) => (bind.push(v), `$${bind.length}`)).join(',')})`)
      .join(',')
    const sql = `INSERT INTO ${table} (${columns.join(',')}) VALUES ${values}${returning ? ` RETURNING ${returning}` : ''}`
    const res = await sequelize.query(sql, {
      bind,
      transaction: t,
      type: returning ? QueryTypes.SELECT : QueryTypes.INSERT,
    })
    if (returning) out.push(...(res as unknown as Record<string, unknown>[]))
  }
  return out
}

export async function writeParts(
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
      partRows.push([
        lotIds[li]!.id,
        p.partNumber,
        p.description,
        p.heatNumber,
        1,
        p.coatedAreaM2,
        p.sampled,
        final,
        JSON.stringify(last.verdict),
        last.verdict.status,
        first.verdict.status,
        last.thicknessMeanUm,
        crypto.randomUUID(),
        at,
        at,
      ])
      owners.push({ lotIndex: li, partIndex: pi })
    })
  })
  const partIds = await insertMany(
    t,
    'parts',
    [
      'lot_id',
      'part_number',
      'description',
      'heat_number',
      'quantity',
      'coated_area_m2',
      'sampled',
      'round',
      'verdict',
      'verdict_status',
      'first_pass_status',
      'thickness_mean_um',
      'client_id',
      'created_at',
      'updated_at',
    ],
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
      const start = new Date(
        openedAt[lotIndex]!.getTime() + partIndex * 25 * 60_000 + (round.round - 1) * 18 * 3600_000,
      )
      round.sections.forEach((s, i) => {
        sectionRows.push([
          partId,
          round.round,
          s.section,
          JSON.stringify(s.data),
          serialId(s.instrument),
          operatorId,
          new Date(start.getTime() + i * 60_000),
          crypto.randomUUID(),
        ])
      })
      const gauge = serialId(lot.line === 'fbe-powder' ? 'HFW-DFT2-0417' : 'HFW-DFT2-0523')!
      for (const r of round.readings) {
        const takenAt = new Date(start.getTime() + 8 * 60_000 + r.minuteOffset * 20_000)
        readingRows.push([
          partId,
          lotId,
          round.round,
          r.areaNo,
          r.spotNo,
          r.thicknessUm,
          gauge,
          operatorId,
          new Date(takenAt.getTime() + 2000),
          takenAt,
          crypto.randomUUID(),
        ])
      }
      // The gauge's start-of-shift check on a reference shim, passed, before its first reading.
      const key = `${gauge}:${start.toISOString().slice(0, 13)}`
      if (round.readings.length && !checks.has(key)) {
        const at = new Date(start.getTime() - 10 * 60_000)
        checks.set(key, [
          gauge,
          250,
          10,
          250 + Math.round((partIndex % 5) - 2),
          true,
          'start-of-shift',
          partIndex % 2 ? supervisorId : operatorId,
          at,
          crypto.randomUUID(),
        ])
      }
    }
  })
  await insertMany(
    t,
    'section_records',
    [
      'part_id',
      'round',
      'section',
      'data',
      'instrument_id',
      'recorded_by',
      'recorded_at',
      'client_id',
    ],
    sectionRows,
  )
  await insertMany(
    t,
    'gauge_readings',
    [
      'part_id',
      'lot_id',
      'round',
      'area_no',
      'spot_no',
      'thickness_um',
      'instrument_id',
      'recorded_by',
      'recorded_at',
      'taken_at',
      'client_id',
    ],
    readingRows,
  )
  await insertMany(
    t,
    'instrument_verifications',
    [
      'instrument_id',
      'reference_nominal_um',
      'tolerance_um',
      'reading_um',
      'passed',
      'occasion',
      'verified_by',
      'verified_at',
      'client_id',
    ],
    [...checks.values()],
  )
  // One audit event per lot (actor: none, note: demo seed), in one INSERT like recordAudit writes them.
  await insertMany(
    t,
    'audit_events',
    // Dated when the lot was opened, so a lot's history reads in the order things happened.
    ['at', 'actor_id', 'action', 'entity_type', 'entity_id', 'lot_id', 'after', 'note'],
    lots.map((lot, i) => [
      openedAt[i]!,
      null,
      'lot.open',
      'lot',
      String(lotIds[i]!.id),
      lotIds[i]!.id,
      JSON.stringify({
        lotNumber: lotIds[i]!.lot_number,
        status: lot.status,
        parts: lot.parts.length,
      }),
      'Demo seed',
    ]),
  )
  ctx.tally['lots'] = { created: lots.length, kept: 0 }
  ctx.tally['parts'] = { created: partRows.length, kept: 0 }
  ctx.tally['section records'] = { created: sectionRows.length, kept: 0 }
  ctx.tally['gauge readings'] = { created: readingRows.length, kept: 0 }
  ctx.tally['gauge checks'] = { created: checks.size, kept: 0 }
}

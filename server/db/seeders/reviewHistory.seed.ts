import { QueryTypes } from 'sequelize'
import { sequelize } from '../index'
import { User } from '../models'
import type { SpecContent } from '../../../shared/spec/specContent'
import { specContentFor } from '../../api/lots/specCache'
import { ensureDefectType } from '../../api/defect-types/defectTypes.service'
import { DEFAULT_DEFECT_TYPES, defectCodeFor } from '../../api/defect-types/defaultDefectTypes'
import {
  AuditRows,
  NcNumbers,
  firstRoundFailures,
  insertRows,
  later,
  type SeededLot,
  type SeededPart,
} from './reviewHistory.parts'
import type { Seeder } from './seeder'

/**
 * The QA side of the floor history: each seeded lot past the floor gets its submission, its
 * nonconformances (repaired ones closed on released lots, open ones on the lots in the queue)
 * and its decisions, dated when they would have happened — so a lot's history tells the whole
 * story and the queue can be worked to empty. Written in bulk; runs once, after the floor history.
 */
export const reviewHistorySeeder: Seeder = {
  name: 'review-history',
  once: true,
  async run(ctx) {
    const { t } = ctx
    const supervisor = await User.findOne({
      where: { email: 'supervisor@harrowgate.example' },
      transaction: t,
    })
    if (!supervisor)
      throw new Error('Seed order: the demo users must come before the review history')
    const users = new Map((await User.findAll({ transaction: t })).map((u) => [u.id, u]))
    const lots = await sequelize.query<SeededLot>(
      `SELECT l.id, l.lot_number, l.status, l.opened_by, l.spec_id, l.spec_version,
              coalesce(max(s.recorded_at) FILTER (WHERE s.round = 1), l.created_at) AS round1_done,
              coalesce(max(s.recorded_at), l.created_at) AS last_done
         FROM lots l
         LEFT JOIN parts p ON p.lot_id = l.id
         LEFT JOIN section_records s ON s.part_id = p.id
        WHERE l.status IN ('awaiting-review', 'released')
          AND NOT EXISTS (SELECT 1 FROM lot_submissions x WHERE x.lot_id = l.id)
        GROUP BY l.id ORDER BY l.id`,
      { type: QueryTypes.SELECT, transaction: t },
    )
    if (lots.length === 0) return
    const parts = await sequelize.query<SeededPart>(
      `SELECT id, lot_id, part_number, heat_number, coated_area_m2, round, verdict FROM parts
        WHERE lot_id = ANY($1::int[]) AND (round > 1 OR verdict_status = 'fail') ORDER BY id`,
      { bind: [lots.map((l) => l.id)], type: QueryTypes.SELECT, transaction: t },
    )
    const lotById = new Map(lots.map((l) => [l.id, l]))
    const specs = new Map<number, SpecContent>()
    for (const l of lots) specs.set(l.id, await specContentFor(l.spec_id, l.spec_version, t))
    const repaired = parts.filter(
      (p) => lotById.get(p.lot_id)!.status === 'released' && p.round > 1,
    )
    const firstFailures = await firstRoundFailures(
      (id) => specs.get(parts.find((p) => p.id === id)!.lot_id)!,
      repaired,
      t,
    )
    const typeIds = new Map<string, number>()
    for (const d of DEFAULT_DEFECT_TYPES)
      typeIds.set(d.code, (await ensureDefectType(d.code, t)).id)
    const numbers = await NcNumbers.load(t)
    const audit = new AuditRows()

    // Nonconformances first: their ids are needed for the links and the events.
    const ncs: {
      row: unknown[]
      lot: SeededLot
      part: SeededPart
      criterion: string
      released: boolean
    }[] = []
    for (const p of parts) {
      const lot = lotById.get(p.lot_id)!
      const released = lot.status === 'released'
      const failures = released
        ? (firstFailures.get(p.id) ?? [])
        : p.verdict.criteria.filter((c) => c.status === 'fail')
      const submittedAt = later(lot.round1_done, 0.25)
      for (const c of failures) {
        const number = numbers.next(submittedAt)
        const closedAt = later(lot.last_done, 0.5)
        ncs.push({
          lot,
          part: p,
          criterion: c.criterion,
          released,
          row: [
            number,
            lot.id,
            released ? 'closed' : 'open',
            'auto',
            c.criterion,
            typeIds.get(defectCodeFor(c.criterion, c.reason)),
            `Part ${p.part_number} (heat ${p.heat_number}), round 1: ${c.reason}`,
            released ? 'repair-retest' : null,
            released ? 'Repair and re-measure' : '',
            released ? supervisor.id : null,
            released ? later(submittedAt, 1) : null,
            released ? `Retest round ${p.round} passed every criterion` : null,
            released ? supervisor.id : null,
            released ? closedAt : null,
            lot.opened_by,
            released ? 3 : 1,
            submittedAt,
            released ? closedAt : submittedAt,
          ],
        })
      }
    }
    const ncColumns = [
      'number',
      'lot_id',
      'status',
      'source',
      'criterion',
      'defect_type_id',
      'description',
      'disposition',
      'disposition_note',
      'dispositioned_by',
      'dispositioned_at',
      'verification',
      'closed_by',
      'closed_at',
      'opened_by',
      'version',
      'created_at',
      'updated_at',
    ]
    const ids = await insertRows<{ id: number; number: string }>(
      t,
      'nonconformances',
      ncColumns,
      ncs.map((n) => n.row),
      'id, number',
    )
    const idOf = new Map(ids.map((r) => [r.number, r.id]))
    await numbers.save(t)
    const links: unknown[][] = []
    const heldLots = new Set<number>()
    for (const n of ncs) {
      const number = n.row[0] as string
      const id = idOf.get(number)!
      const submittedAt = n.row[16] as Date
      links.push([id, n.part.id, 1, n.released ? n.part.round : null])
      const opener = users.get(n.lot.opened_by) ?? null
      // Opened by the submission, a moment after it.
      audit.add(later(submittedAt, 1 / 3600), opener, {
        action: 'nonconformance.open',
        entityType: 'nonconformance',
        entityId: id,
        lotId: n.lot.id,
        after: { number, criterion: n.criterion, status: 'open' },
        note: `${number} opened automatically at submission`,
      })
      if (!n.released) continue
      heldLots.add(n.lot.id)
      audit.add(later(submittedAt, 1), supervisor, {
        action: 'nonconformance.disposition',
        entityType: 'nonconformance',
        entityId: id,
        lotId: n.lot.id,
        before: { status: 'open' },
        after: { status: 'dispositioned', disposition: 'repair-retest' },
        note: `${number}: Repair and retest`,
      })
      audit.add(n.row[13] as Date, supervisor, {
        action: 'nonconformance.close',
        entityType: 'nonconformance',
        entityId: id,
        lotId: n.lot.id,
        before: { status: 'dispositioned' },
        after: { status: 'closed' },
        note: `${number} closed: retest passed`,
      })
    }
    await insertRows(
      t,
      'nonconformance_parts',
      ['nonconformance_id', 'part_id', 'round_found', 'retest_round'],
      links,
    )

    // Submissions and decisions: repaired lots were held for the repair, then released.
    const submissions: unknown[][] = []
    const decisions: unknown[][] = []
    const versions: unknown[][] = []
    for (const lot of lots) {
      const submittedAt = later(lot.round1_done, 0.25)
      const opener = users.get(lot.opened_by) ?? null
      submissions.push([lot.id, lot.opened_by, submittedAt])
      audit.add(submittedAt, opener, {
        action: 'lot.submit',
        entityType: 'lot',
        entityId: lot.id,
        lotId: lot.id,
        before: { status: 'open' },
        after: { status: 'awaiting-review' },
        note: `Lot ${lot.lot_number} submitted for review`,
      })
      if (lot.status !== 'released') continue
      let version = 2
      let from = 'awaiting-review'
      const decide = (decision: 'hold' | 'release', reason: string, to: string, at: Date) => {
        decisions.push([lot.id, decision, reason, from, to, version, supervisor.id, at])
        audit.add(at, supervisor, {
          action: `lot.${decision}`,
          entityType: 'lot',
          entityId: lot.id,
          lotId: lot.id,
          before: { status: from },
          after: { status: to, reason },
          note: `Lot ${lot.lot_number} ${to}`,
        })
        from = to
        version += 1
      }
      const held = heldLots.has(lot.id)
      if (held)
        decide('hold', 'Nonconforming parts: repair and retest', 'on-hold', later(submittedAt, 1))
      decide('release', '', 'released', later(lot.last_done, held ? 1 : 1.5))
      versions.push([lot.id, version])
    }
    await insertRows(t, 'lot_submissions', ['lot_id', 'submitted_by', 'submitted_at'], submissions)
    await insertRows(
      t,
      'lot_decisions',
      [
        'lot_id',
        'decision',
        'reason',
        'from_status',
        'to_status',
        'lot_version',
        'decided_by',
        'decided_at',
      ],
      decisions,
    )
    if (versions.length) {
      const bind: unknown[] = []
      const values = versions
        .map((r) => `($${bind.push(r[0])}::int, $${bind.push(r[1])}::int)`)
        .join(',')
      await sequelize.query(
        `UPDATE lots l SET version = v.version FROM (VALUES ${values}) v(id, version) WHERE l.id = v.id`,
        { bind, transaction: t },
      )
    }
    await audit.save(t)
    ctx.tally['lot reviews'] = { created: lots.length, kept: 0 }
    ctx.tally['nonconformances'] = { created: ncs.length, kept: 0 }
  },
}

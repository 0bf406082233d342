import { QueryTypes } from 'sequelize'
import { sequelize } from '../index'
import { User } from '../models'
import { specContentFor } from '../../api/lots/specCache'
import { nextNcNumber } from '../../api/nonconformances/ncNumber'
import { ensureDefectType } from '../../api/defect-types/defectTypes.service'
import { defectCodeFor } from '../../api/defect-types/defaultDefectTypes'
import {
  HOUR,
  firstRoundFailures,
  seedDecision,
  seedEvent,
  type SeededLot,
  type SeededPart,
} from './reviewHistory.parts'
import type { Seeder } from './seeder'

/**
 * The QA side of the floor history: each seeded lot past the floor gets its submission, its
 * nonconformances (repaired ones closed, the queue's ones open) and its decisions, dated when
 * they would have happened, so a lot's history tells the whole story and the queue can be
 * worked to empty. Runs once, after the floor history.
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
              coalesce((SELECT max(s.recorded_at) FROM section_records s JOIN parts p ON p.id = s.part_id
                         WHERE p.lot_id = l.id AND s.round = 1), l.created_at) AS round1_done,
              coalesce((SELECT max(s.recorded_at) FROM section_records s JOIN parts p ON p.id = s.part_id
                         WHERE p.lot_id = l.id), l.created_at) AS last_done
         FROM lots l
        WHERE l.status IN ('awaiting-review', 'released') AND NOT EXISTS (SELECT 1 FROM lot_submissions s WHERE s.lot_id = l.id)
        ORDER BY l.id`,
      { type: QueryTypes.SELECT, transaction: t },
    )
    let ncCount = 0
    for (const lot of lots) {
      const spec = await specContentFor(lot.spec_id, lot.spec_version, t)
      const opener = users.get(lot.opened_by) ?? null
      const submittedAt = new Date(new Date(lot.round1_done).getTime() + 0.25 * HOUR)
      const parts = await sequelize.query<SeededPart>(
        `SELECT id, part_number, heat_number, coated_area_m2, round, verdict FROM parts
          WHERE lot_id = $1 AND (round > 1 OR verdict_status = 'fail') ORDER BY id`,
        { bind: [lot.id], type: QueryTypes.SELECT, transaction: t },
      )
      await sequelize.query(
        'INSERT INTO lot_submissions (lot_id, submitted_by, submitted_at) VALUES ($1, $2, $3)',
        { bind: [lot.id, lot.opened_by, submittedAt], transaction: t },
      )
      await seedEvent(t, submittedAt, opener, {
        action: 'lot.submit',
        entityType: 'lot',
        entityId: lot.id,
        lotId: lot.id,
        before: { status: 'open' },
        after: { status: 'awaiting-review' },
        note: `Lot ${lot.lot_number} submitted for review`,
      })
      const ncIds: number[] = []
      for (const p of parts) {
        const released = lot.status === 'released'
        const failures = released
          ? await firstRoundFailures(spec, p, t)
          : p.verdict.criteria.filter((c) => c.status === 'fail')
        for (const c of failures) {
          const type = await ensureDefectType(defectCodeFor(c.criterion, c.reason), t)
          const number = await nextNcNumber(submittedAt, t)
          const closedAt = new Date(new Date(lot.last_done).getTime() + 0.5 * HOUR)
          const [nc] = await sequelize.query<{ id: number }>(
            `INSERT INTO nonconformances (number, lot_id, status, source, criterion, defect_type_id, description, disposition,
               disposition_note, dispositioned_by, dispositioned_at, verification, closed_by, closed_at, opened_by, version, created_at, updated_at)
             VALUES ($1, $2, $3, 'auto', $4, $5, $6, $7, $8, $9, $10, $11, $9, $12, $13, $14, $15, $15) RETURNING id`,
            {
              bind: [
                number,
                lot.id,
                released ? 'closed' : 'open',
                c.criterion,
                type.id,
                `Part ${p.part_number} (heat ${p.heat_number}), round 1: ${c.reason}`,
                released ? 'repair-retest' : null,
                released ? 'Repair and re-measure' : '',
                released ? supervisor.id : null,
                released ? new Date(submittedAt.getTime() + HOUR) : null,
                released ? `Retest round ${p.round} passed every criterion` : null,
                released ? closedAt : null,
                lot.opened_by,
                released ? 3 : 1,
                submittedAt,
              ],
              type: QueryTypes.SELECT,
              transaction: t,
            },
          )
          await sequelize.query(
            'INSERT INTO nonconformance_parts (nonconformance_id, part_id, round_found, retest_round) VALUES ($1, $2, 1, $3)',
            {
              bind: [nc!.id, p.id, released ? p.round : null],
              transaction: t,
            },
          )
          await seedEvent(t, submittedAt, opener, {
            action: 'nonconformance.open',
            entityType: 'nonconformance',
            entityId: nc!.id,
            lotId: lot.id,
            after: { number, criterion: c.criterion, status: 'open' },
            note: `${number} opened automatically at submission`,
          })
          if (released) {
            await seedEvent(t, new Date(submittedAt.getTime() + HOUR), supervisor, {
              action: 'nonconformance.disposition',
              entityType: 'nonconformance',
              entityId: nc!.id,
              lotId: lot.id,
              before: { status: 'open' },
              after: { status: 'dispositioned', disposition: 'repair-retest' },
              note: `${number}: Repair and retest`,
            })
            await seedEvent(t, closedAt, supervisor, {
              action: 'nonconformance.close',
              entityType: 'nonconformance',
              entityId: nc!.id,
              lotId: lot.id,
              before: { status: 'dispositioned' },
              after: { status: 'closed' },
              note: `${number} closed: retest passed`,
            })
          }
          ncIds.push(nc!.id)
          ncCount += 1
        }
      }
      if (lot.status !== 'released') continue
      // Repaired lots were held for the repair and submitted again; the rest released straight away.
      let version = 2
      if (ncIds.length) {
        await seedDecision(
          t,
          lot,
          supervisor,
          'hold',
          'Nonconforming parts: repair and retest',
          'awaiting-review',
          'on-hold',
          version++,
          new Date(submittedAt.getTime() + HOUR),
        )
      }
      const releasedAt = new Date(
        new Date(lot.last_done).getTime() + (ncIds.length ? 1 : 1.5) * HOUR,
      )
      await seedDecision(
        t,
        lot,
        supervisor,
        'release',
        '',
        ncIds.length ? 'on-hold' : 'awaiting-review',
        'released',
        version++,
        releasedAt,
      )
      await sequelize.query('UPDATE lots SET version = $2 WHERE id = $1', {
        bind: [lot.id, version],
        transaction: t,
      })
    }
    ctx.tally['lot reviews'] = { created: lots.length, kept: 0 }
    ctx.tally['nonconformances'] = { created: ncCount, kept: 0 }
  },
}

import { QueryTypes } from 'sequelize'
import { sequelize } from '../../db'
import { Part } from '../../db/models'
import type { LotDetail } from '../../../shared/api/lots'
import type { QueueRow } from '../../../shared/api/review'
import { LOT_ROW_SELECT, toLotRow, type LotSqlRow } from '../lots/lots.rows'
import { lotVerdictOf } from '../lots/lots.service'
import { specContentFor } from '../lots/specCache'

/** A queue row with the lot verdict at a glance (the contract's QueueRow plus lotVerdict). */
export type QueueEntry = QueueRow & { lotVerdict: LotDetail['lotVerdict'] }

/**
 * GET /api/review/queue: lots awaiting review, oldest submission first, then lots on hold (also
 * oldest first) — the supervisor works from the top.
 */
export async function reviewQueue(): Promise<QueueEntry[]> {
  const rows = await sequelize.query<
    LotSqlRow & { submitted_at: Date | null; open_ncs: number; recorder_ids: number[] | null }
  >(
    `SELECT q.*,
            (SELECT max(s.submitted_at) FROM lot_submissions s WHERE s.lot_id = q.id) AS submitted_at,
            (SELECT count(*)::int FROM nonconformances n WHERE n.lot_id = q.id AND n.status <> 'closed') AS open_ncs,
            (SELECT array_agg(DISTINCT x.id ORDER BY x.id) FROM (
               SELECT r.recorded_by AS id FROM gauge_readings r WHERE r.lot_id = q.id
               UNION SELECT s.recorded_by FROM section_records s JOIN parts p ON p.id = s.part_id
                WHERE p.lot_id = q.id) x) AS recorder_ids
       FROM (${LOT_ROW_SELECT} WHERE l.status IN ('awaiting-review', 'on-hold')) q
      ORDER BY q.status = 'on-hold', submitted_at NULLS LAST, q.id`,
    { type: QueryTypes.SELECT },
  )
  if (rows.length === 0) return []
  const parts = await Part.findAll({
    where: { lotId: rows.map((r) => r.id) },
    order: [['id', 'ASC']],
  })
  return Promise.all(
    rows.map(async (r) => {
      const spec = await specContentFor(r.spec_id, r.spec_version)
      return {
        ...toLotRow(r),
        submittedAt: r.submitted_at ? new Date(r.submitted_at).toISOString() : null,
        openNonconformances: r.open_ncs,
        recorderIds: r.recorder_ids ?? [],
        lotVerdict: lotVerdictOf(
          spec,
          parts.filter((p) => p.lotId === r.id),
        ),
      }
    }),
  )
}

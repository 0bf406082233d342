import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import type { Lot } from '../../db/models'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import type { SpecContent } from '../../../shared/spec/specContent'
import { recomputePartVerdict } from '../parts/partVerdict'
import { setLotStatus } from '../review/lotLock'
import { REPAIR_CARRIED_SECTIONS } from '../../../shared/inspection/assemblePartInput'

/**
 * Repair-and-retest and strip-and-recoat reopen the affected parts' inspection: each part moves
 * to its next round (round 1's records and readings stay beside the new ones; first_pass_status
 * keeps the round-1 verdict for first-pass yield), its verdict starts afresh for that round, and
 * a lot in review goes back to 'open' so the operator records the retest and submits again.
 * The caller holds the lot's row lock; parts are locked after it (lot before part).
 */
export async function startRetestRound(
  actor: AuditActor,
  lot: Lot,
  spec: SpecContent,
  nc: { id: number; number: string; disposition: string | null },
  t: Transaction,
): Promise<void> {
  // A touch-up keeps the original blast, climate, gauge set-up, cure and adhesion records;
  // stripping the film starts the inspection from nothing.
  const carried = nc.disposition === 'repair-retest' ? [...REPAIR_CARRIED_SECTIONS] : []
  const parts = await sequelize.query<{
    id: number
    round: number
    part_number: string
    heat_number: string
    coated_area_m2: number | null
    verdict_status: string | null
  }>(
    `SELECT p.id, p.round, p.part_number, p.heat_number, p.coated_area_m2, p.verdict_status
       FROM parts p JOIN nonconformance_parts np ON np.part_id = p.id
      WHERE np.nonconformance_id = $1 ORDER BY p.id FOR UPDATE OF p`,
    { bind: [nc.id], type: QueryTypes.SELECT, transaction: t },
  )
  for (const p of parts) {
    const round = p.round + 1
    await sequelize.query(
      `UPDATE parts SET round = $2, carried_sections = $3::text[], version = version + 1,
         updated_at = now() WHERE id = $1`,
      {
        bind: [p.id, round, carried],
        transaction: t,
      },
    )
    await sequelize.query(
      'UPDATE nonconformance_parts SET retest_round = $3 WHERE nonconformance_id = $1 AND part_id = $2',
      { bind: [nc.id, p.id, round], transaction: t },
    )
    const verdict = await recomputePartVerdict(
      spec,
      {
        id: p.id,
        round,
        partNumber: p.part_number,
        heatNumber: p.heat_number,
        coatedAreaM2: p.coated_area_m2,
      },
      t,
    )
    await recordAudit(t, actor, {
      action: 'part.retest-round',
      entityType: 'part',
      entityId: p.id,
      lotId: lot.id,
      before: { round: p.round, verdictStatus: p.verdict_status },
      after: { round, verdictStatus: verdict.status },
      note: `Round ${round} of part ${p.part_number} opened for the retest of ${nc.number}`,
    })
  }
  if (lot.status === 'awaiting-review' || lot.status === 'on-hold') {
    const before = { status: lot.status, version: lot.version }
    await setLotStatus(lot, 'open', t)
    await recordAudit(t, actor, {
      action: 'lot.open-for-retest',
      entityType: 'lot',
      entityId: lot.id,
      lotId: lot.id,
      before,
      after: { status: lot.status, version: lot.version },
      note: `Back on the floor for the retest of ${nc.number}`,
    })
  }
}

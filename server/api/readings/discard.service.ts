import { QueryTypes } from 'sequelize'
import { inTransaction, sequelize } from '../../db'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { conflict, notFound } from '../../lib/httpError'
import type { DiscardResult } from '../../../shared/api/lots'
import type { PartVerdict } from '../../../shared/rules/evaluatePart'
import { assertLotOpen } from '../lots/lotGuards'
import { lockPartForWrite } from '../parts/partLock'
import { recomputePartVerdict } from '../parts/partVerdict'
import { readingRows } from '../parts/partDetail'

/**
 * POST /api/readings/:id/discard. SSPC-PA 2 lets the inspector discard an unusually high or low
 * reading that cannot be repeated; a suspect reading is discarded before it is re-measured. The
 * reading is kept, flagged with who, when and why. Discarding twice answers the first discard.
 */
export async function discardReading(
  actor: AuditActor,
  readingId: string,
  reason: string,
): Promise<DiscardResult> {
  return inTransaction(async (t) => {
    const [found] = await sequelize.query<{ part_id: number }>(
      'SELECT part_id FROM gauge_readings WHERE id = $1',
      {
        bind: [readingId],
        type: QueryTypes.SELECT,
        transaction: t,
      },
    )
    if (!found) throw notFound(`Gauge reading #${readingId}`)
    const part = await lockPartForWrite(found.part_id, t)
    const [before] = await readingRows('r.id = $1', [readingId], t)
    if (before!.discarded) {
      const [row] = await sequelize.query<{ verdict: PartVerdict }>(
        'SELECT verdict FROM parts WHERE id = $1',
        {
          bind: [part.id],
          type: QueryTypes.SELECT,
          transaction: t,
        },
      )
      return { reading: before!, partVersion: part.version, verdict: row!.verdict }
    }
    assertLotOpen(
      { lotNumber: part.lotNumber, status: part.lotStatus },
      'before readings are discarded',
    )
    if (before!.round !== part.round) {
      throw conflict(
        'earlier_round',
        `This reading belongs to round ${before!.round}; part ${part.partNumber} is in round ${part.round}, so it no longer counts`,
      )
    }
    await sequelize.query(
      'UPDATE gauge_readings SET discarded_at = now(), discard_reason = $2, discarded_by = $3 WHERE id = $1',
      { bind: [readingId, reason, actor.id], transaction: t },
    )
    const verdict = await recomputePartVerdict(part.spec, part, t)
    const [reading] = await readingRows('r.id = $1', [readingId], t)
    await recordAudit(t, actor, {
      action: 'reading.discard',
      entityType: 'gauge-reading',
      entityId: readingId,
      lotId: part.lotId,
      before: before,
      after: reading,
      note: reason,
    })
    return { reading: reading!, partVersion: part.version, verdict }
  })
}

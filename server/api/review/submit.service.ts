import { QueryTypes } from 'sequelize'
import { inTransaction, sequelize } from '../../db'
import { Part } from '../../db/models'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { conflict } from '../../lib/httpError'
import type { LotRow } from '../../../shared/api/lots'
import type { NonconformanceRow } from '../../../shared/api/review'
import { lotVerdictOf } from '../lots/lots.service'
import { openAutoNonconformances } from '../nonconformances/nc.create'
import { currentLotRow, lockLot, partsUnderReview, setLotStatus } from './lotLock'

export interface SubmitResult {
  lot: LotRow
  /** Nonconformances opened for the failing criteria found at this submission. */
  nonconformancesOpened: NonconformanceRow[]
}

/**
 * POST /api/lots/:id/submit: the floor has finished the inspection. Every counted part must have
 * a verdict that is not incomplete (scrapped parts excepted); the lot goes to 'awaiting-review'
 * and each failing criterion of each part gets a nonconformance.
 */
export async function submitLot(
  actor: AuditActor,
  lotId: number,
  version?: number,
): Promise<SubmitResult> {
  return inTransaction(async (t) => {
    const { lot, spec } = await lockLot(lotId, t, version)
    if (lot.status !== 'open') {
      const message =
        lot.status === 'awaiting-review'
          ? `Lot ${lot.lotNumber} has already been submitted and is awaiting review`
          : `Lot ${lot.lotNumber} is ${lot.status}: only an open lot is submitted for review`
      throw conflict('lot_not_open', message, { current: await currentLotRow(lotId, t) })
    }
    const scrapped = await sequelize.query<{ id: number }>(
      'SELECT id FROM parts WHERE lot_id = $1 AND scrapped_by_nc IS NOT NULL',
      {
        bind: [lotId],
        type: QueryTypes.SELECT,
        transaction: t,
      },
    )
    const scrappedIds = new Set(scrapped.map((s) => s.id))
    const counted = partsUnderReview(
      spec,
      await Part.findAll({ where: { lotId }, order: [['id', 'ASC']], transaction: t }),
    )
    const unfinished = counted.filter(
      (p) => !scrappedIds.has(p.id) && (p.verdictStatus ?? 'incomplete') === 'incomplete',
    )
    if (unfinished.length) {
      const names = unfinished.map((p) => p.partNumber).join(', ')
      throw conflict(
        'inspection_incomplete',
        `Lot ${lot.lotNumber} cannot be submitted yet: the inspection of ${names} is not finished`,
        {
          parts: unfinished.map((p) => ({
            partId: p.id,
            partNumber: p.partNumber,
            round: p.round,
            reason: p.verdict?.reason ?? 'No verdict yet',
          })),
        },
      )
    }
    const verdict = lotVerdictOf(spec, counted)
    if (verdict.status === 'incomplete') {
      throw conflict(
        'inspection_incomplete',
        `Lot ${lot.lotNumber} cannot be submitted yet: ${verdict.reason}`,
        { parts: [] },
      )
    }
    const before = { status: lot.status, version: lot.version }
    await sequelize.query('INSERT INTO lot_submissions (lot_id, submitted_by) VALUES ($1, $2)', {
      bind: [lotId, actor.id],
      transaction: t,
    })
    await setLotStatus(lot, 'awaiting-review', t)
    await recordAudit(t, actor, {
      action: 'lot.submit',
      entityType: 'lot',
      entityId: lotId,
      lotId,
      before,
      after: { status: lot.status, version: lot.version, lotVerdict: verdict },
      note: `Lot ${lot.lotNumber} submitted for review: ${verdict.reason}`,
    })
    const nonconformancesOpened = await openAutoNonconformances(actor, lot, spec, t)
    return { lot: await currentLotRow(lotId, t), nonconformancesOpened }
  })
}

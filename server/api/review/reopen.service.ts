import type { z } from 'zod'
import { inTransaction, sequelize } from '../../db'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { conflict } from '../../lib/httpError'
import type { LotRow, LotStatus } from '../../../shared/api/lots'
import type { reopenSchema } from '../../../shared/api/review'
import { markLotCertificatesForReissue } from './certificatesHook'
import { currentLotRow, lockLot, setLotStatus } from './lotLock'

type ReopenBody = z.infer<typeof reopenSchema>

/** Released or held lots go back to the floor; awaiting-review has nothing to reopen, rejected is final. */
export const REOPENABLE: readonly LotStatus[] = ['released', 'on-hold']

export interface ReopenResult {
  lot: LotRow
  /** Certificates of the lot now marked as needing reissue. */
  certificatesMarked: number
}

/**
 * POST /api/lots/:id/reopen: only with a reason, always audited. The lot is 'open' again, so
 * its records can be corrected; any certificate issued for it is marked as needing reissue.
 */
export async function reopenLot(
  actor: AuditActor,
  lotId: number,
  body: ReopenBody,
): Promise<ReopenResult> {
  return inTransaction(async (t) => {
    const { lot } = await lockLot(lotId, t, body.version)
    if (!REOPENABLE.includes(lot.status)) {
      const why =
        lot.status === 'rejected'
          ? 'a rejection is final'
          : lot.status === 'open'
            ? 'it is already open'
            : 'it is awaiting review: decide it instead'
      throw conflict('transition_refused', `Lot ${lot.lotNumber} cannot be reopened: ${why}`, {
        current: await currentLotRow(lotId, t),
      })
    }
    const before = { status: lot.status, version: lot.version }
    await sequelize.query(
      'INSERT INTO lot_reopenings (lot_id, reason, from_status, reopened_by) VALUES ($1, $2, $3, $4)',
      {
        bind: [lotId, body.reason, lot.status, actor.id],
        transaction: t,
      },
    )
    await setLotStatus(lot, 'open', t)
    const certificatesMarked = await markLotCertificatesForReissue(lotId, t)
    await recordAudit(t, actor, {
      action: 'lot.reopen',
      entityType: 'lot',
      entityId: lotId,
      lotId,
      before,
      after: { status: lot.status, version: lot.version, reason: body.reason, certificatesMarked },
      note: `Lot ${lot.lotNumber} reopened (was ${before.status}): ${body.reason}`,
    })
    return { lot: await currentLotRow(lotId, t), certificatesMarked }
  })
}

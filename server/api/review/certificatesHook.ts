import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'

/**
 * A reopened lot's certificates no longer speak for it: mark them as needing reissue. The
 * certificates table belongs to the certificate feature and may not exist yet, so this asks
 * PostgreSQL first (to_regclass) and does nothing without it. Answers how many were marked.
 */
export async function markLotCertificatesForReissue(
  lotId: number,
  t: Transaction,
): Promise<number> {
  const [exists] = await sequelize.query<{ present: boolean }>(
    "SELECT to_regclass('certificates') IS NOT NULL AS present",
    { type: QueryTypes.SELECT, transaction: t },
  )
  if (!exists?.present) return 0
  const rows = await sequelize.query<{ id: number }>(
    'UPDATE certificates SET needs_reissue = true WHERE lot_id = $1 AND needs_reissue = false RETURNING id',
    { bind: [lotId], type: QueryTypes.SELECT, transaction: t },
  )
  return rows.length
}

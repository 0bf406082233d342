import { QueryTypes } from 'sequelize'
import { sequelize } from '../../db'
import type { LotToCertify } from '../../../shared/api/certificates'

/** Released lots without a valid certificate, most recently released first (the "to issue" list). */
export async function lotsToCertify(q: string | undefined, limit: number): Promise<LotToCertify[]> {
  const like = q ? `%${q.replace(/[\\%_]/g, (m) => `\\${m}`)}%` : null
  const rows = await sequelize.query<{
    id: number
    lot_number: string
    customer_name: string
    order_ref: string
    part_count: number
    decided_at: Date
    decider: string
    had_revoked: boolean
  }>(
    `SELECT l.id, l.lot_number, c.name AS customer_name, l.order_ref,
            (SELECT count(*)::int FROM parts p WHERE p.lot_id = l.id) AS part_count,
            d.decided_at, u.name AS decider,
            EXISTS (SELECT 1 FROM certificates x WHERE x.lot_id = l.id AND x.state = 'revoked') AS had_revoked
       FROM lots l
       JOIN customers c ON c.id = l.customer_id
       CROSS JOIN LATERAL (SELECT decided_at, decided_by FROM lot_decisions
                            WHERE lot_id = l.id AND decision = 'release' ORDER BY id DESC LIMIT 1) d
       JOIN users u ON u.id = d.decided_by
      WHERE l.status = 'released'
        AND NOT EXISTS (SELECT 1 FROM certificates x WHERE x.lot_id = l.id AND x.state = 'valid')
        AND ($1::text IS NULL OR l.lot_number ILIKE $1 OR l.order_ref ILIKE $1 OR c.name ILIKE $1)
      ORDER BY d.decided_at DESC, l.id DESC
      LIMIT $2`,
    { bind: [like, limit], type: QueryTypes.SELECT },
  )
  return rows.map((r) => ({
    lotId: r.id,
    lotNumber: r.lot_number,
    customerName: r.customer_name,
    orderRef: r.order_ref,
    partCount: r.part_count,
    releasedAt: new Date(r.decided_at).toISOString(),
    releasedBy: r.decider,
    hadRevoked: r.had_revoked,
  }))
}

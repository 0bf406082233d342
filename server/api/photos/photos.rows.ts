import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import type { PhotoRow } from '../../../shared/api/lots'

/** Photos filed under a lot or under a nonconformance, oldest first (bytes are served apart). */
export async function photoRowsBy(
  owner: 'lot' | 'nonconformance',
  ownerId: number,
  t?: Transaction,
): Promise<PhotoRow[]> {
  const column = owner === 'lot' ? 'p.lot_id' : 'p.nonconformance_id'
  const rows = await sequelize.query<{
    id: number
    part_id: number | null
    caption: string
    width: number
    height: number
    uploaded_by: number
    uploader_name: string
    uploaded_at: Date
  }>(
    `SELECT p.id, p.part_id, p.caption, p.width, p.height, p.uploaded_by, u.name AS uploader_name, p.uploaded_at
       FROM photos p JOIN users u ON u.id = p.uploaded_by WHERE ${column} = $1 ORDER BY p.id`,
    { bind: [ownerId], type: QueryTypes.SELECT, transaction: t },
  )
  return rows.map((r) => ({
    id: r.id,
    partId: r.part_id,
    caption: r.caption,
    width: r.width,
    height: r.height,
    uploaded: {
      byId: r.uploaded_by,
      byName: r.uploader_name,
      at: new Date(r.uploaded_at).toISOString(),
    },
  }))
}

import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import { notFound } from '../../lib/httpError'
import type { PhotoRow, Stamp } from '../../../shared/api/lots'
import type { Disposition, NcStatus, NonconformanceRow } from '../../../shared/api/review'
import { photoRowsBy } from '../photos/photos.rows'

interface NcSqlRow {
  id: number
  number: string
  lot_id: number
  lot_number: string
  status: NcStatus
  source: 'auto' | 'manual'
  criterion: string | null
  defect_type_id: number
  defect_label: string
  description: string
  parts: NonconformanceRow['parts'] | null
  disposition: Disposition | null
  concession_ref: string | null
  disposition_note: string
  dispositioned_by: number | null
  dispositioner_name: string | null
  dispositioned_at: Date | null
  verification: string | null
  closed_by: number | null
  closer_name: string | null
  closed_at: Date | null
  opened_by: number
  opener_name: string
  created_at: Date
  version: number
}

const NC_SELECT = `
  SELECT n.id, n.number, n.lot_id, l.lot_number, n.status, n.source, n.criterion, n.defect_type_id,
         d.label AS defect_label, n.description, n.disposition, n.concession_ref, n.disposition_note,
         n.dispositioned_by, du.name AS dispositioner_name, n.dispositioned_at, n.verification,
         n.closed_by, cu.name AS closer_name, n.closed_at, n.opened_by, ou.name AS opener_name,
         n.created_at, n.version,
         (SELECT json_agg(json_build_object('id', p.id, 'partNumber', p.part_number,
                   'heatNumber', p.heat_number, 'round', p.round) ORDER BY p.id)
            FROM nonconformance_parts np JOIN parts p ON p.id = np.part_id
           WHERE np.nonconformance_id = n.id) AS parts
    FROM nonconformances n
    JOIN lots l ON l.id = n.lot_id
    JOIN defect_types d ON d.id = n.defect_type_id
    JOIN users ou ON ou.id = n.opened_by
    LEFT JOIN users du ON du.id = n.dispositioned_by
    LEFT JOIN users cu ON cu.id = n.closed_by`

function stamp(byId: number | null, byName: string | null, at: Date | null): Stamp | null {
  return byId === null || at === null
    ? null
    : { byId, byName: byName ?? '', at: new Date(at).toISOString() }
}

function toNcRow(r: NcSqlRow): NonconformanceRow {
  return {
    id: r.id,
    number: r.number,
    lotId: r.lot_id,
    lotNumber: r.lot_number,
    status: r.status,
    source: r.source,
    criterion: r.criterion,
    defectTypeId: r.defect_type_id,
    defectLabel: r.defect_label,
    description: r.description,
    parts: r.parts ?? [],
    disposition: r.disposition,
    concessionRef: r.concession_ref,
    dispositionNote: r.disposition_note,
    dispositioned: stamp(r.dispositioned_by, r.dispositioner_name, r.dispositioned_at),
    verification: r.verification,
    closed: stamp(r.closed_by, r.closer_name, r.closed_at),
    opened: stamp(r.opened_by, r.opener_name, r.created_at)!,
    version: r.version,
  }
}

/** Nonconformance rows by a WHERE on `n` (and `l`), oldest first. */
export async function ncRows(
  where: string,
  bind: unknown[],
  t?: Transaction,
): Promise<NonconformanceRow[]> {
  const rows = await sequelize.query<NcSqlRow>(
    `${NC_SELECT} ${where ? `WHERE ${where}` : ''} ORDER BY n.id`,
    {
      bind,
      type: QueryTypes.SELECT,
      transaction: t,
    },
  )
  return rows.map(toNcRow)
}

export async function ncRow(id: number, t?: Transaction): Promise<NonconformanceRow> {
  const [row] = await ncRows('n.id = $1', [id], t)
  if (!row) throw notFound(`Nonconformance #${id}`)
  return row
}

/** Photos filed under a nonconformance, oldest first. */
export const ncPhotoRows = (ncId: number, t?: Transaction): Promise<PhotoRow[]> =>
  photoRowsBy('nonconformance', ncId, t)

/** GET /api/nonconformances/:id: the record with its photos (the contract's row plus `photos`). */
export async function ncDetail(id: number): Promise<NonconformanceRow & { photos: PhotoRow[] }> {
  return { ...(await ncRow(id)), photos: await ncPhotoRows(id) }
}

/** GET /api/nonconformances?status&lotId, oldest first. */
export function listNcs(query: {
  status?: NcStatus
  lotId?: number
}): Promise<NonconformanceRow[]> {
  const where: string[] = []
  const bind: unknown[] = []
  if (query.status) where.push(`n.status = $${bind.push(query.status)}`)
  if (query.lotId) where.push(`n.lot_id = $${bind.push(query.lotId)}`)
  return ncRows(where.join(' AND '), bind)
}

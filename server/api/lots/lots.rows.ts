import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import type { Line, LotRow, LotStatus, PartRow, PhotoRow, Shift } from '../../../shared/api/lots'
import type { Part } from '../../db/models'
import { photoRowsBy } from '../photos/photos.rows'

/** Columns of LotRow, with the part tallies from the stored verdicts. */
export const LOT_ROW_SELECT = `
  SELECT l.id, l.lot_number, l.status, l.customer_id, c.name AS customer_name, l.order_ref,
         l.spec_id, s.code AS spec_code, l.spec_version, l.line, l.shift, l.coating_material,
         l.batch_number, to_char(l.batch_expires_on, 'YYYY-MM-DD') AS batch_expires_on,
         l.notes, l.opened_by, u.name AS opened_by_name, l.created_at, l.version,
         pc.part_count, pc.parts_passed, pc.parts_failed, pc.parts_incomplete
    FROM lots l
    JOIN customers c ON c.id = l.customer_id
    JOIN coating_specs s ON s.id = l.spec_id
    JOIN users u ON u.id = l.opened_by
    CROSS JOIN LATERAL (
      SELECT count(*)::int AS part_count,
             (count(*) FILTER (WHERE p.verdict_status = 'pass'))::int AS parts_passed,
             (count(*) FILTER (WHERE p.verdict_status = 'fail'))::int AS parts_failed,
             (count(*) FILTER (WHERE coalesce(p.verdict_status, 'incomplete') = 'incomplete'))::int AS parts_incomplete
        FROM parts p WHERE p.lot_id = l.id) pc`

export interface LotSqlRow {
  id: number
  lot_number: string
  status: LotStatus
  customer_id: number
  customer_name: string
  order_ref: string
  spec_id: number
  spec_code: string
  spec_version: number
  line: Line
  shift: Shift
  coating_material: string
  batch_number: string
  batch_expires_on: string
  notes: string
  opened_by: number
  opened_by_name: string
  created_at: Date
  version: number
  part_count: number
  parts_passed: number
  parts_failed: number
  parts_incomplete: number
}

export function toLotRow(r: LotSqlRow): LotRow {
  return {
    id: r.id,
    lotNumber: r.lot_number,
    status: r.status,
    customerId: r.customer_id,
    customerName: r.customer_name,
    orderRef: r.order_ref,
    specId: r.spec_id,
    specCode: r.spec_code,
    specVersion: r.spec_version,
    line: r.line,
    shift: r.shift,
    coatingMaterial: r.coating_material,
    batchNumber: r.batch_number,
    batchExpiresOn: r.batch_expires_on,
    partCount: r.part_count,
    partsPassed: r.parts_passed,
    partsFailed: r.parts_failed,
    partsIncomplete: r.parts_incomplete,
    opened: {
      byId: r.opened_by,
      byName: r.opened_by_name,
      at: new Date(r.created_at).toISOString(),
    },
    version: r.version,
  }
}

export async function findLotSqlRow(id: number, t?: Transaction): Promise<LotSqlRow | null> {
  const rows = await sequelize.query<LotSqlRow>(`${LOT_ROW_SELECT} WHERE l.id = $1`, {
    bind: [id],
    type: QueryTypes.SELECT,
    transaction: t,
  })
  return rows[0] ?? null
}

export function toPartRow(p: Part): PartRow {
  return {
    id: p.id,
    lotId: p.lotId,
    partNumber: p.partNumber,
    description: p.description,
    heatNumber: p.heatNumber,
    quantity: p.quantity,
    coatedAreaM2: p.coatedAreaM2,
    sampled: p.sampled,
    round: p.round,
    carriedSections: p.carriedSections ?? [],
    verdict: p.verdict,
    version: p.version,
  }
}

export const photoRowsOfLot = (lotId: number, t?: Transaction): Promise<PhotoRow[]> =>
  photoRowsBy('lot', lotId, t)

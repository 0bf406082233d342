import type { Transaction } from 'sequelize'
import { preparedQuery } from '../../db/prepared'
import { notFound } from '../../lib/httpError'
import type { LotStatus } from '../../../shared/api/lots'
import type { SpecContent } from '../../../shared/spec/specContent'
import { specContentFor } from '../lots/specCache'
import type { PartForVerdict } from './partVerdict'

export interface LockedPart extends PartForVerdict {
  lotId: number
  version: number
  lotNumber: string
  lotStatus: LotStatus
  specId: number
  specVersion: number
  spec: SpecContent
}

interface LockRow {
  id: number
  lot_id: number
  round: number
  part_number: string
  heat_number: string
  coated_area_m2: number | null
  version: number
  lot_number: string
  status: LotStatus
  spec_id: number
  spec_version: number
}

/**
 * Every write to a part starts here: the lot row is share-locked (its status cannot change
 * under the write) and the part row locked for update (writes to one part queue up, so each
 * recomputed verdict sees every reading before it). Lot before part, the order the review
 * feature must use too.
 */
export async function lockPartForWrite(partId: number, t: Transaction): Promise<LockedPart> {
  const part = (await lockPartsForWrite([partId], t)).get(partId)
  if (!part) throw notFound(`Part #${partId}`)
  return part
}

/**
 * The same locks on several parts in one statement, taken in part id order (so two writers of
 * overlapping parts never wait on each other in a ring). Parts that do not exist are not in the
 * map.
 */
export async function lockPartsForWrite(
  partIds: number[],
  t: Transaction,
): Promise<Map<number, LockedPart>> {
  const rows = await preparedQuery<LockRow>(
    t,
    'parts_lock_for_write',
    `SELECT p.id, p.lot_id, p.round, p.part_number, p.heat_number, p.coated_area_m2, p.version,
            l.lot_number, l.status, l.spec_id, l.spec_version
       FROM lots l JOIN parts p ON p.lot_id = l.id
      WHERE p.id = ANY($1::int[])
      ORDER BY p.id
      FOR SHARE OF l FOR UPDATE OF p`,
    [partIds],
  )
  const parts = new Map<number, LockedPart>()
  for (const row of rows) parts.set(row.id, await lockedPartOf(row, t))
  return parts
}

async function lockedPartOf(row: LockRow, t: Transaction): Promise<LockedPart> {
  return {
    id: row.id,
    lotId: row.lot_id,
    round: row.round,
    partNumber: row.part_number,
    heatNumber: row.heat_number,
    coatedAreaM2: row.coated_area_m2,
    version: row.version,
    lotNumber: row.lot_number,
    lotStatus: row.status,
    specId: row.spec_id,
    specVersion: row.spec_version,
    spec: await specContentFor(row.spec_id, row.spec_version, t),
  }
}

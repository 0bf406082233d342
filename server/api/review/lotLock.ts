import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import { Lot } from '../../db/models'
import { conflict, notFound } from '../../lib/httpError'
import type { LotRow, LotStatus } from '../../../shared/api/lots'
import type { SpecContent } from '../../../shared/spec/specContent'
import { findLotSqlRow, toLotRow } from '../lots/lots.rows'
import { specContentFor } from '../lots/specCache'

/** The lot as a LotRow, for answers and for the "current state" of a 409. */
export async function currentLotRow(lotId: number, t?: Transaction): Promise<LotRow> {
  const row = await findLotSqlRow(lotId, t)
  if (!row) throw notFound(`Lot #${lotId}`)
  return toLotRow(row)
}

/**
 * Every review write starts here: the lot row is locked FOR UPDATE (two supervisors deciding at
 * once queue up on it; the second then sees the first one's version) and, when the caller sends
 * the version it looked at, a stale one answers 409 with the lot as it is now. Lot before parts
 * and nonconformances: the order the shop-floor writes use too.
 */
export async function lockLot(
  lotId: number,
  t: Transaction,
  expectedVersion?: number,
): Promise<{ lot: Lot; spec: SpecContent }> {
  const lot = await Lot.findByPk(lotId, { lock: t.LOCK.UPDATE, transaction: t })
  if (!lot) throw notFound(`Lot #${lotId}`)
  if (expectedVersion !== undefined && lot.version !== expectedVersion) {
    throw conflict(
      'version_conflict',
      `Lot ${lot.lotNumber} was changed meanwhile (now ${lot.status}, version ${lot.version}): ` +
        'look at its current state before deciding again',
      { current: await currentLotRow(lotId, t) },
    )
  }
  return { lot, spec: await specContentFor(lot.specId, lot.specVersion, t) }
}

/** Moves the lot to a new status and bumps its version, inside the caller's transaction. */
export async function setLotStatus(lot: Lot, status: LotStatus, t: Transaction): Promise<void> {
  await lot.update({ status, version: lot.version + 1 }, { transaction: t })
}

/**
 * People who recorded readings or inspection sections of the lot, in any round. The inspection
 * is independent of production: they may not release it unless the plant allows it.
 */
export async function recorderIdsOf(lotId: number, t?: Transaction): Promise<number[]> {
  const rows = await sequelize.query<{ id: number }>(
    `SELECT recorded_by AS id FROM gauge_readings WHERE lot_id = $1
     UNION
     SELECT s.recorded_by FROM section_records s JOIN parts p ON p.id = s.part_id WHERE p.lot_id = $1
     ORDER BY id`,
    { bind: [lotId], type: QueryTypes.SELECT, transaction: t },
  )
  return rows.map((r) => r.id)
}

/** Parts the lot verdict counts (the lots service's rule): sampled parts when the spec samples, else all. */
export function partsUnderReview<P extends { sampled: boolean }>(
  spec: SpecContent,
  parts: P[],
): P[] {
  return spec.sampling.mode === 'sample' ? parts.filter((p) => p.sampled) : parts
}

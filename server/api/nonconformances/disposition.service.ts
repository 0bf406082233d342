import { QueryTypes, type Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction, sequelize } from '../../db'
import { Nonconformance, type Lot } from '../../db/models'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { conflict, notFound } from '../../lib/httpError'
import {
  DISPOSITION_LABELS,
  type Disposition,
  type NonconformanceRow,
  type closeNcSchema,
  type dispositionSchema,
} from '../../../shared/api/review'
import { lockLot } from '../review/lotLock'
import { ncRow } from './nc.rows'
import { startRetestRound } from './retestRound'

type DispositionBody = z.infer<typeof dispositionSchema>
type CloseBody = z.infer<typeof closeNcSchema>

const RETEST: readonly Disposition[] = ['repair-retest', 'strip-recoat']

/** Lot, then the nonconformance, both locked; a stale nonconformance version answers 409 with its current state. */
async function lockNc(id: number, version: number, t: Transaction) {
  const found = await Nonconformance.findByPk(id, { attributes: ['id', 'lotId'], transaction: t })
  if (!found) throw notFound(`Nonconformance #${id}`)
  const { lot, spec } = await lockLot(found.lotId, t)
  const nc = (await Nonconformance.findByPk(id, { lock: t.LOCK.UPDATE, transaction: t }))!
  if (nc.version !== version) {
    throw conflict(
      'version_conflict',
      `${nc.number} was changed meanwhile: look at its current state and try again`,
      {
        current: await ncRow(id, t),
      },
    )
  }
  if (nc.status === 'closed') {
    throw conflict(
      'nc_closed',
      `${nc.number} is closed: open a new nonconformance if something else is found`,
      {
        current: await ncRow(id, t),
      },
    )
  }
  return { lot, spec, nc }
}

/**
 * What a lot's state allows. A released lot's parts are frozen: anything that changes them
 * (a retest round, a scrapped part) needs the lot reopened first. A rejected lot is final: its
 * parts can still be scrapped or accepted on concession, not retested.
 */
function assertDispositionFits(lot: Lot, disposition: Disposition, ncNumber: string) {
  const changesParts = disposition !== 'use-as-is'
  if (lot.status === 'released' && changesParts) {
    throw conflict(
      'lot_released',
      `Lot ${lot.lotNumber} has been released: reopen the lot with a reason before ${ncNumber} can be dispositioned "${DISPOSITION_LABELS[disposition]}"`,
      { lotNumber: lot.lotNumber, status: lot.status },
    )
  }
  if (lot.status === 'rejected' && RETEST.includes(disposition)) {
    throw conflict(
      'lot_rejected',
      `Lot ${lot.lotNumber} has been rejected: its parts are not retested; scrap them or accept them on concession`,
      {
        lotNumber: lot.lotNumber,
        status: lot.status,
      },
    )
  }
}

/** POST /api/nonconformances/:id/disposition. May be changed until the record is closed. */
export async function dispositionNc(
  actor: AuditActor,
  id: number,
  body: DispositionBody,
): Promise<NonconformanceRow> {
  return inTransaction(async (t) => {
    const { lot, spec, nc } = await lockNc(id, body.version, t)
    assertDispositionFits(lot, body.disposition, nc.number)
    const before = await ncRow(id, t)
    await nc.update(
      {
        status: 'dispositioned',
        disposition: body.disposition,
        concessionRef: body.disposition === 'use-as-is' ? body.concessionRef : null,
        dispositionNote: body.note,
        dispositionedBy: actor.id,
        dispositionedAt: new Date(),
        version: nc.version + 1,
      },
      { transaction: t },
    )
    if (RETEST.includes(body.disposition)) await startRetestRound(actor, lot, spec, nc, t)
    const after = await ncRow(id, t)
    await recordAudit(t, actor, {
      action: 'nonconformance.disposition',
      entityType: 'nonconformance',
      entityId: id,
      lotId: lot.id,
      before,
      after,
      note: `${nc.number}: ${DISPOSITION_LABELS[body.disposition]}`,
    })
    return after
  })
}

/** Parts of a repair or recoat whose retest round does not pass yet: they keep the record open. */
async function retestsNotPassing(ncId: number, t: Transaction) {
  return sequelize.query<{
    id: number
    part_number: string
    round: number
    verdict_status: string | null
    reason: string | null
  }>(
    `SELECT p.id, p.part_number, p.round, p.verdict_status, p.verdict->>'reason' AS reason
       FROM nonconformance_parts np JOIN parts p ON p.id = np.part_id
      WHERE np.nonconformance_id = $1
        AND (np.retest_round IS NULL OR p.round < np.retest_round OR p.verdict_status IS DISTINCT FROM 'pass')
      ORDER BY p.id`,
    { bind: [ncId], type: QueryTypes.SELECT, transaction: t },
  )
}

/** POST /api/nonconformances/:id/close: the disposition was carried out, and this is how it was verified. */
export async function closeNc(
  actor: AuditActor,
  id: number,
  body: CloseBody,
): Promise<NonconformanceRow> {
  return inTransaction(async (t) => {
    const { lot, nc } = await lockNc(id, body.version, t)
    if (nc.status !== 'dispositioned' || !nc.disposition) {
      throw conflict(
        'nc_not_dispositioned',
        `${nc.number} has no disposition yet: decide what happens to the parts first`,
        {
          current: await ncRow(id, t),
        },
      )
    }
    assertDispositionFits(lot, nc.disposition, nc.number)
    if (RETEST.includes(nc.disposition)) {
      const open = await retestsNotPassing(id, t)
      if (open.length) {
        const list = open
          .map((p) => `${p.part_number} (round ${p.round}: ${p.verdict_status ?? 'no verdict'})`)
          .join(', ')
        throw conflict(
          'retest_not_passed',
          `${nc.number} stays open until the retest passes: ${list}`,
          {
            parts: open.map((p) => ({
              partId: p.id,
              partNumber: p.part_number,
              round: p.round,
              status: p.verdict_status,
              reason: p.reason,
            })),
          },
        )
      }
    }
    const before = await ncRow(id, t)
    if (nc.disposition === 'scrap') await scrapParts(actor, lot, nc, t)
    await nc.update(
      {
        status: 'closed',
        verification: body.verification,
        closedBy: actor.id,
        closedAt: new Date(),
        version: nc.version + 1,
      },
      { transaction: t },
    )
    const after = await ncRow(id, t)
    await recordAudit(t, actor, {
      action: 'nonconformance.close',
      entityType: 'nonconformance',
      entityId: id,
      lotId: lot.id,
      before,
      after,
      note: `${nc.number} closed: ${body.verification}`,
    })
    return after
  })
}

/** A scrapped part leaves the shipment: marked on the part, so release and the certificate leave it out. */
async function scrapParts(actor: AuditActor, lot: Lot, nc: Nonconformance, t: Transaction) {
  const rows = await sequelize.query<{ id: number; part_number: string }>(
    `UPDATE parts p SET scrapped_by_nc = $1, version = version + 1, updated_at = now()
       FROM nonconformance_parts np
      WHERE np.nonconformance_id = $1 AND np.part_id = p.id AND p.scrapped_by_nc IS NULL
      RETURNING p.id, p.part_number`,
    { bind: [nc.id], type: QueryTypes.SELECT, transaction: t },
  )
  for (const p of rows) {
    await recordAudit(t, actor, {
      action: 'part.scrap',
      entityType: 'part',
      entityId: p.id,
      lotId: lot.id,
      before: { scrappedByNc: null },
      after: { scrappedByNc: nc.id },
      note: `Part ${p.part_number} scrapped under ${nc.number}: left out of the shipment`,
    })
  }
}

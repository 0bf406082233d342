import { QueryTypes, type Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction, sequelize } from '../../db'
import { Lot, LotDecision } from '../../db/models'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { HttpError, conflict, notFound } from '../../lib/httpError'
import type { LotRow, LotStatus } from '../../../shared/api/lots'
import type { Decision, DecisionRow, decisionSchema } from '../../../shared/api/review'
import { getPlantSettings } from '../settings/settings.service'
import { currentLotRow, lockLot, recorderIdsOf, setLotStatus } from './lotLock'
import { releaseBlockers } from './releaseBlockers'

type DecisionBody = z.infer<typeof decisionSchema>

const RESULT: Record<Decision, LotStatus> = {
  release: 'released',
  hold: 'on-hold',
  reject: 'rejected',
}

/** The review state machine: which decision each lot status allows. Released and rejected are final (a released lot can be reopened). */
export const ALLOWED_DECISIONS: Record<LotStatus, readonly Decision[]> = {
  open: [],
  'awaiting-review': ['release', 'hold', 'reject'],
  'on-hold': ['release', 'reject'],
  released: [],
  rejected: [],
}

function refusal(lotNumber: string, status: LotStatus, decision: Decision): string {
  switch (status) {
    case 'open':
      return `Lot ${lotNumber} is still open on the floor: it can be decided once its inspection is submitted for review`
    case 'on-hold':
      return `Lot ${lotNumber} is already on hold: release or reject it`
    case 'released':
      return `Lot ${lotNumber} has been released: to change the decision, reopen the lot with a reason`
    case 'rejected':
      return `Lot ${lotNumber} has been rejected: a rejection is final`
    default:
      return `Lot ${lotNumber} (${status}) cannot be given the decision "${decision}"`
  }
}

export interface DecisionResult {
  lot: LotRow
  decision: DecisionRow
}

/**
 * POST /api/lots/:id/decisions. The lot row is locked and its version compared first, so of two
 * supervisors deciding at once exactly one decision stands; the other gets 409 with the lot as it
 * now is. Release also needs no blockers, and a releaser independent of the inspection.
 */
export async function decideLot(
  actor: AuditActor,
  lotId: number,
  body: DecisionBody,
): Promise<DecisionResult> {
  return inTransaction(async (t) => {
    const { lot, spec } = await lockLot(lotId, t, body.version)
    const allowed = ALLOWED_DECISIONS[lot.status as LotStatus]
    if (!allowed.includes(body.decision)) {
      throw conflict('transition_refused', refusal(lot.lotNumber, lot.status, body.decision), {
        current: await currentLotRow(lotId, t),
        allowed,
      })
    }
    let independenceWaived = false
    if (body.decision === 'release') {
      const blockers = await releaseBlockers(lot, spec, t)
      if (blockers.length) {
        throw conflict(
          'release_blocked',
          `Lot ${lot.lotNumber} cannot be released yet: ${blockers.length} item(s) stand in the way`,
          { blockers },
        )
      }
      if ((await recorderIdsOf(lotId, t)).includes(actor.id)) {
        if (!(await getPlantSettings(t)).allowRecorderToRelease) {
          throw new HttpError(
            403,
            'not_independent',
            `You recorded inspection results of lot ${lot.lotNumber}: another supervisor must release it (the inspection is independent of production)`,
          )
        }
        independenceWaived = true
      }
    }
    const before = { status: lot.status, version: lot.version }
    const record = await LotDecision.create(
      {
        lotId,
        decision: body.decision,
        reason: body.reason,
        fromStatus: lot.status,
        toStatus: RESULT[body.decision],
        lotVersion: lot.version,
        decidedBy: actor.id,
        independenceWaived,
      },
      { transaction: t },
    )
    await setLotStatus(lot, RESULT[body.decision], t)
    const [decision] = await decisionRowsOf(lotId, record.id, t)
    await recordAudit(t, actor, {
      action: `lot.${body.decision}`,
      entityType: 'lot',
      entityId: lotId,
      lotId,
      before,
      after: {
        status: lot.status,
        version: lot.version,
        decisionId: record.id,
        reason: body.reason,
        independenceWaived,
      },
      note: `Lot ${lot.lotNumber} ${RESULT[body.decision]}${body.reason ? `: ${body.reason}` : ''}${independenceWaived ? ' (released by a recorder of the lot: independence waived by the plant setting)' : ''}`,
    })
    return { lot: await currentLotRow(lotId, t), decision: decision! }
  })
}

async function decisionRowsOf(lotId: number, id?: number, t?: Transaction): Promise<DecisionRow[]> {
  const rows = await sequelize.query<{
    id: number
    lot_id: number
    decision: Decision
    reason: string
    decided_by: number
    decider_name: string
    decided_at: Date
    independence_waived: boolean
  }>(
    `SELECT d.id, d.lot_id, d.decision, d.reason, d.decided_by, u.name AS decider_name, d.decided_at, d.independence_waived
       FROM lot_decisions d JOIN users u ON u.id = d.decided_by
      WHERE d.lot_id = $1 ${id === undefined ? '' : 'AND d.id = $2'} ORDER BY d.id`,
    { bind: id === undefined ? [lotId] : [lotId, id], type: QueryTypes.SELECT, transaction: t },
  )
  return rows.map((r) => ({
    id: r.id,
    lotId: r.lot_id,
    decision: r.decision,
    reason: r.reason,
    decided: {
      byId: r.decided_by,
      byName: r.decider_name,
      at: new Date(r.decided_at).toISOString(),
    },
    independenceWaived: r.independence_waived,
  }))
}

/** GET /api/lots/:id/decisions: every decision, oldest first; none is ever deleted. */
export async function listDecisions(lotId: number): Promise<DecisionRow[]> {
  if (!(await Lot.findByPk(lotId, { attributes: ['id'] }))) throw notFound(`Lot #${lotId}`)
  return decisionRowsOf(lotId)
}

import { QueryTypes, type Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction, sequelize } from '../../db'
import { DefectType, Lot, Nonconformance, NonconformancePart, Part } from '../../db/models'
import { recordAudit, type AuditActor } from '../../audit/audit.service'
import { HttpError } from '../../lib/httpError'
import type { NonconformanceRow, createNcSchema } from '../../../shared/api/review'
import type { CriterionName } from '../../../shared/rules/verdict'
import type { SpecContent } from '../../../shared/spec/specContent'
import { ensureDefectType } from '../defect-types/defectTypes.service'
import { defectCodeFor } from '../defect-types/defaultDefectTypes'
import { partsUnderReview } from '../review/lotLock'
import { nextNcNumber } from './ncNumber'
import { ncRow } from './nc.rows'

type CreateNcBody = z.infer<typeof createNcSchema>

interface NewNc {
  lot: { id: number; lotNumber: string }
  source: 'auto' | 'manual'
  criterion: CriterionName | null
  defectTypeId: number
  description: string
  parts: { id: number; round: number }[]
}

/** Numbers, stores and audits one nonconformance with its parts, in the caller's transaction. */
async function insertNc(actor: AuditActor, nc: NewNc, t: Transaction): Promise<NonconformanceRow> {
  const record = await Nonconformance.create(
    {
      number: await nextNcNumber(new Date(), t),
      lotId: nc.lot.id,
      source: nc.source,
      criterion: nc.criterion,
      defectTypeId: nc.defectTypeId,
      description: nc.description,
      openedBy: actor.id,
    },
    { transaction: t },
  )
  await NonconformancePart.bulkCreate(
    nc.parts.map((p) => ({
      nonconformanceId: record.id,
      partId: p.id,
      roundFound: p.round,
      retestRound: null,
    })),
    { transaction: t },
  )
  const row = await ncRow(record.id, t)
  await recordAudit(t, actor, {
    action: 'nonconformance.open',
    entityType: 'nonconformance',
    entityId: record.id,
    lotId: nc.lot.id,
    after: row,
    note: `${row.number} opened ${nc.source === 'auto' ? 'automatically at submission' : 'by hand'} on lot ${nc.lot.lotNumber}`,
  })
  return row
}

/**
 * At submission: one nonconformance per failing criterion per part, unless one that is still
 * open covers that part and criterion, or a closed one stands for it (a concession to use as
 * is, or the part was scrapped) — a lot reopened and submitted again is not filed twice.
 */
export async function openAutoNonconformances(
  actor: AuditActor,
  lot: Lot,
  spec: SpecContent,
  t: Transaction,
): Promise<NonconformanceRow[]> {
  const parts = partsUnderReview(
    spec,
    await Part.findAll({ where: { lotId: lot.id }, order: [['id', 'ASC']], transaction: t }),
  )
  const covered = await sequelize.query<{ part_id: number; criterion: string }>(
    `SELECT np.part_id, n.criterion
       FROM nonconformance_parts np JOIN nonconformances n ON n.id = np.nonconformance_id
      WHERE n.lot_id = $1 AND (n.status <> 'closed' OR n.disposition IN ('use-as-is', 'scrap'))`,
    { bind: [lot.id], type: QueryTypes.SELECT, transaction: t },
  )
  const scrapped = await sequelize.query<{ id: number }>(
    'SELECT id FROM parts WHERE lot_id = $1 AND scrapped_by_nc IS NOT NULL',
    { bind: [lot.id], type: QueryTypes.SELECT, transaction: t },
  )
  const skip = new Set(covered.map((c) => `${c.part_id}:${c.criterion}`))
  const scrappedIds = new Set(scrapped.map((s) => s.id))
  const opened: NonconformanceRow[] = []
  for (const part of parts) {
    if (part.verdictStatus !== 'fail' || !part.verdict || scrappedIds.has(part.id)) continue
    for (const c of part.verdict.criteria) {
      if (c.status !== 'fail' || skip.has(`${part.id}:${c.criterion}`)) continue
      const defectType = await ensureDefectType(defectCodeFor(c.criterion, c.reason), t)
      const heat = part.heatNumber ? ` (heat ${part.heatNumber})` : ''
      opened.push(
        await insertNc(
          actor,
          {
            lot,
            source: 'auto',
            criterion: c.criterion,
            defectTypeId: defectType.id,
            description: `Part ${part.partNumber}${heat}, round ${part.round}: ${c.reason}`,
            parts: [{ id: part.id, round: part.round }],
          },
          t,
        ),
      )
    }
  }
  return opened
}

/**
 * POST /api/nonconformances: opened by hand for what the rules cannot see (damage,
 * contamination, ...), in any lot state — a released lot can be found damaged on the dock.
 */
export async function createManualNc(
  actor: AuditActor,
  body: CreateNcBody,
): Promise<NonconformanceRow> {
  return inTransaction(async (t) => {
    const lot = await Lot.findByPk(body.lotId, { lock: t.LOCK.SHARE, transaction: t })
    if (!lot)
      throw new HttpError(400, 'invalid_reference', `Lot #${body.lotId} does not exist`, [
        { field: 'body.lotId', message: 'No such lot' },
      ])
    const defectType = await DefectType.findByPk(body.defectTypeId, { transaction: t })
    if (!defectType || !defectType.active) {
      const message = defectType
        ? `Defect type "${defectType.label}" is retired: choose an active one`
        : `Defect type #${body.defectTypeId} does not exist`
      throw new HttpError(400, 'invalid_reference', message, [
        { field: 'body.defectTypeId', message },
      ])
    }
    const ids = [...new Set(body.partIds)]
    const parts = await Part.findAll({ where: { id: ids }, transaction: t })
    const foreign = ids.filter((id) => !parts.some((p) => p.id === id && p.lotId === lot.id))
    if (foreign.length) {
      const message = `Part(s) #${foreign.join(', #')} are not parts of lot ${lot.lotNumber}`
      throw new HttpError(400, 'invalid_reference', message, [{ field: 'body.partIds', message }])
    }
    return insertNc(
      actor,
      {
        lot,
        source: 'manual',
        criterion: null,
        defectTypeId: defectType.id,
        description: body.description,
        parts: parts.map((p) => ({ id: p.id, round: p.round })),
      },
      t,
    )
  })
}

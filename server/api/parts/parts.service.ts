import type { Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction } from '../../db'
import { Lot, Part } from '../../db/models'
import { recordAudit, snapshot, type AuditActor } from '../../audit/audit.service'
import { conflict, notFound } from '../../lib/httpError'
import type { PartDetail, partBodySchema, updatePartSchema } from '../../../shared/api/lots'
import type { SpecContent } from '../../../shared/spec/specContent'
import { assertLotOpen } from '../lots/lotGuards'
import { specContentFor } from '../lots/specCache'
import { toPartRow } from '../lots/lots.rows'
import { recomputePartVerdict } from './partVerdict'
import { lockPartForWrite } from './partLock'
import { getPartDetail } from './partDetail'

type PartBody = z.infer<typeof partBodySchema>
type UpdatePartBody = z.infer<typeof updatePartSchema>

/** Creates a part in a lot the caller has checked and locked, with its first (empty) verdict. */
export async function createPartIn(
  lot: { id: number; lotNumber: string },
  spec: SpecContent,
  body: PartBody,
  actor: AuditActor,
  t: Transaction,
): Promise<Part> {
  const part = await Part.create(
    {
      lotId: lot.id,
      partNumber: body.partNumber,
      description: body.description,
      heatNumber: body.heatNumber,
      quantity: body.quantity,
      coatedAreaM2: body.coatedAreaM2,
      sampled: body.sampled,
      clientId: body.clientId,
      verdict: null,
      verdictStatus: null,
      firstPassStatus: null,
      thicknessMeanUm: null,
    },
    { transaction: t },
  )
  const verdict = await recomputePartVerdict(spec, part, t)
  await recordAudit(t, actor, {
    action: 'part.create',
    entityType: 'part',
    entityId: part.id,
    lotId: lot.id,
    after: { ...toPartRow(part), verdict: undefined, verdictStatus: verdict.status },
    note: `Part ${part.partNumber} added to lot ${lot.lotNumber}`,
  })
  return part
}

/** POST /api/lots/:id/parts. A replayed clientId answers the part already stored. */
export async function addPart(
  actor: AuditActor,
  lotId: number,
  body: PartBody,
): Promise<{ part: PartDetail; created: boolean }> {
  return inTransaction(async (t) => {
    const existing = await Part.findOne({ where: { clientId: body.clientId }, transaction: t })
    if (existing) {
      if (existing.lotId !== lotId)
        throw conflict('client_id_reused', 'This clientId already belongs to a part of another lot')
      return { part: await getPartDetail(existing.id, t), created: false }
    }
    const lot = await Lot.findByPk(lotId, { lock: t.LOCK.SHARE, transaction: t })
    if (!lot) throw notFound(`Lot #${lotId}`)
    assertLotOpen(lot, 'before parts are added')
    const spec = await specContentFor(lot.specId, lot.specVersion, t)
    const part = await createPartIn(lot, spec, body, actor, t)
    return { part: await getPartDetail(part.id, t), created: true }
  })
}

const EDITABLE = [
  'partNumber',
  'description',
  'heatNumber',
  'quantity',
  'coatedAreaM2',
  'sampled',
] as const

/** PATCH /api/parts/:id with an optimistic version; a changed coated area re-plans the sampling. */
export async function updatePart(
  actor: AuditActor,
  partId: number,
  body: UpdatePartBody,
): Promise<PartDetail> {
  return inTransaction(async (t) => {
    const locked = await lockPartForWrite(partId, t)
    assertLotOpen(
      { lotNumber: locked.lotNumber, status: locked.lotStatus },
      'before the part is changed',
    )
    const part = (await Part.findByPk(partId, { transaction: t }))!
    if (part.version !== body.version) {
      throw conflict(
        'version_conflict',
        `Part ${part.partNumber} was changed by someone else meanwhile: review the current values and try again`,
        { current: await getPartDetail(partId, t) },
      )
    }
    const before = snapshot(toPartRow(part))
    const changes: Partial<Pick<Part, (typeof EDITABLE)[number]>> = {}
    for (const key of EDITABLE) {
      if (body[key] !== undefined && body[key] !== part[key])
        Object.assign(changes, { [key]: body[key] })
    }
    if (Object.keys(changes).length === 0) return getPartDetail(partId, t)
    await part.update({ ...changes, version: part.version + 1 }, { transaction: t })
    const verdict = await recomputePartVerdict(locked.spec, part, t)
    await recordAudit(t, actor, {
      action: 'part.update',
      entityType: 'part',
      entityId: partId,
      lotId: part.lotId,
      before,
      after: { ...toPartRow(part), verdict: undefined, verdictStatus: verdict.status },
    })
    return getPartDetail(partId, t)
  })
}

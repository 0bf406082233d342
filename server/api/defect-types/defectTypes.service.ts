import type { Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction } from '../../db'
import { DefectType } from '../../db/models'
import { recordAudit, snapshot, type AuditActor } from '../../audit/audit.service'
import { conflict, notFound } from '../../lib/httpError'
import type { defectTypeSchema } from '../../../shared/api/review'
import { DEFAULT_DEFECT_TYPES, type DefaultDefectCode } from './defaultDefectTypes'

type DefectTypeBody = z.infer<typeof defectTypeSchema>

export interface DefectTypeRow {
  id: number
  code: string
  label: string
  active: boolean
}

const toRow = (d: DefectType): DefectTypeRow => ({
  id: d.id,
  code: d.code,
  label: d.label,
  active: d.active,
})

export async function listDefectTypes(): Promise<DefectTypeRow[]> {
  const rows = await DefectType.findAll({ order: [['label', 'ASC']] })
  return rows.map(toRow)
}

async function assertCodeFree(code: string, exceptId: number | null, t: Transaction) {
  const same = await DefectType.findOne({ where: { code }, transaction: t })
  if (same && same.id !== exceptId)
    throw conflict('duplicate_code', `A defect type with code ${code} already exists`)
}

export async function createDefectType(
  actor: AuditActor,
  body: DefectTypeBody,
): Promise<DefectTypeRow> {
  return inTransaction(async (t) => {
    await assertCodeFree(body.code, null, t)
    const d = await DefectType.create(
      { code: body.code, label: body.label, active: body.active },
      { transaction: t },
    )
    await recordAudit(t, actor, {
      action: 'defect-type.create',
      entityType: 'defect-type',
      entityId: d.id,
      after: toRow(d),
    })
    return toRow(d)
  })
}

/** PATCH: label and active may change; a code in use stays (nonconformances and trends refer to it). */
export async function updateDefectType(
  actor: AuditActor,
  id: number,
  body: Partial<DefectTypeBody>,
): Promise<DefectTypeRow> {
  return inTransaction(async (t) => {
    const d = await DefectType.findByPk(id, { lock: t.LOCK.UPDATE, transaction: t })
    if (!d) throw notFound(`Defect type #${id}`)
    if (body.code !== undefined && body.code !== d.code) await assertCodeFree(body.code, id, t)
    const before = snapshot(toRow(d))
    const changes: Partial<DefectTypeBody> = {}
    for (const key of ['code', 'label', 'active'] as const) {
      if (body[key] !== undefined && body[key] !== d[key])
        Object.assign(changes, { [key]: body[key] })
    }
    if (Object.keys(changes).length === 0) return toRow(d)
    await d.update({ ...changes, version: d.version + 1 }, { transaction: t })
    await recordAudit(t, actor, {
      action: 'defect-type.update',
      entityType: 'defect-type',
      entityId: id,
      before,
      after: toRow(d),
    })
    return toRow(d)
  })
}

/**
 * The defect type with one of the default codes, created from the default list when an admin
 * removed it or the database was never seeded: an automatic nonconformance must never fail
 * for want of a list entry.
 */
export async function ensureDefectType(
  code: DefaultDefectCode,
  t: Transaction,
): Promise<DefectType> {
  const found = await DefectType.findOne({ where: { code }, transaction: t })
  if (found) return found
  const entry = DEFAULT_DEFECT_TYPES.find((d) => d.code === code)!
  const [d] = await DefectType.findOrCreate({
    where: { code },
    defaults: { code, label: entry.label },
    transaction: t,
  })
  await recordAudit(t, null, {
    action: 'defect-type.create',
    entityType: 'defect-type',
    entityId: d.id,
    after: toRow(d),
    note: 'Added from the default list for an automatic nonconformance',
  })
  return d
}

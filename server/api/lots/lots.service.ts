import { QueryTypes, type Transaction } from 'sequelize'
import type { z } from 'zod'
import { inTransaction, sequelize } from '../../db'
import { CoatingSpec, Customer, Lot, Part } from '../../db/models'
import { recordAudit, snapshot, type AuditActor } from '../../audit/audit.service'
import { HttpError, conflict, notFound } from '../../lib/httpError'
import type {
  LotDetail,
  LotRow,
  createLotSchema,
  lotListQuerySchema,
  updateLotSchema,
} from '../../../shared/api/lots'
import { evaluateLot } from '../../../shared/rules/evaluateLot'
import type { PartVerdict } from '../../../shared/rules/evaluatePart'
import type { SpecContent } from '../../../shared/spec/specContent'
import { lockSpecVersion } from '../specs/specs.service'
import { createPartIn } from '../parts/parts.service'
import { assertBatchInDate, assertLotOpen } from './lotGuards'
import { nextLotNumber } from './lotNumber'
import { specContentFor } from './specCache'
import { LOT_ROW_SELECT, findLotSqlRow, photoRowsOfLot, toLotRow, toPartRow } from './lots.rows'

type CreateLotBody = z.infer<typeof createLotSchema>
type UpdateLotBody = z.infer<typeof updateLotSchema>
type LotListQuery = z.infer<typeof lotListQuerySchema>

function badReference(field: string, message: string) {
  return new HttpError(400, 'invalid_reference', message, [{ field, message }])
}

/** The lot's verdict from its parts' stored verdicts, sampled per the spec. */
export function lotVerdictOf(spec: SpecContent, parts: Part[]): LotDetail['lotVerdict'] {
  const counted = spec.sampling.mode === 'sample' ? parts.filter((p) => p.sampled) : parts
  const verdicts = counted.map((p) => p.verdict).filter((v): v is PartVerdict => v !== null)
  // Every part row is judged on its own (a row of identical pieces has one record).
  const lotSize = spec.sampling.mode === 'every-part' && parts.length > 0 ? parts.length : undefined
  const v = evaluateLot(verdicts, { sampling: spec.sampling, lotSize })
  return { status: v.status, reason: v.reason }
}

export async function getLotDetail(id: number, t?: Transaction): Promise<LotDetail> {
  const row = await findLotSqlRow(id, t)
  if (!row) throw notFound(`Lot #${id}`)
  const [spec, parts, photos] = await Promise.all([
    specContentFor(row.spec_id, row.spec_version, t),
    Part.findAll({ where: { lotId: id }, order: [['id', 'ASC']], transaction: t }),
    photoRowsOfLot(id, t),
  ])
  return {
    ...toLotRow(row),
    notes: row.notes,
    spec,
    parts: parts.map(toPartRow),
    lotVerdict: lotVerdictOf(spec, parts),
    photos,
  }
}

/** POST /api/lots. The lot is numbered, keeps the spec's current version (locked), and may bring parts. */
export async function openLot(
  actor: AuditActor,
  body: CreateLotBody,
): Promise<{ lot: LotDetail; created: boolean }> {
  return inTransaction(async (t) => {
    const replay = await Lot.findOne({ where: { clientId: body.clientId }, transaction: t })
    if (replay) return { lot: await getLotDetail(replay.id, t), created: false }
    const customer = await Customer.findByPk(body.customerId, { transaction: t })
    if (!customer)
      throw badReference('body.customerId', `Customer #${body.customerId} does not exist`)
    if (!customer.active)
      throw badReference('body.customerId', `Customer ${customer.name} is no longer active`)
    const spec = await CoatingSpec.findByPk(body.specId, { transaction: t })
    if (!spec) throw badReference('body.specId', `Coating spec #${body.specId} does not exist`)
    if (!spec.active)
      throw badReference(
        'body.specId',
        `Coating spec ${spec.code} is retired: choose an active spec`,
      )
    if (spec.customerId !== null && spec.customerId !== customer.id) {
      throw badReference(
        'body.specId',
        `Coating spec ${spec.code} is another customer's own spec, not ${customer.name}'s`,
      )
    }
    assertBatchInDate(body.line, body.batchNumber, body.batchExpiresOn)
    const version = await lockSpecVersion(spec.id, spec.currentVersion, t, actor)
    const content = await specContentFor(spec.id, version.version, t)
    const lot = await Lot.create(
      {
        lotNumber: await nextLotNumber(body.line, new Date(), t),
        customerId: customer.id,
        orderRef: body.orderRef,
        specId: spec.id,
        specVersion: version.version,
        line: body.line,
        shift: body.shift,
        coatingMaterial: body.coatingMaterial,
        batchNumber: body.batchNumber,
        batchExpiresOn: body.batchExpiresOn,
        notes: body.notes,
        openedBy: actor.id,
        clientId: body.clientId,
      },
      { transaction: t },
    )
    await recordAudit(t, actor, {
      action: 'lot.open',
      entityType: 'lot',
      entityId: lot.id,
      lotId: lot.id,
      after: lot,
    })
    for (const p of body.parts) await createPartIn(lot, content, p, actor, t)
    return { lot: await getLotDetail(lot.id, t), created: true }
  })
}

const EDITABLE = [
  'orderRef',
  'shift',
  'coatingMaterial',
  'batchNumber',
  'batchExpiresOn',
  'notes',
] as const

/** PATCH /api/lots/:id: header fields while the lot is open, with an optimistic version. */
export async function updateLot(
  actor: AuditActor,
  id: number,
  body: UpdateLotBody,
): Promise<LotDetail> {
  return inTransaction(async (t) => {
    const lot = await Lot.findByPk(id, { lock: t.LOCK.UPDATE, transaction: t })
    if (!lot) throw notFound(`Lot #${id}`)
    if (lot.version !== body.version) {
      throw conflict(
        'version_conflict',
        `Lot ${lot.lotNumber} was changed by someone else meanwhile: review the current values and try again`,
        {
          current: await getLotDetail(id, t),
        },
      )
    }
    assertLotOpen(lot, 'before its header is changed')
    const changes: Partial<Pick<Lot, (typeof EDITABLE)[number]>> = {}
    for (const key of EDITABLE) {
      if (body[key] !== undefined && body[key] !== lot[key])
        Object.assign(changes, { [key]: body[key] })
    }
    if (Object.keys(changes).length === 0) return getLotDetail(id, t)
    if (changes.batchNumber !== undefined || changes.batchExpiresOn !== undefined) {
      assertBatchInDate(
        lot.line,
        changes.batchNumber ?? lot.batchNumber,
        changes.batchExpiresOn ?? lot.batchExpiresOn,
      )
    }
    const before = snapshot(lot)
    await lot.update({ ...changes, version: lot.version + 1 }, { transaction: t })
    await recordAudit(t, actor, {
      action: 'lot.update',
      entityType: 'lot',
      entityId: id,
      lotId: id,
      before,
      after: lot,
    })
    return getLotDetail(id, t)
  })
}

/** Escapes LIKE wildcards so a search for "F26_1" means those characters. */
function likePattern(q: string) {
  return `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`
}

/** GET /api/lots: newest first; q matches lot number, order ref, or any part's part or heat number. */
export async function listLots(query: LotListQuery): Promise<{ rows: LotRow[]; total: number }> {
  const where: string[] = []
  const bind: unknown[] = []
  const add = (sql: (n: string) => string, value: unknown) => {
    bind.push(value)
    where.push(sql(`$${bind.length}`))
  }
  if (query.status) add((n) => `l.status = ${n}`, query.status)
  if (query.line) add((n) => `l.line = ${n}`, query.line)
  if (query.customerId) add((n) => `l.customer_id = ${n}`, query.customerId)
  if (query.from) add((n) => `l.created_at >= ${n}::date`, query.from)
  if (query.to) add((n) => `l.created_at < ${n}::date + 1`, query.to)
  if (query.q) {
    add(
      (n) => `(l.lot_number ILIKE ${n} OR l.order_ref ILIKE ${n} OR EXISTS (
        SELECT 1 FROM parts sp WHERE sp.lot_id = l.id AND (sp.part_number ILIKE ${n} OR sp.heat_number ILIKE ${n})))`,
      likePattern(query.q),
    )
  }
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : ''
  const [rows, [count]] = await Promise.all([
    sequelize.query<Parameters<typeof toLotRow>[0]>(
      `${LOT_ROW_SELECT} ${whereSql} ORDER BY l.created_at DESC, l.id DESC LIMIT ${query.limit} OFFSET ${query.offset}`,
      { bind, type: QueryTypes.SELECT },
    ),
    sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM lots l ${whereSql}`, {
      bind,
      type: QueryTypes.SELECT,
    }),
  ])
  return { rows: rows.map(toLotRow), total: count!.n }
}

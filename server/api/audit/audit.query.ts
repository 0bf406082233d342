import { QueryTypes } from 'sequelize'
import { z } from 'zod'
import { isoDateSchema } from '../../../shared/api/isoDate'
import { sequelize } from '../../db'
import { Lot } from '../../db/models'
import { notFound } from '../../lib/httpError'
import type { AuditEventRow } from '../../../shared/api/review'

/** An audit event with the actor's name, so a lot's history reads as a story. */
export type AuditEntry = AuditEventRow & { actorName: string | null }

const isoDate = isoDateSchema

export const auditQuerySchema = z.object({
  actorId: z.coerce.number().int().positive().max(2147483647).optional(),
  entityType: z.string().trim().min(1).max(40).optional(),
  entityId: z.string().trim().min(1).max(40).optional(),
  lotNumber: z.string().trim().min(1).max(40).optional(),
  /** Calendar days, both included (the server's local day). */
  from: isoDate.optional(),
  to: isoDate.optional(),
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
})
export type AuditQuery = z.infer<typeof auditQuerySchema>

const SELECT = `
  SELECT a.id, a.at, a.actor_id, a.actor_email, u.name AS actor_name, a.action, a.entity_type,
         a.entity_id, a.lot_id, a.before, a.after, a.note
    FROM audit_events a LEFT JOIN users u ON u.id = a.actor_id`

interface AuditSqlRow {
  id: string
  at: Date
  actor_id: number | null
  actor_email: string | null
  actor_name: string | null
  action: string
  entity_type: string
  entity_id: string
  lot_id: number | null
  before: unknown
  after: unknown
  note: string
}

function toEntry(r: AuditSqlRow): AuditEntry {
  return {
    id: String(r.id),
    at: new Date(r.at).toISOString(),
    actorId: r.actor_id,
    actorEmail: r.actor_email,
    actorName: r.actor_name,
    action: r.action,
    entityType: r.entity_type,
    entityId: r.entity_id,
    lotId: r.lot_id,
    before: r.before,
    after: r.after,
    note: r.note,
  }
}

/** GET /api/lots/:id/history: everything that happened to the lot and its records, oldest first. */
export async function lotHistory(lotId: number): Promise<AuditEntry[]> {
  if (!(await Lot.findByPk(lotId, { attributes: ['id'] }))) throw notFound(`Lot #${lotId}`)
  const rows = await sequelize.query<AuditSqlRow>(
    `${SELECT} WHERE a.lot_id = $1 OR (a.entity_type = 'lot' AND a.entity_id = $1::text) ORDER BY a.at, a.id`,
    { bind: [lotId], type: QueryTypes.SELECT },
  )
  return rows.map(toEntry)
}

/**
 * GET /api/audit (admin): by person, by record (entity type and id, or a lot number: the lot
 * and everything recorded under it) and by period; newest first, paginated.
 */
export async function searchAudit(q: AuditQuery): Promise<{ rows: AuditEntry[]; total: number }> {
  const where: string[] = []
  const bind: unknown[] = []
  const add = (sql: (n: string) => string, value: unknown) =>
    where.push(sql(`$${bind.push(value)}`))
  if (q.actorId) add((n) => `a.actor_id = ${n}`, q.actorId)
  if (q.entityType) add((n) => `a.entity_type = ${n}`, q.entityType)
  if (q.entityId) add((n) => `a.entity_id = ${n}`, q.entityId)
  if (q.lotNumber) {
    add(
      (n) => `(a.lot_id = (SELECT id FROM lots WHERE lot_number = upper(${n}))
        OR (a.entity_type = 'lot' AND a.entity_id = (SELECT id::text FROM lots WHERE lot_number = upper(${n}))))`,
      q.lotNumber,
    )
  }
  if (q.from) add((n) => `a.at >= ${n}::date`, q.from)
  if (q.to) add((n) => `a.at < ${n}::date + 1`, q.to)
  const whereSql = where.length ? `WHERE ${where.join(' AND ')}` : ''
  const [rows, [count]] = await Promise.all([
    sequelize.query<AuditSqlRow>(
      `${SELECT} ${whereSql} ORDER BY a.at DESC, a.id DESC LIMIT ${q.limit} OFFSET ${q.offset}`,
      {
        bind,
        type: QueryTypes.SELECT,
      },
    ),
    sequelize.query<{ n: number }>(`SELECT count(*)::int AS n FROM audit_events a ${whereSql}`, {
      bind,
      type: QueryTypes.SELECT,
    }),
  ])
  return { rows: rows.map(toEntry), total: count!.n }
}

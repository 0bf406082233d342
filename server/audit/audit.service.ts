import type { Transaction } from 'sequelize'
import { AuditEvent } from '../db/models'

export interface AuditActor {
  id: number
  email: string
}

export interface AuditEntry {
  action: string
  entityType: string
  entityId: string | number
  lotId?: number | null
  before?: unknown
  after?: unknown
  note?: string
}

/** Plain JSON of a model or object, without secrets, for the before/after columns. */
export function snapshot(record: unknown): unknown {
  if (record === null || record === undefined) return null
  const plain =
    typeof (record as { get?: unknown }).get === 'function'
      ? (record as { get: (o: { plain: true }) => unknown }).get({ plain: true })
      : record
  const copy = JSON.parse(JSON.stringify(plain)) as Record<string, unknown>
  delete copy.passwordHash
  return copy
}

/**
 * Appends one audit event inside the caller's transaction, so the change and its record
 * land together or not at all. The table refuses UPDATE/DELETE at the database level.
 */
export async function recordAudit(t: Transaction, actor: AuditActor | null, entry: AuditEntry) {
  await AuditEvent.create(
    {
      actorId: actor?.id ?? null,
      actorEmail: actor?.email ?? null,
      action: entry.action,
      entityType: entry.entityType,
      entityId: String(entry.entityId),
      lotId: entry.lotId ?? null,
      before: entry.before === undefined ? null : snapshot(entry.before),
      after: entry.after === undefined ? null : snapshot(entry.after),
      note: entry.note ?? '',
    },
    { transaction: t },
  )
}

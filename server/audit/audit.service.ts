import type { Transaction } from 'sequelize'
import { preparedQuery } from '../db/prepared'

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
  // Plain SQL rather than AuditEvent.create: every write of the product lands here, and building
  // and validating a model instance cost more than the INSERT itself; prepared once per
  // connection. Same columns, same values (`at` is this server's clock, as the model's default was).
  const json = (v: unknown) => {
    if (v === undefined || v === null) return null // SQL NULL, not JSON null, for "none"
    const plain =
      typeof (v as { get?: unknown }).get === 'function'
        ? (v as { get: (o: { plain: true }) => unknown }).get({ plain: true })
        : v
    return JSON.stringify(plain, withoutSecrets) // what snapshot() keeps, in one pass
  }
  await preparedQuery(t, 'audit_event_insert', INSERT_AUDIT_EVENT, [
    new Date(),
    actor?.id ?? null,
    actor?.email ?? null,
    entry.action,
    entry.entityType,
    String(entry.entityId),
    entry.lotId ?? null,
    json(entry.before),
    json(entry.after),
    entry.note ?? '',
  ])
}

/** JSON.stringify replacer: a password hash never reaches the audit trail, at any depth. */
function withoutSecrets(key: string, value: unknown) {
  return key === 'passwordHash' ? undefined : value
}

const INSERT_AUDIT_EVENT = `
  INSERT INTO audit_events (at, actor_id, actor_email, action, entity_type, entity_id, lot_id, before, after, note)
  VALUES ($1, $2, $3, $4, $5, $6, $7, $8::jsonb, $9::jsonb, $10)`

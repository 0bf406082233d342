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

/**
 * Plain JSON of a model or object as it is now (a copy: later changes do not reach it), without
 * secrets, for the before/after columns.
 */
export function snapshot(record: unknown): unknown {
  if (record === null || record === undefined) return null
  return JSON.parse(JSON.stringify(plainOf(record), withoutSecrets)) as unknown
}

/**
 * Appends one audit event inside the caller's transaction, so the change and its record
 * land together or not at all. The table refuses UPDATE/DELETE at the database level.
 */
export function recordAudit(t: Transaction, actor: AuditActor | null, entry: AuditEntry) {
  return recordAudits(t, [{ actor, entry }])
}

/**
 * Several audit events in one statement (readings POSTs stored together), in the order given.
 * Plain SQL rather than AuditEvent.create: every write of the product lands here, and building
 * and validating a model instance cost more than the INSERT itself; prepared once per
 * connection. Same columns, same values (`at` is this server's clock, as the model's default was).
 */
export async function recordAudits(
  t: Transaction,
  events: { actor: AuditActor | null; entry: AuditEntry }[],
): Promise<void> {
  // One JSON document for the whole statement: pg escapes no array literals, and PostgreSQL
  // parses each before/after once, as jsonb. A missing or null before/after is SQL NULL ("none").
  const at = new Date().toISOString()
  const rows = events.map((e) => ({
    at,
    actor_id: e.actor?.id ?? null,
    actor_email: e.actor?.email ?? null,
    action: e.entry.action,
    entity_type: e.entry.entityType,
    entity_id: String(e.entry.entityId),
    lot_id: e.entry.lotId ?? null,
    before: e.entry.before == null ? null : plainOf(e.entry.before),
    after: e.entry.after == null ? null : plainOf(e.entry.after),
    note: e.entry.note ?? '',
  }))
  // the replacer keeps what snapshot() keeps, in one pass
  await preparedQuery(t, 'audit_events_insert', INSERT_AUDIT_EVENTS, [
    JSON.stringify(rows, withoutSecrets),
  ])
}

/** A model's plain values, or the value itself. */
function plainOf(record: unknown): unknown {
  return typeof (record as { get?: unknown }).get === 'function'
    ? (record as { get: (o: { plain: true }) => unknown }).get({ plain: true })
    : record
}

/** JSON.stringify replacer: a password hash never reaches the audit trail, at any depth. */
function withoutSecrets(key: string, value: unknown) {
  return key === 'passwordHash' ? undefined : value
}

/** WITH ORDINALITY … ORDER BY: the events get their ids in the order given. */
const INSERT_AUDIT_EVENTS = `
  INSERT INTO audit_events (at, actor_id, actor_email, action, entity_type, entity_id, lot_id, before, after, note)
  SELECT e.at, e.actor_id, e.actor_email, e.action, e.entity_type, e.entity_id, e.lot_id,
         e.before, e.after, e.note
    FROM ROWS FROM (jsonb_to_recordset($1::jsonb)
           AS (at timestamptz, actor_id int, actor_email text, action text, entity_type text,
               entity_id text, lot_id int, before jsonb, after jsonb, note text)) WITH ORDINALITY
      AS e(at, actor_id, actor_email, action, entity_type, entity_id, lot_id, before, after, note, n)
   ORDER BY e.n`

import type { Transaction } from 'sequelize'
import { recordAudit } from '../../audit/audit.service'

/**
 * One step of the demo seed. Every step must be safe to run again: it looks its rows up by their
 * natural key (e-mail, code, serial) and creates only what is missing, so a second run neither
 * duplicates anything nor undoes what people changed since. A step marked `once` (history that
 * has no natural key, e.g. months of lots) runs only on a database that has not had it yet.
 */
export interface Seeder {
  name: string
  once?: boolean
  run(ctx: SeedContext): Promise<void>
}

export interface SeedContext {
  t: Transaction
  /** The seed's "today" (YYYY-MM-DD): demo dates such as calibration due dates count from it. */
  today: string
  /** Counts per step, for the summary the CLI prints. */
  tally: Record<string, { created: number; kept: number }>
}

export function count(ctx: SeedContext, what: string, created: boolean) {
  const entry = (ctx.tally[what] ??= { created: 0, kept: 0 })
  if (created) entry.created += 1
  else entry.kept += 1
}

/** Seeded rows get an audit event too (actor: none, note: demo seed), so the trail has no gaps. */
export function auditSeed(
  ctx: SeedContext,
  entityType: string,
  entityId: number | string,
  after: unknown,
) {
  return recordAudit(ctx.t, null, {
    action: `${entityType}.create`,
    entityType,
    entityId,
    after,
    note: 'Demo seed',
  })
}

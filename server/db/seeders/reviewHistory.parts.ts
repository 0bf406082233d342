import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../index'
import type { User } from '../models'
import type { SpecContent } from '../../../shared/spec/specContent'
import type { CriterionResult } from '../../../shared/rules/verdict'
import type { PartVerdict } from '../../../shared/rules/evaluatePart'
import type { ReadingRowInput, SectionRowInput } from '../../../shared/inspection/assemblePartInput'
import { verdictFromRows } from '../../api/parts/partVerdict'
import { ncNumberPrefix } from '../../api/nonconformances/ncNumber'

/** Pieces of the review-history seed: bulk inserts, dated audit events, NC numbers, round-1 failures. */

export const HOUR = 3600_000

export interface SeededLot {
  id: number
  lot_number: string
  status: 'awaiting-review' | 'released'
  opened_by: number
  spec_id: number
  spec_version: number
  round1_done: Date
  last_done: Date
}

export interface SeededPart {
  id: number
  lot_id: number
  part_number: string
  heat_number: string
  coated_area_m2: number | null
  round: number
  verdict: PartVerdict
}

export const later = (at: Date, hours: number) => new Date(new Date(at).getTime() + hours * HOUR)

/** Multi-row INSERTs in chunks under PostgreSQL's bind-parameter limit. */
export async function insertRows<R extends object = object>(
  t: Transaction,
  table: string,
  columns: string[],
  rows: unknown[][],
  returning = '',
): Promise<R[]> {
  const out: R[] = []
  const per = Math.floor(30000 / columns.length)
  for (let i = 0; i < rows.length; i += per) {
    const bind: unknown[] = []
    const values = rows
      .slice(i, i + per)
      .map((r) => `(${r.map((v) => `$${bind.push(v)}`).join(',')})`)
      .join(',')
    const sql = `INSERT INTO ${table} (${columns.join(',')}) VALUES ${values}${returning ? ` RETURNING ${returning}` : ''}`
    const res = await sequelize.query(sql, {
      bind,
      transaction: t,
      type: returning ? QueryTypes.SELECT : QueryTypes.INSERT,
    })
    if (returning) out.push(...(res as unknown as R[]))
  }
  return out
}

/** Audit events dated when the seeded review would have happened (recordAudit dates them today). */
export class AuditRows {
  readonly rows: unknown[][] = []
  add(
    at: Date,
    actor: User | null,
    e: {
      action: string
      entityType: string
      entityId: number
      lotId: number
      before?: unknown
      after?: unknown
      note: string
    },
  ) {
    const json = (v: unknown) => (v === undefined ? null : JSON.stringify(v))
    this.rows.push([
      at,
      actor?.id ?? null,
      actor?.email ?? null,
      e.action,
      e.entityType,
      String(e.entityId),
      e.lotId,
      json(e.before),
      json(e.after),
      `${e.note} (demo seed)`,
    ])
  }
  save(t: Transaction) {
    const columns = [
      'at',
      'actor_id',
      'actor_email',
      'action',
      'entity_type',
      'entity_id',
      'lot_id',
      'before',
      'after',
      'note',
    ]
    // In time order, so the ids of the seeded events follow their dates as live ones do.
    const rows = [...this.rows].sort((a, b) => (a[0] as Date).getTime() - (b[0] as Date).getTime())
    return insertRows(t, 'audit_events', columns, rows)
  }
}

/** NC numbers of the weeks the seeded reviews fall in, continuing any counter already there. */
export class NcNumbers {
  private constructor(private readonly last: Map<string, number>) {}
  static async load(t: Transaction) {
    const rows = await sequelize.query<{ prefix: string; last_seq: number }>(
      'SELECT prefix, last_seq FROM nc_number_counters',
      {
        type: QueryTypes.SELECT,
        transaction: t,
      },
    )
    return new NcNumbers(new Map(rows.map((r) => [r.prefix, r.last_seq])))
  }
  next(at: Date): string {
    const prefix = ncNumberPrefix(at)
    const seq = (this.last.get(prefix) ?? 0) + 1
    this.last.set(prefix, seq)
    return `${prefix}-${String(seq).padStart(3, '0')}`
  }
  async save(t: Transaction) {
    const rows = [...this.last].map(([prefix, seq]) => [prefix, seq])
    if (rows.length === 0) return
    const bind: unknown[] = []
    const values = rows.map((r) => `(${r.map((v) => `$${bind.push(v)}`).join(',')})`).join(',')
    await sequelize.query(
      `INSERT INTO nc_number_counters (prefix, last_seq) VALUES ${values}
       ON CONFLICT (prefix) DO UPDATE SET last_seq = greatest(nc_number_counters.last_seq, excluded.last_seq)`,
      { bind, transaction: t },
    )
  }
}

export interface RepairedPart {
  id: number
  part_number: string
  heat_number: string
  coated_area_m2: number | null
}

/** Which criteria each repaired part failed in round 1, judged from its stored round-1 rows. */
export async function firstRoundFailures(
  specOf: (partId: number) => SpecContent,
  parts: RepairedPart[],
  t: Transaction,
): Promise<Map<number, CriterionResult[]>> {
  const out = new Map<number, CriterionResult[]>()
  if (parts.length === 0) return out
  const rows = await sequelize.query<{
    id: number
    sections: SectionRowInput[] | null
    readings: ReadingRowInput[] | null
  }>(
    `SELECT p.id,
            (SELECT json_agg(json_build_object('section', section, 'round', round, 'data', data) ORDER BY id)
               FROM section_records WHERE part_id = p.id AND round = 1) AS sections,
            (SELECT json_agg(json_build_object('round', round, 'areaNo', area_no, 'spotNo', spot_no,
                      'thicknessUm', thickness_um, 'discarded', false, 'suspect', suspect) ORDER BY area_no, spot_no, id)
               FROM gauge_readings WHERE part_id = p.id AND round = 1 AND discarded_at IS NULL) AS readings
       FROM parts p WHERE p.id = ANY($1::int[])`,
    { bind: [parts.map((p) => p.id)], type: QueryTypes.SELECT, transaction: t },
  )
  const byId = new Map(parts.map((p) => [p.id, p]))
  for (const r of rows) {
    const p = byId.get(r.id)!
    const part = {
      id: p.id,
      round: 1,
      partNumber: p.part_number,
      heatNumber: p.heat_number,
      coatedAreaM2: p.coated_area_m2,
    }
    const { verdict } = verdictFromRows(specOf(p.id), part, r.sections ?? [], r.readings ?? [])
    out.set(
      p.id,
      verdict.criteria.filter((c) => c.status === 'fail'),
    )
  }
  return out
}

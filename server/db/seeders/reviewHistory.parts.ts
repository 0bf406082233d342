import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../index'
import { AuditEvent, type User } from '../models'
import type { SpecContent } from '../../../shared/spec/specContent'
import type { CriterionResult } from '../../../shared/rules/verdict'
import type { PartVerdict } from '../../../shared/rules/evaluatePart'
import type { ReadingRowInput, SectionRowInput } from '../../../shared/inspection/assemblePartInput'
import { verdictFromRows } from '../../api/parts/partVerdict'

/** Pieces of the review-history seed: dated audit events and decisions, round-1 failures. */

export const HOUR = 3600_000

export interface SeededLot {
  id: number
  lot_number: string
  status: string
  opened_by: number
  spec_id: number
  spec_version: number
  round1_done: Date
  last_done: Date
}

export interface SeededPart {
  id: number
  part_number: string
  heat_number: string
  coated_area_m2: number | null
  round: number
  verdict: PartVerdict
}

/** A dated audit event of the seeded review (recordAudit would date it today). */
export function seedEvent(
  t: Transaction,
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
  return AuditEvent.create(
    {
      at,
      actorId: actor?.id ?? null,
      actorEmail: actor?.email ?? null,
      before: e.before ?? null,
      after: e.after ?? null,
      ...e,
      entityId: String(e.entityId),
      note: `${e.note} (demo seed)`,
    },
    { transaction: t },
  )
}

/** The round-1 verdict of a repaired part, from its stored round-1 rows: which criteria failed first. */
export async function firstRoundFailures(
  spec: SpecContent,
  p: SeededPart,
  t: Transaction,
): Promise<CriterionResult[]> {
  const [rows] = await sequelize.query<{
    sections: SectionRowInput[] | null
    readings: ReadingRowInput[] | null
  }>(
    `SELECT (SELECT json_agg(json_build_object('section', section, 'round', round, 'data', data) ORDER BY id)
               FROM section_records WHERE part_id = $1 AND round = 1) AS sections,
            (SELECT json_agg(json_build_object('round', round, 'areaNo', area_no, 'spotNo', spot_no, 'thicknessUm', thickness_um,
                      'discarded', false, 'suspect', suspect) ORDER BY area_no, spot_no, id)
               FROM gauge_readings WHERE part_id = $1 AND round = 1 AND discarded_at IS NULL) AS readings`,
    { bind: [p.id], type: QueryTypes.SELECT, transaction: t },
  )
  const part = {
    id: p.id,
    round: 1,
    partNumber: p.part_number,
    heatNumber: p.heat_number,
    coatedAreaM2: p.coated_area_m2,
  }
  const { verdict } = verdictFromRows(spec, part, rows?.sections ?? [], rows?.readings ?? [])
  return verdict.criteria.filter((c) => c.status === 'fail')
}

export async function seedDecision(
  t: Transaction,
  lot: SeededLot,
  by: User,
  decision: 'hold' | 'release',
  reason: string,
  from: string,
  to: string,
  lotVersion: number,
  at: Date,
) {
  await sequelize.query(
    `INSERT INTO lot_decisions (lot_id, decision, reason, from_status, to_status, lot_version, decided_by, decided_at)
     VALUES ($1, $2, $3, $4, $5, $6, $7, $8)`,
    { bind: [lot.id, decision, reason, from, to, lotVersion, by.id, at], transaction: t },
  )
  await seedEvent(t, at, by, {
    action: `lot.${decision}`,
    entityType: 'lot',
    entityId: lot.id,
    lotId: lot.id,
    before: { status: from },
    after: { status: to, reason },
    note: `Lot ${lot.lot_number} ${to}`,
  })
}

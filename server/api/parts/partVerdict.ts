import type { Transaction } from 'sequelize'
import { preparedQuery } from '../../db/prepared'
import { evaluatePart, type PartVerdict } from '../../../shared/rules/evaluatePart'
import type { SpecContent } from '../../../shared/spec/specContent'
import type { SectionName } from '../../../shared/api/lots'
import {
  assemblePartInput,
  partInfoFor,
  thicknessMeanUm,
  type ReadingRowInput,
  type SectionRowInput,
} from '../../../shared/inspection/assemblePartInput'

export interface PartForVerdict {
  id: number
  round: number
  partNumber: string
  heatNumber: string
  coatedAreaM2: number | null
}

/**
 * The part's current sections and live readings, in one round trip. The query is sent at once
 * (the connection pipelines): a caller may start it right behind the write whose rows it must
 * see, in the same transaction, and await both together.
 */
export async function loadVerdictRows(partId: number, round: number, t: Transaction) {
  const [row] = await preparedQuery<{
    sections: SectionRowInput[] | null
    carried: SectionName[] | null
    readings: ReadingRowInput[] | null
  }>(
    t,
    'part_verdict_rows',
    `SELECT
       (SELECT json_agg(json_build_object('section', s.section, 'round', s.round, 'data', s.data) ORDER BY s.id)
          FROM (SELECT DISTINCT ON (section) id, section, round, data FROM section_records
                 WHERE part_id = $1 AND (round = $2 OR (round < $2 AND section = ANY(
                   COALESCE((SELECT carried_sections FROM parts WHERE id = $1), '{}'))))
                 ORDER BY section, round DESC, id DESC) s) AS sections,
       (SELECT carried_sections FROM parts WHERE id = $1) AS carried,
       (SELECT json_agg(json_build_object('round', r.round, 'areaNo', r.area_no, 'spotNo', r.spot_no,
                 'thicknessUm', r.thickness_um, 'discarded', false, 'suspect', r.suspect,
                 'instrumentKind', i.kind) ORDER BY r.area_no, r.spot_no, r.id)
          FROM gauge_readings r JOIN instruments i ON i.id = r.instrument_id
         WHERE r.part_id = $1 AND r.round = $2 AND r.discarded_at IS NULL) AS readings`,
    [partId, round],
  )
  return {
    sections: row?.sections ?? [],
    carried: row?.carried ?? [],
    readings: row?.readings ?? [],
  }
}

/** The verdict of a part from rows (no database): what the seed and the server both use. */
export function verdictFromRows(
  spec: SpecContent,
  part: PartForVerdict,
  sections: readonly SectionRowInput[],
  readings: readonly ReadingRowInput[],
  carriedSections: readonly SectionName[] = [],
): { verdict: PartVerdict; thicknessMeanUm: number | null } {
  const input = assemblePartInput(
    spec.thickness.rule,
    part.round,
    sections,
    readings,
    carriedSections,
  )
  return {
    verdict: evaluatePart(spec, partInfoFor(part), input),
    thicknessMeanUm: thicknessMeanUm(input),
  }
}

/**
 * After every write to a part, inside the same transaction (the caller holds the part's row
 * lock): recompute the verdict from what is stored and store it, with the round-1 status kept
 * for first-pass yield and the mean thickness for trends.
 */
export async function recomputePartVerdict(
  spec: SpecContent,
  part: PartForVerdict,
  t: Transaction,
): Promise<PartVerdict> {
  const rows = await loadVerdictRows(part.id, part.round, t)
  const judged = verdictFromStoredRows(spec, part, rows)
  await storeVerdict(part.id, judged, t)
  return judged.verdict
}

export function verdictFromStoredRows(
  spec: SpecContent,
  part: PartForVerdict,
  rows: Awaited<ReturnType<typeof loadVerdictRows>>,
) {
  return verdictFromRows(spec, part, rows.sections, rows.readings, rows.carried)
}

/** Stores a recomputed verdict (sent at once: it may be awaited together with the audit event). */
export async function storeVerdict(
  partId: number,
  judged: ReturnType<typeof verdictFromRows>,
  t: Transaction,
): Promise<void> {
  await preparedQuery(
    t,
    'part_verdict_store',
    `UPDATE parts SET verdict = $2, verdict_status = $3, thickness_mean_um = $4,
       first_pass_status = CASE WHEN round = 1 THEN $3 ELSE first_pass_status END, updated_at = now()
     WHERE id = $1`,
    [partId, JSON.stringify(judged.verdict), judged.verdict.status, judged.thicknessMeanUm],
  )
}

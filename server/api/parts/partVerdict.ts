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

export interface VerdictRows {
  sections: SectionRowInput[]
  carried: SectionName[]
  readings: ReadingRowInput[]
}

/**
 * The part's current sections and live readings, in one round trip. The query is sent at once
 * (the connection pipelines): a caller may start it right behind the write whose rows it must
 * see, in the same transaction, and await both together.
 */
export async function loadVerdictRows(
  partId: number,
  round: number,
  t: Transaction,
): Promise<VerdictRows> {
  return (await loadVerdictRowsOf([{ id: partId, round }], t)).get(partId)!
}

/** A live reading as the verdict query sends it: [area_no, spot_no, thickness_um, suspect, kind]. */
type CompactReading = [number, number, number, boolean, ReadingRowInput['instrumentKind']]

/**
 * The same for several parts in one statement (readings POSTs stored together). Each reading
 * comes as a JSON array, not an object: PostgreSQL builds arrays about twice as fast as objects
 * with keys (this query is run for every readings POST and grows with the part's readings), and
 * the text to parse is shorter. The objects the rules take are built here.
 */
export async function loadVerdictRowsOf(
  parts: { id: number; round: number }[],
  t: Transaction,
): Promise<Map<number, VerdictRows>> {
  const rows = await preparedQuery<{
    part_id: number
    round: number
    sections: SectionRowInput[] | null
    carried: SectionName[] | null
    readings: CompactReading[] | null
  }>(
    t,
    'parts_verdict_rows',
    `SELECT x.part_id, x.round,
       (SELECT json_agg(json_build_object('section', s.section, 'round', s.round, 'data', s.data) ORDER BY s.id)
          FROM (SELECT DISTINCT ON (section) id, section, round, data FROM section_records
                 WHERE part_id = x.part_id AND (round = x.round OR (round < x.round AND section = ANY(
                   COALESCE((SELECT carried_sections FROM parts WHERE id = x.part_id), '{}'))))
                 ORDER BY section, round DESC, id DESC) s) AS sections,
       (SELECT carried_sections FROM parts WHERE id = x.part_id) AS carried,
       (SELECT json_agg(json_build_array(r.area_no, r.spot_no, r.thickness_um, r.suspect, i.kind)
                 ORDER BY r.area_no, r.spot_no, r.id)
          FROM gauge_readings r JOIN instruments i ON i.id = r.instrument_id
         WHERE r.part_id = x.part_id AND r.round = x.round AND r.discarded_at IS NULL) AS readings
     FROM unnest($1::int[], $2::int[]) AS x(part_id, round)`,
    [parts.map((p) => p.id), parts.map((p) => p.round)],
  )
  const byPart = new Map<number, VerdictRows>()
  for (const row of rows)
    byPart.set(row.part_id, {
      sections: row.sections ?? [],
      carried: row.carried ?? [],
      readings: (row.readings ?? []).map(([areaNo, spotNo, thicknessUm, suspect, kind]) => ({
        round: row.round,
        areaNo,
        spotNo,
        thicknessUm,
        discarded: false,
        suspect,
        instrumentKind: kind,
      })),
    })
  return byPart
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
export function storeVerdict(
  partId: number,
  judged: ReturnType<typeof verdictFromRows>,
  t: Transaction,
): Promise<void> {
  return storeVerdicts([{ partId, judged }], t)
}

/** The same for several parts in one statement. */
export async function storeVerdicts(
  verdicts: { partId: number; judged: ReturnType<typeof verdictFromRows> }[],
  t: Transaction,
): Promise<void> {
  // One JSON document (the verdicts as objects): no array literal to escape, each verdict parsed
  // once by PostgreSQL, straight to jsonb.
  await preparedQuery(
    t,
    'parts_verdict_store',
    `UPDATE parts p SET verdict = v.verdict, verdict_status = v.status,
       thickness_mean_um = v.mean_um,
       first_pass_status = CASE WHEN p.round = 1 THEN v.status ELSE p.first_pass_status END,
       updated_at = now()
     FROM jsonb_to_recordset($1::jsonb) AS v(id int, verdict jsonb, status text, mean_um float8)
     WHERE p.id = v.id`,
    [
      JSON.stringify(
        verdicts.map((v) => ({
          id: v.partId,
          verdict: v.judged.verdict,
          status: v.judged.verdict.status,
          mean_um: v.judged.thicknessMeanUm,
        })),
      ),
    ],
  )
}

import { QueryTypes, type Transaction } from 'sequelize'
import { sequelize } from '../../db'
import { Part, type Lot } from '../../db/models'
import type { CriterionName } from '../../../shared/rules/verdict'
import type { NcStatus } from '../../../shared/api/review'
import type { SpecContent } from '../../../shared/spec/specContent'
import { lotVerdictOf } from '../lots/lots.service'
import { partsUnderReview } from './lotLock'

/** One reason a lot may not be released yet; the 409 of a refused release lists them all. */
export type ReleaseBlocker =
  | {
      kind: 'part'
      partId: number
      partNumber: string
      round: number
      /** The failing criterion; null when the part's inspection is incomplete. */
      criterion: CriterionName | null
      status: 'fail' | 'incomplete'
      reason: string
    }
  | { kind: 'nonconformance'; nonconformanceId: number; number: string; status: NcStatus }
  | { kind: 'lot'; reason: string }

/**
 * Release is refused while any counted part fails or is incomplete, unless each of its failing
 * criteria is covered by a closed nonconformance that allows release: used as is on the
 * customer's concession, or the part scrapped (left out of the shipment). A repair or recoat
 * allows it through its retest: the part's current round then passes. Any nonconformance of the
 * lot not yet closed — open or merely dispositioned — blocks release.
 */
export async function releaseBlockers(
  lot: Lot,
  spec: SpecContent,
  t: Transaction,
): Promise<ReleaseBlocker[]> {
  const blockers: ReleaseBlocker[] = []
  const ncs = await sequelize.query<{ id: number; number: string; status: NcStatus }>(
    "SELECT id, number, status FROM nonconformances WHERE lot_id = $1 AND status <> 'closed' ORDER BY id",
    { bind: [lot.id], type: QueryTypes.SELECT, transaction: t },
  )
  for (const n of ncs)
    blockers.push({
      kind: 'nonconformance',
      nonconformanceId: n.id,
      number: n.number,
      status: n.status,
    })

  const all = await Part.findAll({
    where: { lotId: lot.id },
    order: [['id', 'ASC']],
    transaction: t,
  })
  const extra = await sequelize.query<{
    id: number
    scrapped: boolean
    concessions: string[] | null
  }>(
    `SELECT p.id, p.scrapped_by_nc IS NOT NULL AS scrapped,
            (SELECT array_agg(n.criterion) FROM nonconformance_parts np
               JOIN nonconformances n ON n.id = np.nonconformance_id
              WHERE np.part_id = p.id AND n.status = 'closed' AND n.disposition = 'use-as-is'
                AND n.criterion IS NOT NULL) AS concessions
       FROM parts p WHERE p.lot_id = $1`,
    { bind: [lot.id], type: QueryTypes.SELECT, transaction: t },
  )
  const byId = new Map(extra.map((e) => [e.id, e]))
  const counted = partsUnderReview(spec, all)
  for (const part of counted) {
    const info = byId.get(part.id)
    if (info?.scrapped) continue
    const status = part.verdictStatus ?? 'incomplete'
    const base = {
      kind: 'part' as const,
      partId: part.id,
      partNumber: part.partNumber,
      round: part.round,
    }
    if (status === 'incomplete') {
      blockers.push({
        ...base,
        criterion: null,
        status,
        reason: part.verdict?.reason ?? 'No verdict yet',
      })
    } else if (status === 'fail') {
      const accepted = new Set(info?.concessions ?? [])
      for (const c of part.verdict?.criteria ?? []) {
        if (c.status === 'fail' && !accepted.has(c.criterion)) {
          blockers.push({ ...base, criterion: c.criterion, status: 'fail', reason: c.reason })
        }
      }
    }
  }
  // Too few parts inspected for the spec's sample (or none at all).
  const verdict = lotVerdictOf(spec, counted)
  if (
    verdict.status === 'incomplete' &&
    !blockers.some((b) => b.kind === 'part' && b.status === 'incomplete')
  ) {
    blockers.push({ kind: 'lot', reason: verdict.reason })
  }
  return blockers
}

/**
 * The verdict of a lot from its part verdicts. Sampling per the spec (`sampling` field):
 * 'every-part' — every part of the lot (lotSize, when given) must have a verdict;
 * 'sample' — at least `sampleSize` parts. The lot fails when any evaluated part fails (a failed
 * sample is not averaged away), is incomplete while any evaluated part is incomplete or too few
 * parts have verdicts, and passes otherwise.
 */
import { CRITERIA, type CriterionName, type CriterionStatus, type OverallStatus } from './verdict'
import type { PartVerdict } from './evaluatePart'
import { RuleInputError } from './errors'

export interface LotOptions {
  sampling?: { mode: 'every-part' | 'sample'; sampleSize: number }
  /** Number of parts in the lot. */
  lotSize?: number
}

export interface LotVerdict {
  status: OverallStatus
  partCount: number
  partsRequired: number | null
  passCount: number
  failCount: number
  incompleteCount: number
  /** Parts that failed, by position in the list, with the failing criteria. */
  failedParts: {
    index: number
    partLabel: string | null
    criteria: CriterionName[]
  }[]
  byCriterion: Record<CriterionName, Record<CriterionStatus, number>>
  reason: string
}

export function evaluateLot(partVerdicts: PartVerdict[], options: LotOptions = {}): LotVerdict {
  if (!Array.isArray(partVerdicts)) throw new RuleInputError('partVerdicts', 'must be a list')
  const lotSize = options.lotSize
  if (lotSize !== undefined && (!Number.isInteger(lotSize) || lotSize < 1)) {
    throw new RuleInputError('lotSize', 'must be a whole number of at least 1')
  }
  const mode = options.sampling?.mode ?? 'every-part'
  const partsRequired = mode === 'sample' ? (options.sampling?.sampleSize ?? 1) : (lotSize ?? null)
  const byCriterion = Object.fromEntries(
    CRITERIA.map((c) => [c, { pass: 0, fail: 0, incomplete: 0, 'not-required': 0 }]),
  ) as LotVerdict['byCriterion']
  for (const v of partVerdicts) for (const c of v.criteria) byCriterion[c.criterion][c.status]++
  const failedParts = partVerdicts
    .map((v, index) => ({
      index,
      partLabel: v.partLabel,
      criteria: v.criteria.filter((c) => c.status === 'fail').map((c) => c.criterion),
      status: v.status,
    }))
    .filter((p) => p.status === 'fail')
    .map(({ status: _s, ...rest }) => rest)
  const passCount = partVerdicts.filter((v) => v.status === 'pass').length
  const failCount = failedParts.length
  const incompleteCount = partVerdicts.filter((v) => v.status === 'incomplete').length
  const short =
    partVerdicts.length === 0 || (partsRequired !== null && partVerdicts.length < partsRequired)
  const status: OverallStatus = failCount
    ? 'fail'
    : incompleteCount || short
      ? 'incomplete'
      : 'pass'
  const need = partsRequired === null ? '' : ` of ${partsRequired} required`
  let reason: string
  if (status === 'fail') {
    const names = failedParts.map((p) => p.partLabel ?? `part ${p.index + 1}`).join(', ')
    reason = `${failCount} part(s) nonconforming: ${names}.`
  } else if (status === 'incomplete') {
    reason = short
      ? `${partVerdicts.length} part(s) inspected${need}.`
      : `${incompleteCount} part(s) still open.`
  } else reason = `All ${partVerdicts.length} inspected part(s)${need} conform.`
  return {
    status,
    partCount: partVerdicts.length,
    partsRequired,
    passCount,
    failCount,
    incompleteCount,
    failedParts,
    byCriterion,
    reason,
  }
}

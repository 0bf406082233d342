/**
 * The verdict of one part: one result per criterion (surface-prep, climate, thickness, holiday,
 * cure, adhesion — always all six, in that order; 'not-required' where the spec asks for none)
 * and an overall status: fail if any criterion fails, else incomplete if any is incomplete,
 * else pass. The spec is run through `specContentSchema` (defaults filled in), the record through
 * `partInspectionInputSchema`; a bad field throws RuleInputError naming it (the API answers 400).
 */
import { specContentSchema, type SpecContent } from '../spec/specContent'
import { RuleInputError, requirePositive } from './errors'
import {
  evaluateAdhesionCriterion,
  evaluateClimateCriterion,
  evaluateCureCriterion,
  evaluateSurfacePrepCriterion,
} from './partCriteria'
import { evaluateHolidayCriterion } from './partHoliday'
import { partInspectionInputSchema, type PartInfo, type PartInspectionInput } from './partInput'
import { evaluateThicknessCriterion } from './partThickness'
import type { SamplingPlan } from './sampling'
import { combineStatuses, type CriterionResult, type OverallStatus } from './verdict'

export interface PartVerdict {
  status: OverallStatus
  partLabel: string | null
  criteria: CriterionResult[]
  /** One line: which criteria failed or are open, or that all conform. */
  reason: string
  /** The thickness sampling plan and progress ("9 of 15 spots") with its derivation. */
  samplingPlan: SamplingPlan
}

function issuePath(path: readonly PropertyKey[]): string {
  return path.reduce<string>(
    (acc, p) => (typeof p === 'number' ? `${acc}[${p}]` : acc ? `${acc}.${String(p)}` : String(p)),
    '',
  )
}

function parseOrThrow<T>(
  schema: {
    safeParse(v: unknown):
      | { success: true; data: T }
      | {
          success: false
          error: { issues: { path: PropertyKey[]; message: string }[] }
        }
  },
  value: unknown,
  prefix: string,
): T {
  const r = schema.safeParse(value)
  if (r.success) return r.data
  const issue = r.error.issues[0]!
  const path = issuePath(issue.path)
  throw new RuleInputError(
    path ? `${prefix}${prefix ? '.' : ''}${path}` : prefix || 'input',
    issue.message,
  )
}

const LABELS: Record<CriterionResult['criterion'], string> = {
  'surface-prep': 'surface preparation',
  climate: 'climate',
  thickness: 'thickness',
  holiday: 'holiday test',
  cure: 'cure',
  adhesion: 'adhesion',
}

/**
 * Specs already run through specContentSchema and frozen, so they cannot have changed since:
 * evaluatePart skips parsing them again (the server judges a part after every write, always
 * against the same few cached spec versions, and the parse was most of the rules' time).
 */
const parsedSpecs = new WeakSet<object>()

function deepFreeze<T>(value: T): T {
  if (value && typeof value === 'object' && !Object.isFrozen(value)) {
    Object.freeze(value)
    for (const v of Object.values(value)) deepFreeze(v)
  }
  return value
}

/** Parses `spec` once, freezes the result and lets evaluatePart trust it from then on. */
export function parsedSpecForRules(spec: unknown): SpecContent {
  const parsed = deepFreeze(parseOrThrow<SpecContent>(specContentSchema, spec, 'spec'))
  parsedSpecs.add(parsed)
  return parsed
}

export function evaluatePart(
  spec: SpecContent,
  part: PartInfo,
  input: PartInspectionInput,
): PartVerdict {
  const s = parsedSpecs.has(spec) ? spec : parseOrThrow<SpecContent>(specContentSchema, spec, 'spec')
  const rec = parseOrThrow<PartInspectionInput>(partInspectionInputSchema, input, '')
  const info: PartInfo = { ...part }
  if (part.coatedAreaFt2 !== undefined && part.coatedAreaFt2 !== null) {
    info.coatedAreaFt2 = requirePositive(part.coatedAreaFt2, 'coatedAreaFt2', 1e9, ' ft²')
  }
  const thickness = evaluateThicknessCriterion(s, info, rec)
  const criteria: CriterionResult[] = [
    evaluateSurfacePrepCriterion(s, rec),
    evaluateClimateCriterion(s, rec),
    thickness.result,
    evaluateHolidayCriterion(s, rec, thickness.measuredMeanUm),
    evaluateCureCriterion(s, rec),
    evaluateAdhesionCriterion(s, rec),
  ]
  const status = combineStatuses(criteria.map((c) => c.status))
  const failed = criteria.filter((c) => c.status === 'fail').map((c) => LABELS[c.criterion])
  const open = criteria.filter((c) => c.status === 'incomplete').map((c) => LABELS[c.criterion])
  const reason =
    status === 'pass'
      ? 'Every required criterion conforms to the spec.'
      : [
          failed.length ? `Nonconforming: ${failed.join(', ')}.` : '',
          open.length ? `Still open: ${open.join(', ')}.` : '',
        ]
          .filter(Boolean)
          .join(' ')
  return {
    status,
    partLabel: part.label ?? null,
    criteria,
    reason,
    samplingPlan: thickness.plan,
  }
}

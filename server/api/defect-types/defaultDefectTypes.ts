import type { CriterionName } from '../../../shared/rules/verdict'

/**
 * The starting list of defect types (the admin edits it later). Codes are stable: automatic
 * nonconformances find their type by code, and the reject Pareto groups by it.
 */
export const DEFAULT_DEFECT_TYPES = [
  { code: 'thin-film', label: 'Thin film (below the specified thickness)' },
  { code: 'excess-film', label: 'Excess film (above the specified thickness)' },
  { code: 'holiday', label: 'Holiday (pinhole or void found by the holiday test)' },
  { code: 'poor-adhesion', label: 'Poor adhesion' },
  { code: 'under-cure', label: 'Under-cure' },
  { code: 'blast-defect', label: 'Blast defect / surface preparation' },
  {
    code: 'climate-out-of-limits',
    label: 'Climate out of limits (dew point, humidity, temperature)',
  },
  { code: 'contamination', label: 'Contamination (oil, dust, salts, overspray)' },
  { code: 'handling-damage', label: 'Handling damage' },
  { code: 'other', label: 'Other' },
] as const

export type DefaultDefectCode = (typeof DEFAULT_DEFECT_TYPES)[number]['code']

/**
 * The defect type of a failed criterion. Thickness is thin or excess film by what the rule
 * reported: the SSPC-PA 2 and ISO 19840 reasons say "below" for a low reading or mean and
 * "above" for a high one; a part with both is counted as thin (the more common repair).
 */
export function defectCodeFor(criterion: CriterionName, reason: string): DefaultDefectCode {
  switch (criterion) {
    case 'thickness':
      return /\bbelow\b/i.test(reason) || !/\babove\b/i.test(reason) ? 'thin-film' : 'excess-film'
    case 'holiday':
      return 'holiday'
    case 'adhesion':
      return 'poor-adhesion'
    case 'cure':
      return 'under-cure'
    case 'surface-prep':
      return 'blast-defect'
    case 'climate':
      return 'climate-out-of-limits'
  }
}

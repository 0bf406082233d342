/** Words the coating-line screens share. */
import type { CriterionName } from '@shared/rules/verdict'
import type { LotStatus, SectionName } from '@shared/api/lots'
import type { StatusTone } from '@/components/StatusBadge.vue'
import { formatArea, type AreaUnit } from '@shared/units/convert'

export const CRITERION_LABELS: Record<CriterionName, string> = {
  'surface-prep': 'Surface preparation',
  climate: 'Climate',
  thickness: 'Film thickness',
  holiday: 'Holiday test',
  cure: 'Cure',
  adhesion: 'Adhesion',
}

export const SECTION_LABELS: Record<SectionName, string> = {
  'surface-prep': 'Surface prep',
  climate: 'Climate',
  'thickness-gauge': 'Thickness',
  holiday: 'Holiday test',
  cure: 'Cure',
  adhesion: 'Adhesion',
  notes: 'Notes',
}

export const LOT_STATUS_LOOK: Record<LotStatus, { tone: StatusTone; text: string }> = {
  open: { tone: 'neutral', text: 'Open' },
  'awaiting-review': { tone: 'warn', text: 'Awaiting review' },
  'on-hold': { tone: 'bad', text: 'On hold' },
  released: { tone: 'ok', text: 'Released' },
  rejected: { tone: 'bad', text: 'Rejected' },
}

/** "1.20 m² (12.9 ft²)": the person's unit first, the other beside it (specs and drawings use both). */
export function bothAreas(m2: number, unit: AreaUnit): string {
  const other: AreaUnit = unit === 'm2' ? 'ft2' : 'm2'
  return `${formatArea(m2, unit)} (${formatArea(m2, other, other === 'ft2' ? 1 : 2)})`
}

/** The words a spec's settings are shown with: the standards' own designations. */
import type { SpecContent } from '@shared/spec/specContent'

type C = SpecContent
export const COATING_TYPE_LABELS: Record<C['coatingType'], string> = {
  FBE: 'Fusion-bonded epoxy (FBE) powder',
  'liquid-epoxy': 'Two-part liquid epoxy',
  primer: 'Primer',
}
export const COATING_TYPE_SHORT: Record<C['coatingType'], string> = {
  FBE: 'FBE',
  'liquid-epoxy': 'Liquid epoxy',
  primer: 'Primer',
}
export const THICKNESS_RULE_LABELS: Record<C['thickness']['rule'], string> = {
  'SSPC-PA2': 'SSPC-PA 2 — spot and area measurements',
  'ISO-19840': 'ISO 19840 — readings against the NDFT (80/20 rule)',
}
/** Spot limits as % of the specified min / max (TRADE.md §1, from memory [M]). */
export const PA2_LEVEL_LABELS: Record<number, string> = {
  1: 'Level 1 — spots 100 % of min / 100 % of max',
  2: 'Level 2 — spots 100 % of min / 120 % of max',
  3: 'Level 3 — spots 80 % of min / 120 % of max (default)',
  4: 'Level 4 — spots 80 % of min / 150 % of max',
  5: 'Level 5 — spots 80 % of min / no maximum',
}
export const GRADE_LABELS: Record<C['surfacePrep']['grade'], string> = {
  'SSPC-SP7/Sa1': 'SSPC-SP 7 / Sa 1 — brush-off',
  'SSPC-SP6/Sa2': 'SSPC-SP 6 / Sa 2 — commercial',
  'SSPC-SP14': 'SSPC-SP 14 — industrial',
  'SSPC-SP10/Sa2.5': 'SSPC-SP 10 / Sa 2½ — near-white',
  'SSPC-SP5/Sa3': 'SSPC-SP 5 / Sa 3 — white metal',
}
export const PROFILE_METHOD_LABELS: Record<C['surfacePrep']['profileMethod'], string> = {
  'A-comparator': 'ASTM D4417 Method A — comparator',
  'B-depth-micrometer': 'ASTM D4417 Method B — depth micrometer',
  'C-replica-tape': 'ASTM D4417 Method C — replica tape',
}
export const HOLIDAY_METHOD_LABELS: Record<C['holiday']['method'], string> = {
  'by-thickness': 'By film thickness — wet sponge up to 500 µm (20 mil), spark above (ASTM D5162)',
  'low-voltage': 'Low-voltage wet sponge (ASTM D5162 Method A)',
  'high-voltage': 'High-voltage spark (ASTM D5162 Method B)',
}
export const VOLTAGE_RULE_LABELS: Record<C['holiday']['voltageRule'], string> = {
  'NACE-SP0490': 'NACE SP0490 — FBE, from the measured thickness',
  'NACE-SP0274': 'NACE SP0274 — thick film, from the measured thickness',
  fixed: 'A fixed voltage named by this spec',
}
export const SAMPLING_LABELS: Record<C['sampling']['mode'], string> = {
  'every-part': 'Every part is inspected',
  sample: 'A sample of parts from each lot',
}
export const CROSS_CUT_LABELS: Record<'A' | 'B', string> = {
  A: 'ASTM D3359 Method A — X-cut (5A–0A)',
  B: 'ASTM D3359 Method B — cross-cut (5B–0B)',
}

/** v-select items from a label table; `numeric` for number-keyed tables (PA 2 levels). */
export function items<K extends string>(labels: Record<K, string>): { value: K; title: string }[]
export function items(
  labels: Record<number, string>,
  numeric: true,
): { value: number; title: string }[]
export function items(labels: Record<string, string>, numeric = false) {
  return Object.entries(labels).map(([value, title]) => ({
    value: numeric ? Number(value) : value,
    title,
  }))
}

export function ruleSummary(t: C['thickness']): string {
  return t.rule === 'SSPC-PA2' ? `SSPC-PA 2, level ${t.pa2Level}` : 'ISO 19840'
}

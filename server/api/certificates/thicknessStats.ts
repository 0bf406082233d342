/**
 * Thickness per part for the certificate: n, min, mean, max of the part's accepted gauge readings
 * in its current round (discarded readings left out — assemblePartInput does that), as film
 * thickness: a type-1 gauge's base metal reading is taken off (ASTM D7091 via SSPC-PA 2 [R]),
 * else an ISO 19840 spec's profile correction (TRADE.md §2 [M — spec field]), exactly as the
 * thickness rule does before judging. µm. Pure.
 */
import type { PartInspectionInput } from '../../../shared/rules/partInput'
import type { SpecContent } from '../../../shared/spec/specContent'
import { baseMetalReadingUm, subtractBaseMetalReading } from '../../../shared/rules/pa2'

export interface ThicknessStats {
  n: number
  minUm: number
  meanUm: number
  maxUm: number
}

export function filmReadingsUm(spec: SpecContent, input: PartInspectionInput): number[] {
  const t = input.thickness
  if (!t) return []
  const raw = t.readingsUm ?? (t.areas ?? []).flatMap((a) => a.spots.flatMap((s) => s.readingsUm))
  let bmrUm: number | null = null
  if (t.gaugeType === 'type-1') {
    if (t.baseMetalReadingsUm?.length) bmrUm = baseMetalReadingUm(t.baseMetalReadingsUm)
    else if (t.baseMetalReadingUm !== undefined) bmrUm = t.baseMetalReadingUm
  }
  if (bmrUm !== null) return subtractBaseMetalReading(raw, bmrUm)
  const correction = spec.thickness.rule === 'ISO-19840' ? spec.thickness.isoProfileCorrectionUm : 0
  return raw.map((r) => Math.max(0, r - correction))
}

export function thicknessStats(readingsUm: number[]): ThicknessStats | null {
  if (readingsUm.length === 0) return null
  return {
    n: readingsUm.length,
    minUm: Math.min(...readingsUm),
    meanUm: readingsUm.reduce((a, b) => a + b, 0) / readingsUm.length,
    maxUm: Math.max(...readingsUm),
  }
}

/**
 * Sampling plan for one part: how many areas / spots / readings the spec's thickness rule asks
 * for at this coated area, how many are recorded, and a plain-words derivation for the screen.
 * SSPC-PA 2 area count and 5 spots × ≥ 3 readings per area [R]; ISO 19840 minimum readings per
 * inspection area [M — a setting].
 */
import { iso19840MinReadings } from './iso19840'
import { pa2AreaCount, PA2_MIN_READINGS_PER_SPOT, PA2_SPOTS_PER_AREA } from './pa2'
import { formatNumber, plural } from './format'
import { squareFeetToSquareMetres } from './units'

export interface SamplingRecorded {
  /** PA 2: areas → spots → gauge readings (only the counts matter). ISO 19840: readingCount. */
  areas?: number[][][]
  readingCount?: number
}

export interface SamplingPlan {
  rule: 'SSPC-PA2' | 'ISO-19840'
  coatedAreaFt2: number | null
  areasRequired: number | null
  spotsRequired: number | null
  readingsRequired: number
  areasRecorded: number
  spotsRecorded: number
  readingsRecorded: number
  complete: boolean
  /** e.g. "9 of 15 spots" or "12 of 15 readings". */
  progress: string
  derivation: string
}

/**
 * PA 2: a spot counts once it has ≥ 3 readings; an area counts once it has 5 counted spots.
 * Without a coated area the part is planned as one area (a small part) and the derivation says
 * so. ISO 19840: the coated area, in m², is the inspection area.
 */
export function samplingPlan(
  rule: 'SSPC-PA2' | 'ISO-19840',
  coatedAreaFt2: number | null | undefined,
  recorded: SamplingRecorded,
): SamplingPlan {
  const area = coatedAreaFt2 ?? null
  if (rule === 'ISO-19840') {
    const m2 = area === null ? null : squareFeetToSquareMetres(area)
    const readingsRequired = m2 === null ? iso19840MinReadings(1) : iso19840MinReadings(m2)
    const n = recorded.readingCount ?? 0
    const derivation =
      m2 === null
        ? `Coated area not recorded: planned as an inspection area up to 1 m², ${readingsRequired} readings (ISO 19840 table). Enter the area to confirm.`
        : `ISO 19840 table: ${formatNumber(area!, 1)} ft² (${formatNumber(m2, 2)} m²) needs at least ${readingsRequired} readings.`
    return {
      rule,
      coatedAreaFt2: area,
      areasRequired: null,
      spotsRequired: null,
      readingsRequired,
      areasRecorded: n > 0 ? 1 : 0,
      spotsRecorded: 0,
      readingsRecorded: n,
      complete: n >= readingsRequired,
      progress: `${n} of ${readingsRequired} readings`,
      derivation,
    }
  }
  const areasRequired = area === null ? 1 : pa2AreaCount(area)
  const spotsRequired = areasRequired * PA2_SPOTS_PER_AREA
  const readingsRequired = spotsRequired * PA2_MIN_READINGS_PER_SPOT
  const areas = recorded.areas ?? []
  // Spots beyond five in one area do not make up for a missing area.
  const spotsPerArea = areas.map(
    (a) => a.filter((s) => s.length >= PA2_MIN_READINGS_PER_SPOT).length,
  )
  const spotsRecorded = spotsPerArea
    .slice(0, areasRequired)
    .reduce((sum, c) => sum + Math.min(c, PA2_SPOTS_PER_AREA), 0)
  const areasRecorded = spotsPerArea.filter((c) => c >= PA2_SPOTS_PER_AREA).length
  const readingsRecorded = areas.reduce((sum, a) => sum + a.reduce((s, r) => s + r.length, 0), 0)
  let derivation: string
  if (area === null) {
    derivation =
      'Coated area not recorded: planned as one area (a small part). Enter the area to confirm.'
  } else if (area < 100) {
    derivation = `Small part under 100 ft² (${formatNumber(area, 1)} ft²) = one area.`
  } else if (area < 300) {
    derivation = `${formatNumber(area, 1)} ft² is under 300 ft²: one area per 100 ft² or part = ${plural(areasRequired, 'area')}.`
  } else if (area <= 1000) {
    derivation = `${formatNumber(area, 1)} ft² is 300–1,000 ft²: 3 areas.`
  } else {
    derivation = `${formatNumber(area, 1)} ft²: 3 areas for the first 1,000 ft² plus one per further 1,000 ft² or part = ${plural(areasRequired, 'area')}.`
  }
  derivation += ` Each area: 5 spots of at least 3 readings (SSPC-PA 2).`
  return {
    rule,
    coatedAreaFt2: area,
    areasRequired,
    spotsRequired,
    readingsRequired,
    areasRecorded,
    spotsRecorded,
    readingsRecorded,
    complete: spotsRecorded >= spotsRequired,
    progress: `${spotsRecorded} of ${spotsRequired} spots`,
    derivation,
  }
}

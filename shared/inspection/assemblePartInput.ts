/**
 * The one place where stored rows become the rules' PartInspectionInput. The server runs it
 * after every write to a part (authoritative verdict); the tablet runs it on the same rows plus
 * its unsent ones (live verdict). Same rows in, same verdict out.
 */
import type { PartInspectionInput } from '../rules/partInput'
import type { SectionName } from '../api/lots'
import type { InstrumentKind } from '../api/instruments'
import { baseMetalReadingUm } from '../rules/pa2'
import { squareMetresToSquareFeet } from '../rules/units'
import type { PartInfo } from '../rules/partInput'

/**
 * Sections a repair-and-retest round carries over from the earlier round unless re-recorded: a
 * touch-up does not change the blast, the climate at coating, the gauge set-up or the cure and
 * adhesion of the original film. Thickness readings and the holiday test are always retaken.
 * A strip-and-recoat round carries nothing (common practice [P]).
 */
export const REPAIR_CARRIED_SECTIONS: readonly SectionName[] = [
  'surface-prep',
  'climate',
  'thickness-gauge',
  'cure',
  'adhesion',
]

/** A section record as stored: the latest per (round, section) is current. */
export interface SectionRowInput {
  section: SectionName
  round: number
  data: unknown
}

/** A gauge reading as stored. */
export interface ReadingRowInput {
  round: number
  areaNo: number
  spotNo: number
  thicknessUm: number
  discarded: boolean
  suspect: boolean
  /** The gauge's kind, when known: a type-1 gauge needs a base metal reading. */
  instrumentKind?: InstrumentKind | null
}

export type ThicknessRuleName = 'SSPC-PA2' | 'ISO-19840'

type ThicknessSection = {
  gaugeType: 'type-1' | 'type-2'
  baseMetalReadingsUm?: number[]
  baseMetalReadingUm?: number
}

/**
 * Rows for one part → the rules' input for its current `round`.
 * - sections: in the order recorded (oldest first); for each section the last row of the round wins;
 *   a section in `carriedSections` that the round has not recorded takes the last row of an
 *   earlier round (repair-and-retest, see REPAIR_CARRIED_SECTIONS).
 * - readings: discarded ones are left out; any suspect one left in sets `suspectReadings`, so the
 *   part cannot pass until it is discarded and re-measured.
 * - SSPC-PA 2: areas by area number, spots by spot number inside each (gaps close up);
 *   ISO 19840: one flat list in area, spot, recorded order.
 * - Gauge type: from the thickness-gauge section, else type 1 if any reading came from a
 *   type-1 gauge (its BMR is then still missing), else type 2.
 */
export function assemblePartInput(
  rule: ThicknessRuleName,
  round: number,
  sections: readonly SectionRowInput[],
  readings: readonly ReadingRowInput[],
  carriedSections: readonly SectionName[] = [],
): PartInspectionInput {
  const current = new Map<SectionName, unknown>()
  const carried = new Map<SectionName, { round: number; data: unknown }>()
  for (const s of sections) {
    if (s.round === round) current.set(s.section, s.data)
    else if (s.round < round && carriedSections.includes(s.section)) {
      const seen = carried.get(s.section)
      if (!seen || s.round >= seen.round) carried.set(s.section, { round: s.round, data: s.data })
    }
  }
  for (const [section, row] of carried) if (!current.has(section)) current.set(section, row.data)

  const input: PartInspectionInput = {}
  if (current.has('surface-prep'))
    input.surfacePrep = current.get('surface-prep') as PartInspectionInput['surfacePrep']
  if (current.has('climate'))
    input.climate = current.get('climate') as PartInspectionInput['climate']
  if (current.has('holiday'))
    input.holiday = current.get('holiday') as PartInspectionInput['holiday']
  if (current.has('cure')) input.cure = current.get('cure') as PartInspectionInput['cure']
  if (current.has('adhesion'))
    input.adhesion = current.get('adhesion') as PartInspectionInput['adhesion']
  const notes = current.get('notes') as { text?: string } | undefined
  if (notes?.text) input.notes = notes.text

  const live = readings
    .map((r, order) => ({ r, order }))
    .filter(({ r }) => r.round === round && !r.discarded)
    .sort((a, b) => a.r.areaNo - b.r.areaNo || a.r.spotNo - b.r.spotNo || a.order - b.order)
    .map(({ r }) => r)
  const gauge = current.get('thickness-gauge') as ThicknessSection | undefined
  if (!gauge && live.length === 0) return input

  const gaugeType =
    gauge?.gaugeType ??
    (live.some((r) => r.instrumentKind === 'dft-gauge-type1') ? 'type-1' : 'type-2')
  const thickness: NonNullable<PartInspectionInput['thickness']> = { gaugeType }
  if (gauge?.baseMetalReadingsUm?.length) thickness.baseMetalReadingsUm = gauge.baseMetalReadingsUm
  if (gauge?.baseMetalReadingUm !== undefined)
    thickness.baseMetalReadingUm = gauge.baseMetalReadingUm
  if (live.some((r) => r.suspect)) thickness.suspectReadings = true

  if (rule === 'ISO-19840') {
    thickness.readingsUm = live.map((r) => r.thicknessUm)
  } else {
    const areas: { key: number; spots: { key: number; readingsUm: number[] }[] }[] = []
    for (const r of live) {
      let area = areas[areas.length - 1]
      if (!area || area.key !== r.areaNo) areas.push((area = { key: r.areaNo, spots: [] }))
      let spot = area.spots[area.spots.length - 1]
      if (!spot || spot.key !== r.spotNo)
        area.spots.push((spot = { key: r.spotNo, readingsUm: [] }))
      spot.readingsUm.push(r.thicknessUm)
    }
    thickness.areas = areas.map((a) => ({
      label: `Area ${a.key}`,
      spots: a.spots.map((s) => ({
        label: `Area ${a.key} spot ${s.key}`,
        readingsUm: s.readingsUm,
      })),
    }))
  }
  input.thickness = thickness
  return input
}

/**
 * Mean film thickness of the round's live readings (µm), the base metal reading of a type-1
 * gauge taken off; null without readings. Stored on the part for the trend pages.
 */
export function thicknessMeanUm(input: PartInspectionInput): number | null {
  const t = input.thickness
  if (!t) return null
  const all = t.readingsUm ?? (t.areas ?? []).flatMap((a) => a.spots.flatMap((s) => s.readingsUm))
  if (all.length === 0) return null
  let bmr = 0
  if (t.gaugeType === 'type-1') {
    if (t.baseMetalReadingsUm?.length) bmr = baseMetalReadingUm(t.baseMetalReadingsUm)
    else bmr = t.baseMetalReadingUm ?? 0
  }
  return all.reduce((s, v) => s + v, 0) / all.length - bmr
}

/** The rules' part info from stored columns: the sampling plan works in ft² (SSPC-PA 2 areas). */
export function partInfoFor(part: {
  coatedAreaM2: number | null
  partNumber: string
  heatNumber?: string
}): PartInfo {
  return {
    coatedAreaFt2: part.coatedAreaM2 === null ? null : squareMetresToSquareFeet(part.coatedAreaM2),
    label: part.heatNumber ? `${part.partNumber} / ${part.heatNumber}` : part.partNumber,
  }
}

/**
 * The thickness readings of one part as the grid shows them, and the next empty slot the
 * keypad's Enter fills. SSPC-PA 2: areas → 5 spots → at least 3 readings each (PA 2 §§ 5–6 [R]);
 * ISO 19840: one flat list (area 1, spot 0). Only good readings fill a slot: a discarded, suspect
 * or refused one leaves it open, so the operator is led back to re-measure it.
 */
import { PA2_MIN_READINGS_PER_SPOT, PA2_SPOTS_PER_AREA } from '@shared/rules/pa2'

export type GridReadingState = 'stored' | 'waiting' | 'refused'

export interface GridReading {
  /** Reading id once stored; the queue key while waiting. */
  key: string
  id: string | null
  areaNo: number
  spotNo: number
  thicknessUm: number
  state: GridReadingState
  suspect: boolean
  discarded: boolean
  /** A discard is waiting to be sent. */
  discardWaiting: boolean
}

export interface GridSpot {
  spotNo: number
  readings: GridReading[]
  goodCount: number
  complete: boolean
}
export interface GridArea {
  areaNo: number
  spots: GridSpot[]
  complete: boolean
}
export interface Slot {
  areaNo: number
  spotNo: number
  /** 1-based number of the reading about to be taken in that spot (or in the list). */
  readingNo: number
}

/** Counts toward the plan and the verdict: not discarded (or being discarded), not suspect, not refused. */
export function isGood(r: GridReading): boolean {
  return !r.discarded && !r.discardWaiting && !r.suspect && r.state !== 'refused'
}

/** At least `areasRequired` areas of five spots, plus any area or spot recorded beyond them. */
export function pa2Grid(readings: readonly GridReading[], areasRequired: number): GridArea[] {
  const areaCount = Math.max(areasRequired, ...readings.map((r) => r.areaNo), 1)
  const areas: GridArea[] = []
  for (let a = 1; a <= areaCount; a++) {
    const inArea = readings.filter((r) => r.areaNo === a)
    const spotCount = Math.max(PA2_SPOTS_PER_AREA, ...inArea.map((r) => r.spotNo))
    const spots: GridSpot[] = []
    for (let s = 1; s <= spotCount; s++) {
      const rs = inArea.filter((r) => r.spotNo === s)
      const goodCount = rs.filter(isGood).length
      spots.push({
        spotNo: s,
        readings: rs,
        goodCount,
        complete: goodCount >= PA2_MIN_READINGS_PER_SPOT,
      })
    }
    areas.push({
      areaNo: a,
      spots,
      complete: spots.slice(0, PA2_SPOTS_PER_AREA).every((s) => s.complete),
    })
  }
  return areas
}

/**
 * Where Enter puts the next reading. The chosen spot keeps the focus until it has its three good
 * readings; then the first open spot of the plan, area by area. null when the plan is full.
 */
export function nextPa2Slot(
  grid: readonly GridArea[],
  areasRequired: number,
  chosen?: { areaNo: number; spotNo: number } | null,
): Slot | null {
  if (chosen) {
    const spot = grid
      .find((a) => a.areaNo === chosen.areaNo)
      ?.spots.find((s) => s.spotNo === chosen.spotNo)
    if (spot && !spot.complete) return { ...chosen, readingNo: spot.goodCount + 1 }
  }
  for (const area of grid.slice(0, Math.max(areasRequired, 1))) {
    for (const spot of area.spots.slice(0, PA2_SPOTS_PER_AREA)) {
      if (!spot.complete)
        return { areaNo: area.areaNo, spotNo: spot.spotNo, readingNo: spot.goodCount + 1 }
    }
  }
  return null
}

/** ISO 19840: the next reading of the flat list (never "full": more readings are always allowed). */
export function nextIsoSlot(readings: readonly GridReading[]): Slot {
  return { areaNo: 1, spotNo: 0, readingNo: readings.filter(isGood).length + 1 }
}

/** Spot mean of the good readings (µm, BMR not taken off), or null. */
export function spotMeanUm(spot: GridSpot, baseMetalUm = 0): number | null {
  const good = spot.readings.filter(isGood)
  if (good.length === 0) return null
  return good.reduce((s, r) => s + Math.max(0, r.thicknessUm - baseMetalUm), 0) / good.length
}

import { describe, expect, it } from 'vitest'
import { mountWithVuetify } from '../mountWithVuetify'
import FloorVerdictPanel from '../../../src/components/floor/FloorVerdictPanel.vue'
import { nextPa2Slot, pa2Grid, type GridReading } from '../../../src/composables/floor/readingSlots'
import { assemblePartInput } from '../../../shared/inspection/assemblePartInput'
import { evaluatePart } from '../../../shared/rules/evaluatePart'
import { specContentSchema } from '../../../shared/spec/specContent'

/**
 * What the operator sees of the SSPC-PA 2 plan while recording: "n of 15 spots", how the plan was
 * derived, and where the next reading goes. SSPC-PA 2 area count [R]: 300–1,000 ft² → 3 areas,
 * 5 spots each, a spot counts from 3 readings. 50 m² = 538.2 ft² [C] → 3 areas, 15 spots.
 */
const spec = specContentSchema.parse({
  coatingType: 'FBE',
  thickness: { rule: 'SSPC-PA2', bandUnit: 'mil', minUm: 304.8, maxUm: 508 },
  surfacePrep: {
    grade: 'SSPC-SP10/Sa2.5',
    profileMethod: 'C-replica-tape',
    profileMinUm: 38,
    profileMaxUm: 100,
  },
  climate: {},
  holiday: {},
  cure: {},
  adhesion: {},
  sampling: {},
})

function reading(
  areaNo: number,
  spotNo: number,
  thicknessUm: number,
  extra: Partial<GridReading> = {},
): GridReading {
  return {
    key: `${areaNo}-${spotNo}-${thicknessUm}`,
    id: null,
    areaNo,
    spotNo,
    thicknessUm,
    state: 'stored',
    suspect: false,
    discarded: false,
    discardWaiting: false,
    ...extra,
  }
}
// Area 1: spots 1–5 complete; area 2: spots 1–4 complete, spot 5 has two readings.
const readings: GridReading[] = []
for (let s = 1; s <= 5; s++) for (const um of [400, 405, 410]) readings.push(reading(1, s, um))
for (let s = 1; s <= 4; s++) for (const um of [390, 395, 400]) readings.push(reading(2, s, um))
readings.push(reading(2, 5, 400), reading(2, 5, 402))

describe('thickness progress on the tablet', () => {
  it('shows "9 of 15 spots" and the derivation for a 538 ft² part (the shared rules’ plan)', () => {
    const input = assemblePartInput(
      'SSPC-PA2',
      1,
      [{ section: 'thickness-gauge', round: 1, data: { gaugeType: 'type-2' } }],
      readings.map((r) => ({
        round: 1,
        areaNo: r.areaNo,
        spotNo: r.spotNo,
        thicknessUm: r.thicknessUm,
        discarded: false,
        suspect: false,
      })),
    )
    const verdict = evaluatePart(spec, { coatedAreaFt2: 538.2 }, input)
    const w = mountWithVuetify(FloorVerdictPanel, {
      props: { verdict, source: 'live', unsentCount: 2, problem: null, spec },
    })
    expect(w.get('[data-test="plan-progress"]').text()).toBe('9 of 15 spots')
    expect(w.get('[data-test="plan-derivation"]').text()).toContain('300–1,000 ft²: 3 areas')
    expect(w.get('[data-test="verdict-panel"]').text()).toContain(
      'includes 2 records waiting to send',
    )
    expect(w.get('[data-test="verdict-status"]').text()).toBe('Still open')
  })

  it('sends the next reading to the open spot, and back to a spot whose reading turned suspect', () => {
    expect(nextPa2Slot(pa2Grid(readings, 3), 3)).toEqual({ areaNo: 2, spotNo: 5, readingNo: 3 })
    // A failed gauge check makes area 1 spot 2's readings suspect: that spot must be re-measured first.
    const withSuspect = readings.map((r) =>
      r.areaNo === 1 && r.spotNo === 2 ? { ...r, suspect: true } : r,
    )
    expect(nextPa2Slot(pa2Grid(withSuspect, 3), 3)).toEqual({ areaNo: 1, spotNo: 2, readingNo: 1 })
    // A refused reading (e.g. overdue gauge) does not fill its slot either.
    const refused = [...readings, reading(2, 5, 401, { state: 'refused' })]
    expect(nextPa2Slot(pa2Grid(refused, 3), 3)).toEqual({ areaNo: 2, spotNo: 5, readingNo: 3 })
    const full = [...readings, reading(2, 5, 404)]
    for (let s = 1; s <= 5; s++) for (const um of [400, 401, 402]) full.push(reading(3, s, um))
    expect(nextPa2Slot(pa2Grid(full, 3), 3)).toBeNull()
  })
})

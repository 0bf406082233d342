import { describe, expect, it } from 'vitest'
import { reactive, ref, shallowRef } from 'vue'
import { mountWithVuetify } from '../mountWithVuetify'
import FloorSectionClimate from '../../../src/components/floor/FloorSectionClimate.vue'
import { PART_SESSION_KEY } from '../../../src/composables/floor/partSession'
import type { PartSession } from '../../../src/composables/floor/usePart'
import { useSessionStore } from '../../../src/stores/session'
import type { SessionUser } from '../../../shared/api/auth'
import type { PartDetail } from '../../../shared/api/lots'
import { specContentSchema } from '../../../shared/spec/specContent'

/**
 * The climate section works the dew point and the steel's margin out while the operator types,
 * in their temperature unit, against the spec's limits. Check values TRADE.md §5 [C]:
 * 20 °C / 60 % RH → dew point 12.00 °C; the steel must be ≥ 15.0 °C (3 °C margin): 15.0 passes,
 * 14.9 fails. °F = °C × 9/5 + 32, so 12.0 °C = 53.6 °F and a 3 °C margin is 5.4 °F.
 */
function user(temperatureUnit: 'C' | 'F'): SessionUser {
  return {
    id: 1,
    email: 'operator@harrowgate.example',
    name: 'Alex Marlow',
    role: 'operator',
    customerId: null,
    thicknessUnit: 'um',
    temperatureUnit,
    areaUnit: 'm2',
  }
}
const spec = specContentSchema.parse({
  coatingType: 'FBE',
  thickness: { rule: 'SSPC-PA2', minUm: 304.8, maxUm: 508 },
  surfacePrep: {
    grade: 'SSPC-SP10/Sa2.5',
    profileMethod: 'C-replica-tape',
    profileMinUm: 38,
    profileMaxUm: 100,
  },
  climate: { minSteelAboveDewPointC: 3, maxRelativeHumidityPct: 85 },
  holiday: {},
  cure: {},
  adhesion: {},
  sampling: {},
})

/** Only what the section reads of the part session: the part, instruments, drafts, save. */
function fakeSession() {
  const part = {
    id: 5,
    lotId: 1,
    partNumber: 'VB-1',
    heatNumber: '',
    lotStatus: 'open',
    spec,
    sections: {},
    readings: [],
    round: 1,
  } as unknown as PartDetail
  return {
    part: shallowRef(part),
    instruments: ref([]),
    drafts: reactive({}),
    sectionInstrumentId: () => null,
    saveSection: async () => ({ kind: 'waiting' }),
  } as unknown as PartSession
}

async function type(wrapper: ReturnType<typeof mountWithVuetify>, test: string, value: string) {
  await wrapper.get(`[data-test="${test}"] input`).setValue(value)
}

describe('FloorSectionClimate', () => {
  it('shows dew point, margin and the gate as the three values are typed (°C)', async () => {
    const w = mountWithVuetify(FloorSectionClimate, {
      global: { provide: { [PART_SESSION_KEY as symbol]: fakeSession() } },
    })
    useSessionStore().user = user('C')
    await type(w, 'air-temp', '20')
    await type(w, 'rh', '60')
    expect(w.find('[data-test="dew-point"]').exists()).toBe(false)
    await type(w, 'steel-temp', '15')
    expect(w.get('[data-test="dew-point"]').text()).toBe('12.0 °C')
    expect(w.get('[data-test="dew-margin"]').text()).toBe('3.0 °C')
    expect(w.get('[data-test="climate-verdict"]').text()).toContain('Fit to coat')
    await type(w, 'steel-temp', '14.9')
    expect(w.get('[data-test="dew-margin"]').text()).toBe('2.9 °C')
    expect(w.get('[data-test="climate-verdict"]').text()).toContain('Do not coat')
    expect(w.get('[data-test="climate-result"]').text()).toContain('at least 3.0 °C is required')
  })

  it('works in °F for a person who reads °F, judging the same stored °C values', async () => {
    const w = mountWithVuetify(FloorSectionClimate, {
      global: { provide: { [PART_SESSION_KEY as symbol]: fakeSession() } },
    })
    useSessionStore().user = user('F')
    await type(w, 'air-temp', '68')
    await type(w, 'rh', '60')
    await type(w, 'steel-temp', '59')
    expect(w.get('[data-test="dew-point"]').text()).toBe('53.6 °F')
    expect(w.get('[data-test="dew-margin"]').text()).toBe('5.4 °F')
    expect(w.get('[data-test="climate-verdict"]').text()).toContain('Fit to coat')
  })
})

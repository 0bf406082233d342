import { describe, expect, it } from 'vitest'
import { nextTick, ref } from 'vue'
import { mountWithVuetify } from './mountWithVuetify'
import SetupSpecsTable from '../../src/components/spec/SetupSpecsTable.vue'
import QuantityField from '../../src/components/QuantityField.vue'
import { useSessionStore } from '../../src/stores/session'
import type { SessionUser } from '../../shared/api/auth'
import type { SpecRow } from '../../shared/api/setup'
import { specContentSchema } from '../../shared/spec/specContent'

// 1 mil = 25.4 µm exactly (1 in = 25.4 mm by definition) — TRADE.md preamble [C].
const admin: SessionUser = {
  id: 1,
  email: 'admin@harrowgate.example',
  name: 'Riley Thorne',
  role: 'admin',
  customerId: null,
  thicknessUnit: 'mil',
  temperatureUnit: 'C',
  areaUnit: 'm2',
}

function spec(minUm: number, maxUm: number | null): SpecRow {
  const content = specContentSchema.parse({
    coatingType: 'FBE',
    thickness: { rule: 'SSPC-PA2', minUm, maxUm },
    surfacePrep: {
      grade: 'SSPC-SP10/Sa2.5',
      profileMethod: 'C-replica-tape',
      profileMinUm: 38.1,
      profileMaxUm: 101.6,
    },
    climate: {},
    holiday: {},
    cure: {},
    adhesion: {},
    sampling: {},
  })
  const version = {
    version: 1,
    content,
    changeNote: '',
    createdAt: '2026-01-01T00:00:00Z',
    createdByName: null,
    lockedAt: null,
  }
  return {
    id: 7,
    code: 'HFW-FBE-01',
    title: 'FBE',
    customerId: null,
    customerName: null,
    currentVersion: 1,
    active: true,
    current: version,
  }
}

describe('the spec list shows each band in the reader’s unit', () => {
  it('shows 304.8–508 µm as 12.0–20.0 mil, and as 305–508 µm after switching to µm', async () => {
    const wrapper = mountWithVuetify(SetupSpecsTable, { props: { specs: [spec(304.8, 508)] } })
    const session = useSessionStore()
    session.user = { ...admin }
    await nextTick()
    expect(wrapper.get('[data-test="spec-band"]').text()).toBe('12.0–20.0 mil')
    session.user = { ...admin, thicknessUnit: 'um' }
    await nextTick()
    expect(wrapper.get('[data-test="spec-band"]').text()).toBe('305–508 µm')
  })

  it('writes a minimum-only band (ISO 19840 without a maximum) as “≥”', async () => {
    const wrapper = mountWithVuetify(SetupSpecsTable, { props: { specs: [spec(300, null)] } })
    useSessionStore().user = { ...admin }
    await nextTick()
    // 300 / 25.4 = 11.81… → 11.8 mil [C]
    expect(wrapper.get('[data-test="spec-band"]').text()).toBe('≥ 11.8 mil')
  })
})

describe('a thickness typed in mils is kept in micrometres', () => {
  it('stores 12 mil as 304.8 µm and leaves an untouched value alone', async () => {
    const model = ref<number | null>(150)
    const wrapper = mountWithVuetify(QuantityField, {
      props: {
        label: 'Specified minimum',
        quantity: 'thickness',
        modelValue: model.value,
        'onUpdate:modelValue': (v: number | null) => (model.value = v),
      },
    })
    useSessionStore().user = { ...admin }
    await nextTick()
    const input = wrapper.get('input')
    // 150 µm shown as 5.91 mil, but not rewritten: nobody typed
    expect((input.element as HTMLInputElement).value).toBe('5.91')
    expect(model.value).toBe(150)
    await input.setValue('12')
    expect(model.value).toBeCloseTo(304.8, 10)
    expect(wrapper.text()).toContain('mil')
  })
})

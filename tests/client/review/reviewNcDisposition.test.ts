import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { mountWithVuetify } from '../mountWithVuetify'
import ReviewNcDispositionForm from '../../../src/components/review/ReviewNcDispositionForm.vue'
import type { NonconformanceRow } from '../../../shared/api/review'

/** "Use as is" ships a nonconforming part: the form must not send it without the customer's concession. */
const NC: NonconformanceRow = {
  id: 54,
  number: 'NC-2649-001',
  lotId: 199,
  lotNumber: 'F2649-001',
  status: 'open',
  source: 'auto',
  criterion: 'thickness',
  defectTypeId: 1,
  defectLabel: 'Thin film (below the specified thickness)',
  description: 'Area 1, spot 2 below the spot minimum',
  parts: [{ id: 711, partNumber: 'TEE-200-FL', heatNumber: 'HT-44366-A', round: 1 }],
  disposition: null,
  concessionRef: null,
  dispositionNote: '',
  dispositioned: null,
  verification: null,
  closed: null,
  opened: { byId: 1, byName: 'Alex Marlow', at: '2026-11-30T15:50:00.000Z' },
  version: 1,
}

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

async function settle() {
  await flushPromises()
  await new Promise((r) => setTimeout(r, 20))
  await flushPromises()
}

describe('the disposition form', () => {
  it('asks for the concession reference before sending "use as is", then sends it', async () => {
    const fetchStub = vi.fn(
      async () =>
        new Response(
          JSON.stringify({ ...NC, status: 'dispositioned', disposition: 'use-as-is', version: 2 }),
          {
            status: 200,
            headers: { 'Content-Type': 'application/json' },
          },
        ),
    )
    vi.stubGlobal('fetch', fetchStub)
    const wrapper = mountWithVuetify(ReviewNcDispositionForm, {
      props: { nc: NC },
      attachTo: document.body,
    })
    await wrapper.get('input[value="use-as-is"]').setValue(true)
    await settle()
    expect(
      wrapper.find('[data-test="nc-concession"]').exists(),
      'the concession field appears',
    ).toBe(true)
    await wrapper.get('form').trigger('submit')
    await settle()
    expect(wrapper.get('[data-test="nc-concession"]').text()).toContain(
      "Use as is needs the customer's concession reference",
    )
    expect(fetchStub).not.toHaveBeenCalled()

    await wrapper.get('[data-test="nc-concession"] input').setValue('WWA-CONC-0193')
    await wrapper.get('form').trigger('submit')
    await settle()
    expect(fetchStub).toHaveBeenCalledOnce()
    const [url, init] = fetchStub.mock.calls[0] as unknown as [string, RequestInit]
    expect(url).toBe('/api/nonconformances/54/disposition')
    expect(JSON.parse(String(init.body))).toMatchObject({
      disposition: 'use-as-is',
      concessionRef: 'WWA-CONC-0193',
      version: 1,
    })
    expect(wrapper.emitted('saved')).toHaveLength(1)
  })
})

import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { createMemoryHistory, createRouter } from 'vue-router'
import { mountWithVuetify } from '../mountWithVuetify'
import ReviewDecisionBar from '../../../src/components/review/ReviewDecisionBar.vue'

/**
 * The decision bar as a supervisor meets it: hold and reject need a reason before anything is
 * sent; a refused release lists what blocks it; a lot decided meanwhile by someone else (409
 * version_conflict) says so and asks the page to show the current state.
 */
const LOT = { id: 199, lotNumber: 'F2649-001', status: 'awaiting-review' as const, version: 3 }

function answer(status: number, body: unknown) {
  return vi.fn(
    async () =>
      new Response(JSON.stringify(body), {
        status,
        headers: { 'Content-Type': 'application/json' },
      }),
  )
}

async function mountBar(fetchStub: ReturnType<typeof answer>) {
  vi.stubGlobal('fetch', fetchStub)
  const router = createRouter({
    history: createMemoryHistory(),
    routes: [
      { path: '/', component: { template: '<p />' } },
      { path: '/nc/:id', name: 'review-nc', component: { template: '<p />' } },
    ],
  })
  await router.push('/')
  const wrapper = mountWithVuetify(ReviewDecisionBar, {
    props: { lot: LOT },
    global: { plugins: [router] },
    attachTo: document.body,
  })
  return wrapper
}

async function decide(
  wrapper: Awaited<ReturnType<typeof mountBar>>,
  decision: string,
  reason = '',
) {
  await wrapper.get(`[data-test="decide-${decision}"]`).trigger('click')
  if (reason) await wrapper.get('[data-test="decision-reason"] textarea').setValue(reason)
  await wrapper.get('form').trigger('submit')
  await flushPromises()
  await new Promise((r) => setTimeout(r, 20))
  await flushPromises()
}

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

describe('the decision bar', () => {
  it('does not send a hold without a reason, and sends it with one and the lot version', async () => {
    const fetchStub = answer(201, {
      lot: { ...LOT, status: 'on-hold', version: 4 },
      decision: { id: 1, decision: 'hold' },
    })
    const wrapper = await mountBar(fetchStub)
    await decide(wrapper, 'hold')
    expect(wrapper.get('[data-test="decision-reason"]').text()).toContain(
      'Hold and reject need a reason',
    )
    expect(fetchStub).not.toHaveBeenCalled()

    await wrapper
      .get('[data-test="decision-reason"] textarea')
      .setValue('Thin film on spot 2: repair first')
    await wrapper.get('form').trigger('submit')
    await flushPromises()
    await new Promise((r) => setTimeout(r, 20))
    expect(fetchStub).toHaveBeenCalledOnce()
    const [url, init] = fetchStub.mock.calls[0] as unknown as [string, RequestInit]
    expect(url).toBe('/api/lots/199/decisions')
    expect(JSON.parse(String(init.body))).toEqual({
      decision: 'hold',
      reason: 'Thin film on spot 2: repair first',
      version: 3,
    })
    expect(wrapper.emitted('decided')?.[0]?.[1]).toBe('hold')
  })

  it('releases without a reason but lists what the server says blocks it', async () => {
    const fetchStub = answer(409, {
      error: {
        code: 'release_blocked',
        message: 'Lot F2649-001 cannot be released yet: 2 item(s) stand in the way',
        details: {
          blockers: [
            { kind: 'nonconformance', nonconformanceId: 54, number: 'NC-2649-001', status: 'open' },
            {
              kind: 'part',
              partId: 711,
              partNumber: 'TEE-200-FL',
              round: 1,
              criterion: 'thickness',
              status: 'fail',
              reason: 'Area 1, spot 2 below the spot minimum',
            },
          ],
        },
      },
    })
    const wrapper = await mountBar(fetchStub)
    await decide(wrapper, 'release')
    expect(fetchStub).toHaveBeenCalledOnce()
    const error = wrapper.get('[data-test="decision-error"]').text()
    expect(error).toContain('cannot be released yet')
    const items = wrapper.findAll('[data-test="release-blockers"] li')
    expect(items).toHaveLength(2)
    expect(items[0]!.text()).toContain('NC-2649-001')
    expect(items[1]!.text()).toContain('TEE-200-FL')
    expect(items[1]!.text()).toContain('Film thickness fails')
  })

  it('says when someone decided the lot meanwhile and asks for the current state', async () => {
    const fetchStub = answer(409, {
      error: {
        code: 'version_conflict',
        message: 'Lot F2649-001 was changed meanwhile',
        details: { current: { ...LOT, status: 'released', version: 4 } },
      },
    })
    const wrapper = await mountBar(fetchStub)
    await decide(wrapper, 'reject', 'Wrong powder batch')
    expect(wrapper.get('[data-test="decision-stale"]').text()).toContain(
      'Someone decided this lot meanwhile: it is now released',
    )
    expect(wrapper.emitted('stale')).toHaveLength(1)
    expect(wrapper.emitted('decided')).toBeUndefined()
  })
})

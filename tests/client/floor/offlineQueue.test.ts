import { afterEach, describe, expect, it, vi } from 'vitest'
import { createPinia, setActivePinia } from 'pinia'
import { useOfflineQueueStore } from '../../../src/stores/offlineQueue'
import { useSessionStore } from '../../../src/stores/session'
import type { FloorWrite } from '../../../src/services/floorApi'

/**
 * No lost work: a write stays on the tablet until the server has stored it. The network here is a
 * stand-in for fetch (the real server is exercised by the e2e tests): no answer keeps the write
 * waiting; a refusal keeps it in the refused list with the server's message; a 2xx removes it.
 */
function reading(thicknessUm: number): FloorWrite {
  return {
    kind: 'readings',
    partId: 5,
    body: {
      readings: [
        { clientId: crypto.randomUUID(), areaNo: 1, spotNo: 1, thicknessUm, instrumentId: 1 },
      ],
    },
  }
}
function setup() {
  setActivePinia(createPinia())
  const session = useSessionStore()
  session.token = 'token'
  session.user = {
    id: 1,
    email: 'o@harrowgate.example',
    name: 'Alex Marlow',
    role: 'operator',
    customerId: null,
    thicknessUnit: 'um',
    temperatureUnit: 'C',
    areaUnit: 'm2',
  }
  return useOfflineQueueStore()
}
const answer = (status: number, body: unknown) =>
  new Response(JSON.stringify(body), { status, headers: { 'Content-Type': 'application/json' } })
afterEach(() => vi.unstubAllGlobals())

describe('offline queue', () => {
  it('keeps a write through a dropped network and sends it, once, when the server answers', async () => {
    const fetch = vi.fn().mockRejectedValue(new TypeError('Failed to fetch'))
    vi.stubGlobal('fetch', fetch)
    const queue = setup()
    const first = await queue.submit(reading(400), { label: 'Reading 400 µm', partId: 5 })
    expect(first.kind).toBe('waiting')
    expect(queue.waiting).toHaveLength(1)
    expect(queue.online).toBe(false)

    fetch.mockResolvedValue(answer(201, { storedCount: 1 }))
    queue.retryAllNow()
    await queue.flush()
    expect(queue.waiting).toHaveLength(0)
    // The same clientId went both times, so the server stores the reading once.
    const ids = fetch.mock.calls.map(
      (c) => JSON.parse(String((c[1] as RequestInit).body)).readings[0].clientId,
    )
    expect(new Set(ids).size).toBe(1)
  })

  it('never drops a refused write: it waits in the refused list with the server’s message', async () => {
    vi.stubGlobal(
      'fetch',
      vi
        .fn()
        .mockResolvedValue(
          answer(409, { error: { code: 'lot_not_open', message: 'Lot F2649-002 is on hold' } }),
        ),
    )
    const queue = setup()
    const outcome = await queue.submit(reading(410), { label: 'Reading 410 µm', partId: 5 })
    expect(outcome.kind).toBe('refused')
    expect(queue.refused).toHaveLength(1)
    expect(queue.refused[0]!.error?.message).toBe('Lot F2649-002 is on hold')
    expect(queue.discard(queue.refused[0]!.key)).toBe(true)
    expect(queue.mine).toHaveLength(0)
  })

  it('hands a refusal back to a form that is still open instead of listing it', async () => {
    vi.stubGlobal(
      'fetch',
      vi
        .fn()
        .mockResolvedValue(
          answer(400, {
            error: { code: 'batch_expired', message: 'Batch PB-1 expired on 2020-01-31' },
          }),
        ),
    )
    const queue = setup()
    const outcome = await queue.submit(reading(420), { label: 'x', interactive: true })
    expect(outcome.kind === 'refused' && outcome.error.message).toBe(
      'Batch PB-1 expired on 2020-01-31',
    )
    expect(queue.mine).toHaveLength(0)
  })
})

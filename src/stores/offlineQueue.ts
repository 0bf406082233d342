import { computed, ref, shallowRef } from 'vue'
import { defineStore } from 'pinia'
import { api, toApiError, type ApiError } from '@/services/api'
import { sendWrite, writeClientId, type FloorWrite } from '@/services/floorApi'
import { useSessionStore } from './session'
import {
  openQueueStorage,
  type QueuedWrite,
  type QueueStorage,
} from '@/composables/floor/queueStorage'

/**
 * No lost work. Every write from the line is kept on the tablet (IndexedDB) the moment the
 * operator presses save, then sent oldest first. A write leaves the tablet only when the server
 * has stored it (2xx; the clientId makes a repeat harmless). No answer, a dropped network or a
 * 5xx keeps it waiting, retried with backoff, on every 'online' event and every RETRY_EVERY_MS.
 * A refusal (4xx: lot on hold, gauge overdue, bad value) is never dropped: it stays in the list
 * with the server's message until the operator discards it or sends it again.
 */
export type SubmitOutcome =
  { kind: 'stored'; response: unknown } | { kind: 'waiting' } | { kind: 'refused'; error: ApiError }

export interface SubmitOptions {
  label: string
  partId?: number | null
  lotId?: number | null
  /**
   * The form is still on screen: a refusal on the first attempt is handed back to the form (which
   * keeps what was typed and shows the message) instead of going to the refused list.
   */
  interactive?: boolean
}

export const RETRY_EVERY_MS = 10_000
const MAX_BACKOFF_MS = 60_000

function backoffMs(attempts: number): number {
  const base = Math.min(MAX_BACKOFF_MS, 2000 * 2 ** Math.max(0, attempts - 1))
  return Math.round(base * (0.8 + Math.random() * 0.4))
}

/** No answer, a server fault or "try later": keep and retry. Anything else 4xx is the server's decision. */
function isTransient(e: ApiError): boolean {
  return e.status === 0 || e.status >= 500 || e.status === 408 || e.status === 429
}

type StoredListener = (entry: QueuedWrite, response: unknown) => void

export const useOfflineQueueStore = defineStore('offlineQueue', () => {
  const session = useSessionStore()
  // shallowRef + replaced objects: entries stay plain, so IndexedDB can clone them (not Proxies).
  const entries = shallowRef<QueuedWrite[]>([])
  const persistent = ref(true)
  const ready = ref(false)
  const online = ref(typeof navigator === 'undefined' ? true : navigator.onLine)
  const lastError = ref<string | null>(null)
  let storage: QueueStorage | null = null
  let started: Promise<void> | null = null
  let seqCounter = 0
  const firstAttempt = new Map<
    string,
    { interactive: boolean; resolve: (o: SubmitOutcome) => void }
  >()
  const listeners = new Set<StoredListener>()

  const mine = computed(() => entries.value.filter((e) => e.userId === session.user?.id))
  const waiting = computed(() => mine.value.filter((e) => e.state !== 'refused'))
  const refused = computed(() => mine.value.filter((e) => e.state === 'refused'))
  /** Writes of someone else who signed out on this tablet: sent when they sign in again. */
  const othersWaiting = computed(() => entries.value.filter((e) => e.userId !== session.user?.id))
  const sorted = () => [...entries.value].sort((a, b) => a.seq - b.seq)

  function replace(next: QueuedWrite) {
    entries.value = entries.value.map((e) => (e.key === next.key ? next : e))
    void storage
      ?.put(next)
      .catch(() => (lastError.value = 'Could not save to this tablet’s storage.'))
  }
  function drop(key: string) {
    entries.value = entries.value.filter((e) => e.key !== key)
    void storage?.remove(key)
  }

  async function start() {
    started ??= (async () => {
      storage = await openQueueStorage()
      persistent.value = storage.persistent
      // A write caught mid-send when the tab closed is sent again; its clientId keeps it single.
      const loaded = (await storage.all()).map((e) =>
        e.state === 'sending' ? { ...e, state: 'waiting' as const } : e,
      )
      entries.value = [
        ...loaded,
        ...entries.value.filter((e) => !loaded.some((l) => l.key === e.key)),
      ]
      seqCounter = Math.max(0, ...entries.value.map((e) => e.seq))
      ready.value = true
      if (typeof window !== 'undefined') {
        window.addEventListener('online', () => {
          online.value = true
          retryAllNow()
        })
        window.addEventListener('offline', () => (online.value = false))
        window.setInterval(() => void flush(), RETRY_EVERY_MS)
      }
      void flush()
    })()
    return started
  }

  async function submit(write: FloorWrite, opts: SubmitOptions): Promise<SubmitOutcome> {
    await start()
    const user = session.user
    if (!user) return { kind: 'refused', error: toApiError(new Error('Sign in again to record.')) }
    const entry: QueuedWrite = {
      key: writeClientId(write) ?? crypto.randomUUID(),
      seq: Math.max(++seqCounter, Date.now()),
      write,
      label: opts.label,
      userId: user.id,
      userName: user.name,
      partId: opts.partId ?? null,
      lotId: opts.lotId ?? null,
      createdAt: new Date().toISOString(),
      attempts: 0,
      nextAttemptAt: 0,
      state: 'waiting',
      error: null,
    }
    seqCounter = entry.seq
    entries.value = [...entries.value.filter((e) => e.key !== entry.key), entry]
    try {
      await storage?.put(entry)
    } catch {
      lastError.value =
        'This tablet could not keep the record in its storage; it stays in memory until sent.'
    }
    const outcome = new Promise<SubmitOutcome>((resolve) =>
      firstAttempt.set(entry.key, { interactive: !!opts.interactive, resolve }),
    )
    void flush()
    return outcome
  }

  let flushing: Promise<void> | null = null
  let again = false
  function flush(): Promise<void> {
    if (flushing) {
      again = true
      return flushing
    }
    flushing = (async () => {
      do {
        again = false
        await flushOnce()
      } while (again)
    })().finally(() => {
      flushing = null
      // Whatever was not tried this time is waiting: tell the forms so they can say so.
      for (const [key, f] of firstAttempt) {
        if (entries.value.some((e) => e.key === key && e.state !== 'refused')) {
          f.resolve({ kind: 'waiting' })
          firstAttempt.delete(key)
        }
      }
    })
    return flushing
  }

  async function flushOnce() {
    const me = session.user?.id
    if (!me || !session.token) return
    for (const e of sorted()) {
      if (e.userId !== me || e.state === 'refused') continue
      // Oldest first: while the oldest waits out its backoff, the later ones wait behind it.
      if (e.nextAttemptAt > Date.now()) return
      const current = entries.value.find((x) => x.key === e.key)
      if (!current) continue
      replace({ ...current, state: 'sending' })
      try {
        const response = await sendWrite(current.write)
        drop(current.key)
        online.value = true
        firstAttempt.get(current.key)?.resolve({ kind: 'stored', response })
        firstAttempt.delete(current.key)
        for (const l of listeners) l(current, response)
      } catch (err) {
        const error = toApiError(err)
        const attempts = current.attempts + 1
        if (error.status === 401) {
          // The session ended: keep the write for when this person signs in again.
          replace({ ...current, state: 'waiting' })
          void api.get('/api/auth/me').catch(() => undefined)
          return
        }
        if (isTransient(error)) {
          if (error.status === 0) online.value = false
          replace({
            ...current,
            state: 'waiting',
            attempts,
            nextAttemptAt: Date.now() + backoffMs(attempts),
          })
          return
        }
        const first = firstAttempt.get(current.key)
        firstAttempt.delete(current.key)
        if (first?.interactive && current.attempts === 0) {
          drop(current.key)
          first.resolve({ kind: 'refused', error })
          continue
        }
        replace({
          ...current,
          state: 'refused',
          attempts,
          error: { status: error.status, code: error.code, message: error.message },
        })
        first?.resolve({ kind: 'refused', error })
      }
    }
  }

  /** The connection came back (or the operator asked): forget the backoff and send now. */
  function retryAllNow() {
    for (const e of entries.value)
      if (e.state === 'waiting' && e.nextAttemptAt > 0) replace({ ...e, nextAttemptAt: 0 })
    void flush()
  }
  /** A refused write the operator wants sent again (the lot came off hold, the gauge was recalibrated). */
  function sendAgain(key: string) {
    const e = entries.value.find((x) => x.key === key)
    if (e) replace({ ...e, state: 'waiting', attempts: 0, nextAttemptAt: 0, error: null })
    void flush()
  }
  /** Only on the operator's word: a refused write, or a waiting one they withdraw before it is sent. */
  function discard(key: string) {
    const e = entries.value.find((x) => x.key === key)
    if (!e || e.state === 'sending') return false
    drop(key)
    return true
  }
  function onStored(listener: StoredListener): () => void {
    listeners.add(listener)
    return () => listeners.delete(listener)
  }
  const forPart = (partId: number) => computed(() => mine.value.filter((e) => e.partId === partId))

  return {
    entries,
    mine,
    waiting,
    refused,
    othersWaiting,
    persistent,
    ready,
    online,
    lastError,
    start,
    submit,
    flush,
    retryAllNow,
    sendAgain,
    discard,
    onStored,
    forPart,
  }
})

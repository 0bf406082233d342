/**
 * One part at the tablet: its stored record, the instruments to pick from, the live verdict, and
 * the actions that save (every one through the offline queue, with a clientId made on save).
 */
import { computed, onBeforeUnmount, shallowRef, watch } from 'vue'
import type { DiscardResult, PartDetail, ReadingsBatchResult, SectionName } from '@shared/api/lots'
import type { InstrumentRow } from '@shared/api/setup'
import { floorApi, type FloorWrite, type VerificationBody } from '@/services/floorApi'
import { instrumentsApi } from '@/services/setup'
import { useAsync } from '@/composables/useAsync'
import { useOfflineQueueStore, type SubmitOutcome } from '@/stores/offlineQueue'
import { usePartLive } from './usePartLive'
import type { QueuedWrite } from './queueStorage'

function isPartDetail(v: unknown): v is PartDetail {
  return (
    !!v && typeof v === 'object' && Array.isArray((v as PartDetail).readings) && 'sections' in v
  )
}

export function usePart(partId: number) {
  const queue = useOfflineQueueStore()
  void queue.start()
  const part = shallowRef<PartDetail | null>(null)
  const instruments = shallowRef<InstrumentRow[]>([])
  const pending = queue.forPart(partId)
  const live = usePartLive(part, pending, instruments)

  const {
    loading,
    error,
    run: reload,
  } = useAsync(async () => {
    part.value = await floorApi.part(partId)
  })
  const loadInstruments = useAsync(async () => {
    instruments.value = (await instrumentsApi.list()).filter((i) => i.active)
  })
  void reload()
  void loadInstruments.run()

  // The server's answer is authoritative: take its record or verdict, then re-read the part once
  // the burst of writes settles (readings come one per Enter).
  let reloadTimer: ReturnType<typeof setTimeout> | null = null
  function reloadSoon() {
    if (reloadTimer) clearTimeout(reloadTimer)
    reloadTimer = setTimeout(() => void reload(), 1200)
  }
  function applyResponse(entry: QueuedWrite, response: unknown) {
    if (isPartDetail(response) && response.id === partId) {
      part.value = response
      return
    }
    const r = response as Partial<ReadingsBatchResult & DiscardResult> | null
    const p = part.value
    if (p && r) {
      // Merge the stored rows at once: the queue has already let go of them, and a gap until the
      // re-read would send the next Enter back to a slot that is in fact filled.
      const rows = [...(r.readings ?? []), ...(r.reading ? [r.reading] : [])]
      const byId = new Map(p.readings.map((x) => [x.id, x]))
      for (const row of rows) byId.set(row.id, row)
      part.value = { ...p, readings: [...byId.values()], verdict: r.verdict ?? p.verdict }
    }
    if (entry.write.kind === 'verification') void loadInstruments.run()
    reloadSoon()
  }
  const off = queue.onStored((entry, response) => {
    const affected = (response as { affectedPartIds?: number[] } | null)?.affectedPartIds ?? []
    if (entry.partId === partId || affected.includes(partId)) applyResponse(entry, response)
  })
  onBeforeUnmount(() => {
    off()
    if (reloadTimer) clearTimeout(reloadTimer)
  })
  // Back online after a gap: the record may have changed elsewhere (a supervisor's hold).
  watch(
    () => queue.online,
    (now, before) => {
      if (now && !before) reloadSoon()
    },
  )

  const label = computed(() => {
    const p = part.value
    return p ? `${p.partNumber}${p.heatNumber ? ` / ${p.heatNumber}` : ''}` : `part ${partId}`
  })
  const lotId = computed(() => part.value?.lotId ?? null)

  function submit(write: FloorWrite, what: string, interactive = true): Promise<SubmitOutcome> {
    return queue.submit(write, {
      label: `${what} · ${label.value}`,
      partId,
      lotId: lotId.value,
      interactive,
    })
  }

  async function saveSection(
    section: SectionName,
    instrumentId: number | null,
    data: unknown,
    what: string,
  ) {
    const body = { clientId: crypto.randomUUID(), instrumentId, data }
    const outcome = await submit({ kind: 'section', partId, section, body }, what)
    // Saved or waiting: the queue holds it now, so the draft is done. Refused: keep what was typed.
    if (outcome.kind !== 'refused') delete live.drafts[section]
    return outcome
  }

  function saveReading(
    r: { areaNo: number; spotNo: number; thicknessUm: number; instrumentId: number },
    what: string,
  ) {
    const reading = { clientId: crypto.randomUUID(), takenAt: new Date().toISOString(), ...r }
    return submit({ kind: 'readings', partId, body: { readings: [reading] } }, what)
  }

  function saveReadings(
    readings: { areaNo: number; spotNo: number; thicknessUm: number; instrumentId: number }[],
    what: string,
  ) {
    const rows = readings.map((r) => ({ clientId: crypto.randomUUID(), ...r }))
    return submit({ kind: 'readings', partId, body: { readings: rows } }, what)
  }

  function discardReading(readingId: string, reason: string, what: string) {
    return submit({ kind: 'discard-reading', partId, readingId, body: { reason } }, what, false)
  }

  function verifyInstrument(
    instrumentId: number,
    body: Omit<VerificationBody, 'clientId'>,
    what: string,
  ) {
    return queue.submit(
      {
        kind: 'verification',
        partId,
        instrumentId,
        body: { clientId: crypto.randomUUID(), ...body },
      },
      { label: what, partId, lotId: lotId.value, interactive: true },
    )
  }

  function uploadPhoto(file: Blob, fileName: string, caption: string) {
    const write: FloorWrite = {
      kind: 'photo',
      partId,
      lotId: lotId.value ?? 0,
      clientId: crypto.randomUUID(),
      caption,
      file,
      fileName,
    }
    return submit(write, `Photo ${caption ? `“${caption}”` : fileName}`)
  }

  /** Take back a write that has not reached the server (the operator typed a wrong value). */
  const withdraw = (key: string) => queue.discard(key)

  return {
    part,
    instruments,
    pending,
    loading,
    error,
    reload,
    ...live,
    saveSection,
    saveReading,
    saveReadings,
    discardReading,
    verifyInstrument,
    uploadPhoto,
    withdraw,
  }
}

export type PartSession = ReturnType<typeof usePart>

/**
 * The live verdict of one part: the stored rows, plus what waits in the offline queue, plus what
 * the operator is typing, run through the SAME functions the server runs (assemblePartInput →
 * evaluatePart). The server's verdict replaces it as soon as nothing is unsent or half-typed.
 */
import { computed, reactive, ref, type ComputedRef, type Ref, type ShallowRef } from 'vue'
import type { PartDetail, SectionName } from '@shared/api/lots'
import type { InstrumentRow } from '@shared/api/setup'
import { evaluatePart, type PartVerdict } from '@shared/rules/evaluatePart'
import {
  assemblePartInput,
  partInfoFor,
  type ReadingRowInput,
  type SectionRowInput,
} from '@shared/inspection/assemblePartInput'
import type { QueuedWrite } from './queueStorage'
import type { GridReading } from './readingSlots'

export interface SectionDraft {
  instrumentId: number | null
  data: unknown
}
export interface ReadingDraft {
  areaNo: number
  spotNo: number
  thicknessUm: number
}

export function usePartLive(
  part: ShallowRef<PartDetail | null>,
  pending: ComputedRef<QueuedWrite[]>,
  instruments: Ref<InstrumentRow[]>,
) {
  /** Section values typed but not saved yet, by section. */
  const drafts = reactive<Partial<Record<SectionName, SectionDraft>>>({})
  /** The reading in the entry field before Enter. */
  const readingDraft = ref<ReadingDraft | null>(null)

  const discardsWaiting = computed(
    () =>
      new Set(
        pending.value.flatMap((e) =>
          e.write.kind === 'discard-reading' ? [e.write.readingId] : [],
        ),
      ),
  )

  /** Every reading of the current round for the grid: stored first, then waiting and refused ones. */
  const gridReadings = computed<GridReading[]>(() => {
    const p = part.value
    if (!p) return []
    const stored: GridReading[] = p.readings
      .filter((r) => r.round === p.round)
      .map((r) => ({
        key: r.id,
        id: r.id,
        areaNo: r.areaNo,
        spotNo: r.spotNo,
        thicknessUm: r.thicknessUm,
        state: 'stored',
        suspect: r.suspect,
        discarded: r.discarded,
        discardWaiting: discardsWaiting.value.has(r.id),
      }))
    const storedIds = new Set(p.readings.map((r) => r.clientId))
    const unsent: GridReading[] = pending.value.flatMap((e) =>
      e.write.kind !== 'readings'
        ? []
        : e.write.body.readings
            .filter((r) => !storedIds.has(r.clientId))
            .map((r) => ({
              key: r.clientId,
              id: null,
              areaNo: r.areaNo,
              spotNo: r.spotNo,
              thicknessUm: r.thicknessUm,
              state: e.state === 'refused' ? ('refused' as const) : ('waiting' as const),
              suspect: false,
              discarded: false,
              discardWaiting: false,
            })),
    )
    return [...stored, ...unsent]
  })

  /** Stored section rows, then waiting section writes (newer wins), then drafts on top. */
  const sectionRows = computed<SectionRowInput[]>(() => {
    const p = part.value
    if (!p) return []
    const rows: SectionRowInput[] = Object.values(p.sections).map((s) => ({
      section: s!.section,
      round: p.round,
      data: s!.data,
    }))
    for (const e of pending.value) {
      if (e.write.kind === 'section' && e.state !== 'refused')
        rows.push({ section: e.write.section, round: p.round, data: e.write.body.data })
    }
    for (const [section, d] of Object.entries(drafts))
      rows.push({ section: section as SectionName, round: p.round, data: d!.data })
    return rows
  })

  /** The instrument (with its calibration) each section currently names: draft, waiting, or stored. */
  function sectionInstrumentId(section: SectionName): number | null {
    const d = drafts[section]
    if (d) return d.instrumentId
    const waiting = [...pending.value]
      .reverse()
      .find((e) => e.write.kind === 'section' && e.write.section === section)
    if (waiting?.write.kind === 'section') return waiting.write.body.instrumentId
    const stored = part.value?.sections[section]?.instrumentId ?? null
    if (stored !== null || section !== 'thickness-gauge') return stored
    // No gauge section yet (e.g. readings imported): the gauge of the latest reading is the one in hand.
    const last = part.value?.readings.filter((r) => !r.discarded).at(-1)
    return last?.instrumentId ?? null
  }

  const kindById = computed(() => new Map(instruments.value.map((i) => [i.id, i.kind])))

  const readingRows = computed<ReadingRowInput[]>(() => {
    const p = part.value
    if (!p) return []
    const storedKind = new Map(
      p.readings.map((r) => [r.id, kindById.value.get(r.instrumentId) ?? null]),
    )
    const rows: ReadingRowInput[] = gridReadings.value
      .filter((r) => r.state !== 'refused')
      .map((r) => ({
        round: p.round,
        areaNo: r.areaNo,
        spotNo: r.spotNo,
        thicknessUm: r.thicknessUm,
        // A discard waiting to be sent already counts: the operator has decided.
        discarded: r.discarded || r.discardWaiting,
        suspect: r.suspect,
        instrumentKind: r.id ? (storedKind.get(r.id) ?? null) : null,
      }))
    const d = readingDraft.value
    if (d && Number.isFinite(d.thicknessUm))
      rows.push({ round: p.round, ...d, discarded: false, suspect: false })
    return rows
  })

  const live = computed<{ verdict: PartVerdict | null; problem: string | null }>(() => {
    const p = part.value
    if (!p) return { verdict: null, problem: null }
    try {
      const input = assemblePartInput(
        p.spec.thickness.rule,
        p.round,
        sectionRows.value,
        readingRows.value,
      )
      return { verdict: evaluatePart(p.spec, partInfoFor(p), input), problem: null }
    } catch (err) {
      // A half-typed value the rules cannot judge yet (e.g. RH 0 %): say which, keep the last verdict.
      return { verdict: null, problem: err instanceof Error ? err.message : String(err) }
    }
  })

  const unsentCount = computed(() => pending.value.length)
  const typing = computed(() => Object.keys(drafts).length > 0 || readingDraft.value !== null)
  /** What the screen shows: the server's verdict unless something is unsent or being typed. */
  const shown = computed<{ verdict: PartVerdict | null; source: 'server' | 'live' }>(() => {
    const server = part.value?.verdict ?? null
    if (!typing.value && unsentCount.value === 0 && server)
      return { verdict: server, source: 'server' }
    return { verdict: live.value.verdict ?? server, source: 'live' }
  })

  return {
    drafts,
    readingDraft,
    gridReadings,
    sectionInstrumentId,
    live,
    shown,
    typing,
    unsentCount,
  }
}

import { computed, shallowRef } from 'vue'
import type { LotDetail, PartDetail } from '@shared/api/lots'
import type { DecisionRow, NonconformanceRow } from '@shared/api/review'
import { floorApi } from '@/services/floorApi'
import { reviewApi, ncApi } from '@/services/review'
import { useAsync } from './useAsync'

/**
 * Everything a supervisor looks at before deciding a lot: the lot with its verdict, every part's
 * records and readings (one request per part, in parallel), the lot's nonconformances and its
 * decisions so far. `reload` fetches it all again — after a decision, and after a 409 that says
 * somebody else decided meanwhile.
 */
export function useReviewLot(lotId: () => number) {
  const lot = shallowRef<LotDetail | null>(null)
  const parts = shallowRef<PartDetail[]>([])
  const ncs = shallowRef<NonconformanceRow[]>([])
  const decisions = shallowRef<DecisionRow[]>([])

  const { loading, error, run } = useAsync(async () => {
    const id = lotId()
    const [detail, ncRows, decisionRows] = await Promise.all([
      floorApi.lot(id),
      ncApi.list({ lotId: id }),
      reviewApi.decisions(id),
    ])
    parts.value = await Promise.all(detail.parts.map((p) => floorApi.part(p.id)))
    lot.value = detail
    ncs.value = ncRows
    decisions.value = decisionRows
  })

  const openNcs = computed(() => ncs.value.filter((n) => n.status !== 'closed'))
  /** The lot's people who recorded anything: the releaser must be someone else. */
  const recorderIds = computed(() => {
    const ids = new Set<number>()
    for (const p of parts.value) {
      for (const r of p.readings) ids.add(r.recorded.byId)
      for (const s of [...Object.values(p.sections), ...p.history]) if (s) ids.add(s.recorded.byId)
    }
    return ids
  })

  return { lot, parts, ncs, openNcs, decisions, recorderIds, loading, error, reload: run }
}

import { computed, shallowRef, watch } from 'vue'
import { useRoute, useRouter, type LocationQuery } from 'vue-router'
import {
  trendsFilterSchema,
  type TrendsFilterInput,
  type TrendsOptions,
  type TrendsReport,
} from '@shared/api/trends'
import { trendsApi } from '@/services/trends'
import { useAsync } from './useAsync'

const KEYS = [
  'from',
  'to',
  'line',
  'shift',
  'specId',
  'customerId',
  'family',
  'subgroupSize',
] as const
type Key = (typeof KEYS)[number]
export type TrendsUrlFilter = Partial<Record<Key, string>>

/** The filters in the URL; a value the server would refuse is dropped, not sent. */
export function filterFromQuery(query: LocationQuery): TrendsUrlFilter {
  const out: TrendsUrlFilter = {}
  for (const key of KEYS) {
    const raw = query[key]
    const value = Array.isArray(raw) ? raw[0] : raw
    if (typeof value !== 'string' || value === '') continue
    const one = trendsFilterSchema.safeParse({ [key]: value })
    if (one.success) out[key] = value
  }
  return out
}

/**
 * Line health data, driven by the URL: the filters live in the query string, so a view can be
 * bookmarked and sent. `setFilter` replaces the query; the report reloads when it changes.
 */
export function useTrends() {
  const route = useRoute()
  const router = useRouter()
  const filter = computed(() => filterFromQuery(route.query))
  const report = shallowRef<TrendsReport | null>(null)
  const options = shallowRef<TrendsOptions | null>(null)

  const { loading, error, run } = useAsync(async (f: TrendsFilterInput) => {
    report.value = await trendsApi.report(f)
  })
  const optionsLoad = useAsync(async (period: { from?: string; to?: string }) => {
    options.value = await trendsApi.options(period)
  })
  const csv = useAsync((f: TrendsFilterInput) => trendsApi.downloadCsv(f))

  watch(filter, (f) => void run(f as TrendsFilterInput), { immediate: true, deep: true })
  watch(
    () => [filter.value.from, filter.value.to] as const,
    ([from, to]) => void optionsLoad.run({ from, to }),
    { immediate: true },
  )

  function setFilter(patch: TrendsUrlFilter) {
    const next: Record<string, string> = {}
    for (const [k, v] of Object.entries({ ...filter.value, ...patch })) if (v) next[k] = v
    void router.replace({ query: next })
  }

  return {
    filter,
    report,
    options,
    loading,
    error,
    setFilter,
    reload: () => run(filter.value as TrendsFilterInput),
    downloadCsv: () => csv.run(filter.value as TrendsFilterInput),
    csvLoading: csv.loading,
    csvError: csv.error,
  }
}

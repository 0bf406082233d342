import { computed, shallowRef, watch } from 'vue'
import { useRoute, useRouter } from 'vue-router'
import { auditApi, type AuditEntry, type AuditSearch } from '@/services/review'
import { useAsync } from './useAsync'

export const AUDIT_PAGE_SIZE = 50
const KEYS = ['actorId', 'entityType', 'entityId', 'lotNumber', 'from', 'to'] as const
export type AuditFilters = Record<(typeof KEYS)[number], string>

/**
 * The admin's audit search, with its filters and page in the address (a search can be
 * bookmarked or sent to a colleague). Newest first, as the server answers.
 */
export function useReviewAuditSearch() {
  const route = useRoute()
  const router = useRouter()
  const filters = computed<AuditFilters>(() => {
    const f = {} as AuditFilters
    for (const k of KEYS)
      f[k] = typeof route.query[k] === 'string' ? (route.query[k] as string) : ''
    return f
  })
  const page = computed(() => Math.max(1, Number(route.query.page ?? 1) || 1))
  const rows = shallowRef<AuditEntry[]>([])
  const total = shallowRef(0)
  const pages = computed(() => Math.max(1, Math.ceil(total.value / AUDIT_PAGE_SIZE)))

  const { loading, error, run } = useAsync(async () => {
    const f = filters.value
    const q: AuditSearch = {
      actorId: f.actorId ? Number(f.actorId) : undefined,
      entityType: f.entityType || undefined,
      entityId: f.entityId || undefined,
      lotNumber: f.lotNumber || undefined,
      from: f.from || undefined,
      to: f.to || undefined,
      limit: AUDIT_PAGE_SIZE,
      offset: (page.value - 1) * AUDIT_PAGE_SIZE,
    }
    const r = await auditApi.search(q)
    rows.value = r.rows
    total.value = r.total
  })
  watch(
    () => route.fullPath,
    () => void run(),
    { immediate: true },
  )

  function apply(next: AuditFilters) {
    const query: Record<string, string> = {}
    for (const k of KEYS) if (next[k].trim()) query[k] = next[k].trim()
    void router.replace({ query })
  }
  function goTo(p: number) {
    void router.replace({ query: { ...route.query, page: String(p) } })
  }
  return { filters, page, pages, rows, total, loading, error, apply, goTo }
}

import { inject, provide, ref, type InjectionKey } from 'vue'
import type { SectionName } from '@shared/api/lots'
import type { ApiError } from '@/services/api'
import type { PartSession } from './usePart'

/** The part being inspected, shared by its section components (one usePart per screen). */
export const PART_SESSION_KEY: InjectionKey<PartSession> = Symbol('partSession')
const KEY = PART_SESSION_KEY

export function providePartSession(session: PartSession) {
  provide(KEY, session)
}
export function usePartSession(): PartSession {
  const s = inject(KEY)
  if (!s) throw new Error('usePartSession() outside the part inspection screen')
  return s
}

/** Saving one section: what happened, in the words the operator needs. */
export function useSectionSave(section: SectionName, what: string) {
  const session = usePartSession()
  const saving = ref(false)
  const notice = ref<string | null>(null)
  const error = ref<ApiError | null>(null)

  async function save(instrumentId: number | null, data: unknown): Promise<boolean> {
    saving.value = true
    notice.value = null
    error.value = null
    try {
      const outcome = await session.saveSection(section, instrumentId, data, what)
      if (outcome.kind === 'refused') {
        error.value = outcome.error
        return false
      }
      notice.value =
        outcome.kind === 'stored'
          ? `${what} saved.`
          : `${what} kept on this tablet: it will be sent when the connection is back.`
      return true
    } finally {
      saving.value = false
    }
  }
  return { session, saving, notice, error, save }
}

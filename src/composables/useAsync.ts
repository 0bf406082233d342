import { ref, shallowRef } from 'vue'
import { toApiError, type ApiError } from '@/services/api'

/**
 * Loading and error state around one async action. The error is always an ApiError (the server's
 * code, message and field details); a 401 has already ended the session in services/api.ts.
 */
export function useAsync<A extends unknown[], R>(action: (...args: A) => Promise<R>) {
  const loading = ref(false)
  const error = shallowRef<ApiError | null>(null)

  async function run(...args: A): Promise<R | undefined> {
    loading.value = true
    error.value = null
    try {
      return await action(...args)
    } catch (err) {
      error.value = toApiError(err)
      return undefined
    } finally {
      loading.value = false
    }
  }

  return { loading, error, run }
}

/** Data loaded once (and on demand again): `data` keeps the last good answer. */
export function useLoad<R>(load: () => Promise<R>) {
  const data = shallowRef<R | null>(null)
  const { loading, error, run } = useAsync(async () => {
    data.value = await load()
    return data.value
  })
  void run()
  return { data, loading, error, reload: run }
}

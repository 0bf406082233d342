import { onBeforeUnmount, ref, watch, type WatchSource } from 'vue'

/**
 * Image bytes need the bearer token, which an <img src> cannot send: the bytes are fetched as a
 * blob and shown through an object URL, released when the source changes or the component goes.
 */
export function usePhotoObjectUrl(source: WatchSource<unknown>, load: () => Promise<Blob | null>) {
  const url = ref<string | null>(null)
  const failed = ref(false)
  function release() {
    if (url.value) URL.revokeObjectURL(url.value)
    url.value = null
  }
  watch(
    source,
    async () => {
      release()
      failed.value = false
      try {
        const blob = await load()
        if (blob) url.value = URL.createObjectURL(blob)
      } catch {
        failed.value = true
      }
    },
    { immediate: true },
  )
  onBeforeUnmount(release)
  return { url, failed }
}

import { PHOTO_PREFIX, type WaitingPhoto } from '~/stores/photo-queue'

/**
 * Where to show a photo from: the tablet's own copy while it still waits to be uploaded (works
 * offline), otherwise the server's. The object URL is released when no longer shown.
 */
export function usePhotoUrl(uploadId: MaybeRefOrGetter<string | null | undefined>) {
  const url = ref<string | null>(null)
  let objectUrl: string | null = null
  const release = () => { if (objectUrl) URL.revokeObjectURL(objectUrl); objectUrl = null }

  watch(() => toValue(uploadId), async (id) => {
    release()
    if (!id) { url.value = null; return }
    const local = import.meta.client ? await localStore.get<WaitingPhoto>(PHOTO_PREFIX + id).catch(() => undefined) : undefined
    if (toValue(uploadId) !== id) return
    if (local?.blob) url.value = objectUrl = URL.createObjectURL(local.blob)
    else url.value = `/api/uploads/${id}`
  }, { immediate: true })

  onScopeDispose(release)
  return url
}

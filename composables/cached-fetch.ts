import type { AsyncData } from 'nuxt/app'
import type { NitroFetchRequest, TypedInternalResponse } from 'nitropack/types'
import type { FetchError } from 'ofetch'

/**
 * useFetch that also tells how old its data is. Offline, the service worker answers reads from
 * its cache and the answer keeps the server's original Date header, so a screen can say
 * "saved copy from 07:42" instead of passing old data off as current.
 */
export function useCachedFetch<ReqT extends NitroFetchRequest, ResT = TypedInternalResponse<ReqT, unknown, 'get'>>(
  url: ReqT,
  options: { key: string, default: () => NoInfer<ResT> },
) {
  const servedAt = useState<string | null>(`served-at:${options.key}`, () => null)
  const result = useFetch(url, {
    ...options,
    onResponse({ response }) {
      const date = response.headers.get('date')
      servedAt.value = date ? new Date(date).toISOString() : new Date().toISOString()
    },
  }) as AsyncData<ResT, FetchError | undefined>
  const now = useClock(30_000)
  // Older than two minutes means it did not come fresh from the server.
  const savedCopyFrom = computed(() => {
    if (!servedAt.value) return null
    const age = now.value.getTime() - Date.parse(servedAt.value)
    return age > 120_000 ? new Date(servedAt.value) : null
  })
  return Object.assign(result, { servedAt, savedCopyFrom })
}

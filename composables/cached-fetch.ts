import type { UseFetchOptions } from 'nuxt/app'

/**
 * useFetch that also tells how old its data is. Offline, the service worker answers reads from
 * its cache and the answer keeps the server's original Date header, so a screen can say
 * "saved copy from 07:42" instead of passing old data off as current.
 */
export function useCachedFetch<T>(url: string, options: UseFetchOptions<T> & { key: string }) {
  const servedAt = useState<string | null>(`served-at:${options.key}`, () => null)
  const result = useFetch(url, {
    ...options,
    onResponse({ response }) {
      const date = response.headers.get('date')
      servedAt.value = date ? new Date(date).toISOString() : new Date().toISOString()
    },
  } as UseFetchOptions<T>)
  const now = useNow({ interval: 30_000 })
  // Older than two minutes means it did not come fresh from the server.
  const savedCopyFrom = computed(() => {
    if (!servedAt.value) return null
    const age = now.value.getTime() - Date.parse(servedAt.value)
    return age > 120_000 ? new Date(servedAt.value) : null
  })
  return Object.assign(result, { servedAt, savedCopyFrom })
}

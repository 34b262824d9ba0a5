import type { SealKey } from '#shared/runs'

const KEY = 'signoff-key'

/**
 * The server's public key for sealing sign-offs (GET /api/signoff-key). Kept in IndexedDB so a
 * trainer can sign on a tablet that went offline after it fetched the key once; renewed online.
 */
export function useSealKey() {
  const key = useState<SealKey | null>(KEY, () => null)
  if (import.meta.client) {
    onMounted(async () => {
      key.value ??= (await localStore.get<SealKey>(KEY)) ?? null
      try {
        const fresh = await $fetch<SealKey>('/api/signoff-key', { timeout: 8000 })
        key.value = fresh
        await localStore.set(KEY, { keyId: fresh.keyId, spki: fresh.spki })
      }
      catch { /* offline: the kept copy stands */ }
    })
  }
  return key
}

// A session lives in a sealed cookie, so without a server-side record a copy of the cookie
// taken before sign-out would keep working until it expires. A sign-out writes the session's
// id here until that expiry, and every signed-in request checks it (authz.ts). Nitro's `data`
// storage is a small key-value folder on the server's disk (.data/kv), so it survives a restart.
const PREFIX = 'signed-out:'

function storage() {
  return useStorage('data')
}

export async function revokeSession(id: string) {
  const maxAgeSeconds = Number(useRuntimeConfig().session?.maxAge) || 60 * 60 * 12
  const now = Date.now()
  await storage().setItem(`${PREFIX}${id}`, now + maxAgeSeconds * 1000)
  // Past their expiry the cookies are refused anyway; drop those records.
  for (const key of await storage().getKeys(PREFIX)) {
    const until = Number(await storage().getItem(key))
    if (!until || until < now) await storage().removeItem(key)
  }
}

export async function isSessionRevoked(id: string | undefined) {
  if (!id) return false
  const until = Number(await storage().getItem(`${PREFIX}${id}`))
  return !!until && until > Date.now()
}

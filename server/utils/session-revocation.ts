// A session lives in a sealed cookie, so without a server-side record a copy of the cookie
// taken before sign-out would keep working until it expires. A sign-out writes the session's
// id into the revoked_sessions table until that expiry, and every signed-in request checks it
// (authz.ts, in the statement that reads the person). A table rather than one server's disk, so
// every app server of a cluster sees it.

/** The key a session is revoked under (no session id: a key no session has). */
export const revokedKey = (id: string | undefined) => (id ? id.slice(0, 64) : '')

export async function revokeSession(id: string) {
  const maxAgeSeconds = Number(useRuntimeConfig().session?.maxAge) || 60 * 60 * 12
  const now = Date.now()
  const until = new Date(now + maxAgeSeconds * 1000)
  const t = tables.revokedSessions
  const db = useDB()
  // Signed out until the cookie's own expiry (a second sign-out only moves that on)
  await db.insert(t).values({ sessionId: revokedKey(id), until }).onDuplicateKeyUpdate({ set: { until } })
  // Past their expiry the cookies are refused anyway; drop those records.
  await db.delete(t).where(lt(t.until, new Date(now)))
}

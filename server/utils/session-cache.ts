import type { H3Event } from 'h3'

// Opening the sealed session cookie (iron: PBKDF2, HMAC and AES, each a trip through WebCrypto's
// thread pool) was a few milliseconds of every API request (issue 14). A sealed cookie is
// tamper-proof and always opens to the same session, so what it opened to is kept a minute,
// under the whole sealed text, and never past the session's own expiry. Nothing about the person
// is kept: requireShopUser still reads them, and whether this cookie was signed out, from the
// database on every request.

interface OpenedSession { id: string, createdAt: number, data: Record<string, unknown> }

const KEEP_MS = 60_000
const MAX_KEPT = 1000
const kept = new Map<string, { session: OpenedSession, until: number }>()

/** The session cookie's name and sealed text; none when h3 would read the session from its header instead. */
function sealedCookie(event: H3Event) {
  const config = useRuntimeConfig(event).session as { name?: string } | undefined
  const name = config?.name || 'h3'
  if (getRequestHeader(event, `x-${name.toLowerCase()}-session`) !== undefined) return null
  const sealed = getCookie(event, name)
  return sealed ? { name, sealed } : null
}

const sessionsOf = (event: H3Event) => (event.context.sessions ??= Object.create(null)) as Record<string, OpenedSession | undefined>

/**
 * Reads the session (`read`, nuxt-auth-utils' getUserSession) opening the sealed cookie at most
 * once a minute: h3 is first handed what this very cookie opened to a moment ago; otherwise,
 * when `read` opened it here, what it opened to is kept. A session this request already holds
 * (read or changed earlier) is neither replaced nor kept.
 */
export async function readSessionKept<T>(event: H3Event, read: () => Promise<T>): Promise<T> {
  const cookie = sealedCookie(event)
  if (!cookie || sessionsOf(event)[cookie.name]) return read()
  const hit = kept.get(cookie.sealed)
  if (hit && hit.until > Date.now()) {
    // A copy: a route that updates the session changes its own request's copy only
    sessionsOf(event)[cookie.name] = structuredClone(hit.session)
    return read()
  }
  kept.delete(cookie.sealed)
  const result = await read()
  keep(cookie.sealed, sessionsOf(event)[cookie.name], event)
  return result
}

function keep(sealed: string, session: OpenedSession | undefined, event: H3Event) {
  if (!session?.id || !session.data?.user) return
  const maxAgeMs = (Number((useRuntimeConfig(event).session as { maxAge?: number } | undefined)?.maxAge) || 0) * 1000
  const until = Math.min(Date.now() + KEEP_MS, maxAgeMs ? session.createdAt + maxAgeMs : Number.POSITIVE_INFINITY)
  if (until <= Date.now()) return
  // The oldest goes first when full
  if (kept.size >= MAX_KEPT) kept.delete(kept.keys().next().value!)
  kept.set(sealed, { session: structuredClone({ id: session.id, createdAt: session.createdAt, data: session.data }), until })
}

/** The cookie's session ended (signed out, the person gone): it is opened afresh next time. */
export function forgetOpenedSession(event: H3Event) {
  const cookie = sealedCookie(event)
  if (cookie) kept.delete(cookie.sealed)
}

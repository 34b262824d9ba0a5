import type { H3Event } from 'h3'

// What Jogwise may believe about where a request came from. X-Forwarded-* headers are written by
// the client unless a reverse proxy of our own overwrites them, so they count only when
// NUXT_TRUST_PROXY says Jogwise sits behind one.

// A deployment setting read from the process-wide config: useRuntimeConfig(event) copies the whole
// config and applies the environment again on every request, a few ms of each sync (issue 14).
export function trustProxy(_event?: H3Event) {
  const flag = String(useRuntimeConfig().trustProxy ?? '').trim().toLowerCase()
  return flag === '1' || flag === 'true' || flag === 'yes'
}

/** The last entry of a forwarded header: the one our own proxy appended. */
function lastForwarded(event: H3Event, name: string) {
  const values = getRequestHeader(event, name)?.split(',').map(s => s.trim()).filter(Boolean)
  return values?.length ? values[values.length - 1] : undefined
}

/** The client's address: the socket's peer, or the proxy's word for it when trusted. */
export function clientAddress(event: H3Event): string {
  const forwarded = trustProxy(event) ? lastForwarded(event, 'x-forwarded-for') : undefined
  return (forwarded || event.node.req.socket?.remoteAddress || 'unknown').slice(0, 64)
}

/** Whether the browser reached Jogwise over HTTPS (TLS on our socket, or at a trusted proxy). */
export function requestIsHttps(event: H3Event): boolean {
  if ((event.node.req.socket as { encrypted?: boolean } | undefined)?.encrypted) return true
  return trustProxy(event) && lastForwarded(event, 'x-forwarded-proto')?.toLowerCase() === 'https'
}

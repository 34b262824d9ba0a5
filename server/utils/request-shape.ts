import type { H3Event } from 'h3'

// A browser sends a form or a text/plain body to any site without asking first (a "simple"
// request), with the user's cookie. Jogwise takes state changes only from its own pages, and
// only as JSON, which a foreign page cannot send without a CORS preflight we never grant.

/** This server's own origin as the browser sees it. */
function ownOrigin(event: H3Event) {
  const host = (trustProxy(event) && getRequestHeader(event, 'x-forwarded-host')?.split(',').pop()?.trim()) || getRequestHeader(event, 'host')
  return host ? `${requestIsHttps(event) ? 'https' : 'http'}://${host}`.toLowerCase() : undefined
}

/** A 403 for a state change sent by another site, another port or a sandboxed page. */
export function refuseCrossSite(event: H3Event) {
  const site = getRequestHeader(event, 'sec-fetch-site')
  const origin = getRequestHeader(event, 'origin')
  const foreignOrigin = origin !== undefined && origin.toLowerCase() !== ownOrigin(event)
  if (foreignOrigin || (site !== undefined && site !== 'same-origin' && site !== 'none')) {
    throw createError({
      statusCode: 403,
      statusMessage: 'Forbidden',
      message: 'This change did not come from a Jogwise page on this server, so it was refused.',
    })
  }
}

/** A 415 unless the body is JSON; photos are the one exception (raw image bytes). */
export function requireJsonBody(event: H3Event, path: string) {
  if (event.method === 'PUT' && path.startsWith('/api/uploads/')) return
  const type = (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
  if (type === 'application/json') return
  throw createError({
    statusCode: 415,
    statusMessage: 'Unsupported media type',
    message: `Send the request body as JSON (Content-Type: application/json)${type ? `, not ${type}` : ''}.`,
  })
}

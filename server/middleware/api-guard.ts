// Rules for every request that changes something, and for the whole /api prefix: the request
// comes from our own pages (Origin), carries JSON, stays within the size limit as it is read,
// and has a session except on the few routes that must answer before sign-in.
// An invite link is opened signed out: its preview and acceptance carry their own one-time token.
const OPEN_ROUTES = new Set(['/api/auth/login', '/api/health', '/api/invites/preview', '/api/invites/accept'])
const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

export default defineEventHandler(async (event) => {
  const path = event.path.split('?')[0]!
  const changes = STATE_CHANGING.has(event.method)
  if (changes) refuseCrossSite(event)
  if (!path.startsWith('/api/')) {
    if (changes && hasBody(event)) await readBodyWithin(event, MAX_BODY_BYTES)
    return
  }
  if (changes && hasBody(event)) requireJsonBody(event, path)
  // nuxt-auth-utils' own session route answers signed-out clients with an empty session.
  if (!OPEN_ROUTES.has(path) && !path.startsWith('/api/_auth/')) await requireShopUser(event)
  if (changes && hasBody(event)) await readBodyWithin(event, bodyLimitFor(event))
})

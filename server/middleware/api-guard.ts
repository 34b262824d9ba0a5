// Rules for the whole /api prefix: a size limit on bodies and a session on every route except
// the few that must answer before sign-in.
// An invite link is opened signed out: its preview and acceptance carry their own one-time token.
const OPEN_ROUTES = new Set(['/api/auth/login', '/api/health', '/api/invites/preview', '/api/invites/accept'])
const MAX_BODY_BYTES = 2 * 1024 * 1024
// Photos have their own 10 MB rule in the route; this only stops bodies far beyond it early.
const MAX_UPLOAD_BODY_BYTES = 11 * 1024 * 1024

export default defineEventHandler(async (event) => {
  const path = event.path.split('?')[0]!
  if (!path.startsWith('/api/')) return
  const length = Number(getRequestHeader(event, 'content-length') || 0)
  const limit = event.method === 'PUT' && path.startsWith('/api/uploads/') ? MAX_UPLOAD_BODY_BYTES : MAX_BODY_BYTES
  if (length > limit) {
    throw createError({ statusCode: 413, statusMessage: 'Payload too large', message: `The request body is over ${limit / 1024 / 1024} MB.` })
  }
  // nuxt-auth-utils' own session route answers signed-out clients with an empty session.
  if (OPEN_ROUTES.has(path) || path.startsWith('/api/_auth/')) return
  await requireShopUser(event)
})

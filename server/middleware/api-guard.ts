// Rules for the whole /api prefix: a size limit on bodies and a session on every route except
// the few that must answer before sign-in.
const OPEN_ROUTES = new Set(['/api/auth/login', '/api/health'])
const MAX_BODY_BYTES = 2 * 1024 * 1024

export default defineEventHandler(async (event) => {
  const path = event.path.split('?')[0]!
  if (!path.startsWith('/api/')) return
  const length = Number(getRequestHeader(event, 'content-length') || 0)
  if (length > MAX_BODY_BYTES) {
    throw createError({ statusCode: 413, statusMessage: 'Payload too large', message: `The request body is over ${MAX_BODY_BYTES / 1024 / 1024} MB.` })
  }
  // nuxt-auth-utils' own session route answers signed-out clients with an empty session.
  if (OPEN_ROUTES.has(path) || path.startsWith('/api/_auth/')) return
  await requireShopUser(event)
})

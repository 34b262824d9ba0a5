// A session ends for good on sign-out (its id is recorded as signed out, session-revocation.ts),
// and nuxt-auth-utils' own session read (/api/_auth/session, used when a page loads) applies
// the same rules as every API route: a signed-out, deactivated or removed person gets no session.
export default defineNitroPlugin(() => {
  sessionHooks.hook('clear', async (_data, event) => {
    const session = await getUserSession(event)
    if (session.id && session.user) await revokeSession(session.id)
    // This server's opened copy goes too (the revocation alone already refuses it)
    forgetOpenedSession(event)
  })
  sessionHooks.hook('fetch', async (session, event) => {
    if (session.user) await requireShopUser(event)
  })
})

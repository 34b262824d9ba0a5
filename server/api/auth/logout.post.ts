export default defineEventHandler(async (event) => {
  // The session's id is recorded as signed out (server/plugins/session-end.ts), so a copy of the
  // cookie stops working too; Max-Age=0 makes the browser drop its own copy at once.
  await clearUserSession(event, { cookie: { maxAge: 0 } })
  return { ok: true }
})

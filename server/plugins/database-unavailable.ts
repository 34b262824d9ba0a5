import { setResponseHeader } from 'h3'

// While MariaDB is stopped or restarting, every route that needs it would answer a bare
// "500 Server Error" and log a stack trace per request. Instead the answer is a plain 503 with
// Retry-After, which the tablets' sync queue already treats as "keep the events, try later",
// and the log gets one line per outage second at most.
//
// Nitro calls its `error` hooks synchronously just before its error handler turns the error into
// the answer, so the H3 error is rewritten here in place (status, message, no longer "unhandled").
const MESSAGE = 'The database is not answering just now. Nothing you entered is lost: the tablet keeps it and sends it again. Try again in a moment.'

export default defineNitroPlugin((nitroApp) => {
  let lastLog = 0
  nitroApp.hooks.hook('error', (error: any, context) => {
    const down = databaseUnreachable(error)
    if (!down || !context.event) return
    error.statusCode = 503
    error.statusMessage = 'Service unavailable'
    error.message = MESSAGE
    error.unhandled = false
    error.fatal = false
    error.data = { reason: 'database-unavailable' }
    setResponseHeader(context.event, 'retry-after', 5)
    const now = Date.now()
    if (now - lastLog > 1000) {
      lastLog = now
      console.warn(`[jogwise] database not reachable (${down.code}); answering 503 to ${context.event.method} ${context.event.path}`)
    }
  })
})

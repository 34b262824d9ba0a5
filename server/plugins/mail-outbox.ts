// The outbox worker: every few seconds (NUXT_MAIL_WORKER_INTERVAL_MS) it sends the due mails
// and, once a day after the digest hour, queues each shop's daily digest. Every app process
// runs one; the claim in sendDueMail keeps two of them from sending the same row.
export default defineNitroPlugin((nitroApp) => {
  const settings = mailSettings()
  let busy = false
  let stopped = false

  async function tick() {
    if (busy || stopped) return
    busy = true
    try {
      await sendDueMail()
      await enqueueDigestsWhenDue()
    }
    catch (error) {
      // A database hiccup must not stop the worker; the next tick tries again.
      console.error('[jogwise] mail outbox:', error instanceof Error ? error.message : error)
    }
    finally { busy = false }
  }

  const timer = setInterval(tick, settings.workerIntervalMs)
  timer.unref?.()
  console.info(`[jogwise] mail outbox: ${settings.host ? `SMTP ${settings.host}:${settings.port}` : 'no SMTP server set; mails wait in the outbox'}, every ${settings.workerIntervalMs} ms`)

  nitroApp.hooks.hook('close', () => {
    stopped = true
    clearInterval(timer)
    closeMailTransport()
  })
})

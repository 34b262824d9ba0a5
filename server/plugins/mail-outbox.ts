// The outbox worker: every few seconds (NUXT_MAIL_WORKER_INTERVAL_MS) it sends the due mails
// and, once a day after the digest hour, queues each shop's daily digest. Every app process
// runs one, but only the holder of the `mail-sender` lease row sends (worker-lease.ts), so with
// several app servers one sends at a time; the claim in sendDueMail still keeps two of them
// from sending the same row should a lease run out mid-send.
export default defineNitroPlugin((nitroApp) => {
  const settings = mailSettings()
  // Renewed every tick; another server takes over within this long after the holder dies.
  const leaseMs = Math.max(3000, settings.workerIntervalMs * 3)
  let busy = false
  let stopped = false

  async function tick() {
    if (busy || stopped) return
    busy = true
    try {
      if (await claimLease(MAIL_SENDER_LEASE, leaseMs)) await sendDueMail()
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
    return releaseLease(MAIL_SENDER_LEASE).catch(() => {})
  })
})

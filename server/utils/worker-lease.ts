import { randomUUID } from 'node:crypto'
import { hostname } from 'node:os'

// Leases on rows of worker_leases: work that one app server at a time should do (the mail
// sender, the daily digest) is done by whoever holds the named lease. A holder renews it on each
// tick; when it dies, another server takes over once the lease has run out. Times are the app
// servers' clocks, so keep them in step (NTP), as for everything else Jogwise times.

/** The lease of the one app server that sends the outbox's mail (server/plugins/mail-outbox.ts). */
export const MAIL_SENDER_LEASE = 'mail-sender'

/** This process, as named in the lease rows. */
export const LEASE_HOLDER = `${hostname().slice(0, 48)}:${process.pid}:${randomUUID().slice(0, 8)}`

type Affected = [{ affectedRows: number }]

// Leases this process has taken, so a shutdown only touches the database when it held one (a
// build's prerender starts and closes the app without ever opening the database).
const held = new Set<string>()

/** Takes or renews the lease `name` for `ttlMs`; true when this process holds it now. */
export async function claimLease(name: string, ttlMs: number, now = new Date()): Promise<boolean> {
  const db = useDB()
  const t = tables.workerLeases
  const expiresAt = new Date(now.getTime() + ttlMs)
  return withWriteRetry(async () => {
    // A new lease row, unless there is one already
    const [created] = await db.insert(t).ignore().values({ name, holder: LEASE_HOLDER, expiresAt }) as unknown as Affected
    if (created.affectedRows === 1) {
      held.add(name)
      return true
    }
    // Ours to renew, or someone else's that ran out
    const [taken] = await db.update(t).set({ holder: LEASE_HOLDER, expiresAt })
      .where(and(eq(t.name, name), or(eq(t.holder, LEASE_HOLDER), lt(t.expiresAt, now)))) as unknown as Affected
    if (taken.affectedRows === 1) held.add(name)
    else held.delete(name)
    return taken.affectedRows === 1
  })
}

/** Gives the lease up at once (on shutdown), so another server need not wait for it to run out. */
export async function releaseLease(name: string) {
  if (!held.delete(name)) return
  const t = tables.workerLeases
  // Only while it is still ours
  await useDB().update(t).set({ expiresAt: new Date(Date.now() - 1000) }).where(and(eq(t.name, name), eq(t.holder, LEASE_HOLDER)))
}

/** The period a once-only job last ran for (e.g. the digest's day), or null. */
export async function leaseDoneFor(name: string): Promise<string | null> {
  const t = tables.workerLeases
  // The lease row's mark
  const [row] = await useDB().select({ doneFor: t.doneFor }).from(t).where(eq(t.name, name)).limit(1)
  return row?.doneFor ?? null
}

/** Marks the job done for `period`, while this process still holds the lease. */
export async function markLeaseDone(name: string, period: string) {
  const t = tables.workerLeases
  // Only while it is still ours
  await useDB().update(t).set({ doneFor: period }).where(and(eq(t.name, name), eq(t.holder, LEASE_HOLDER)))
}

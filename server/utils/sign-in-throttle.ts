import type { H3Event } from 'h3'

// Throttling of repeated failed sign-ins, the practice OWASP's Authentication Cheat Sheet
// recommends against password guessing ("Protect Against Automated Attacks": account lockout
// and throttling). Failures are counted in a sliding window, per account and per address:
// - 5 per account per 15 min: a person who mistypes a few times is not stopped, yet a guesser
//   gets 20 tries an hour at one account (a 4-digit PIN would take weeks, not minutes). The lock
//   lifts by itself, so a stranger can only keep an account locked by going on failing.
// - 20 per address per 15 min: one tablet or script trying many accounts; high enough that a
//   whole crew on one shared tablet fumbling passwords at shift start is not stopped.
// While an account or address is throttled the password is not even checked, so it cannot be
// guessed meanwhile, and refused tries do not add to the count (the lock never grows by itself).
// The address is the socket's peer unless NUXT_TRUST_PROXY is set (request-origin.ts).
export const SIGN_IN_WINDOW_MS = 15 * 60 * 1000
export const ACCOUNT_FAILURE_LIMIT = 5
export const ADDRESS_FAILURE_LIMIT = 20

/** How long until fewer than `limit` of these failure times remain in the window, or 0. */
function waitMs(times: Date[], limit: number, now: number) {
  if (times.length < limit) return 0
  return Math.max(1000, times[limit - 1]!.getTime() + SIGN_IN_WINDOW_MS - now)
}

function tooMany(event: H3Event, ms: number, what: string) {
  const seconds = Math.ceil(ms / 1000)
  const minutes = Math.ceil(seconds / 60)
  const at = new Date(Date.now() + seconds * 1000)
  setResponseHeader(event, 'Retry-After', seconds)
  return createError({
    statusCode: 429,
    statusMessage: 'Too many attempts',
    message: `Too many failed ${what}. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`,
    data: { retryAfterSeconds: seconds, retryAt: at.toISOString() },
  })
}

/**
 * Starts one checked try of a password or PIN for `email` from this client. The try is written
 * down as a failure before the secret is checked, so a burst of parallel tries all see each
 * other; `succeeded()` takes it (and the account's earlier failures) away again. Throws 429
 * with Retry-After when the account or the address is over its limit.
 */
export async function beginSignInAttempt(event: H3Event, email: string, what = 'sign-ins') {
  const attempt = await beginAttempt(email.trim().toLowerCase().slice(0, 254), clientAddress(event))
  if ('waitMs' in attempt) throw tooMany(event, attempt.waitMs, what)
  return attempt
}

/**
 * The same for a signer's PIN or password given at a sign-off (the online check or a sealed
 * sign-off opened at merge). Counted apart from sign-ins, under the signer's id and the
 * tablet's address, so wrong PINs typed at a sign-off lock that signer's sign-offs only and
 * never their own sign-in (nor the tablet's other sign-ins). Returns `waitMs` when locked.
 */
export function beginSignoffAttempt(signerId: number, address: string) {
  return beginAttempt(`signoff:${signerId}`, `signoff:${address}`.slice(0, 64))
}

/** Throws the 429 of a locked sign-off attempt. */
export function signoffLocked(event: H3Event, waitMs: number, signerName: string) {
  return tooMany(event, waitMs, `PIN or password tries for ${signerName}`)
}

/** A try under way, or how long the account or address is locked. */
type Attempt = { waitMs: number } | { succeeded(): Promise<void>, failed(): Promise<void> }

async function beginAttempt(key: string, address: string): Promise<Attempt> {
  const db = useDB()
  const t = tables.signInFailures
  const now = Date.now()
  const since = new Date(now - SIGN_IN_WINDOW_MS)
  const [{ id }] = await db.insert(t).values({ email: key, address, at: new Date(now) }).$returningId() as [{ id: number }]
  // The newest earlier failures of this account and of this address, within the window
  const [account, fromAddress] = await Promise.all([
    db.select({ at: t.at }).from(t).where(and(eq(t.email, key), gt(t.at, since), ne(t.id, id))).orderBy(desc(t.at)).limit(ACCOUNT_FAILURE_LIMIT),
    db.select({ at: t.at }).from(t).where(and(eq(t.address, address), gt(t.at, since), ne(t.id, id))).orderBy(desc(t.at)).limit(ADDRESS_FAILURE_LIMIT),
  ])
  const wait = Math.max(waitMs(account.map(r => r.at), ACCOUNT_FAILURE_LIMIT, now), waitMs(fromAddress.map(r => r.at), ADDRESS_FAILURE_LIMIT, now))
  if (wait > 0) {
    // This refused try, which is not a failure of its own
    await db.delete(t).where(eq(t.id, id))
    return { waitMs: wait }
  }
  return {
    /** The secret was right: the account starts afresh (the address keeps its count). */
    async succeeded() {
      // Every failure of this account, this try's included
      await db.delete(t).where(eq(t.email, key))
    },
    /** The secret was wrong: the row stays; rows past the window are pruned. */
    async failed() {
      // Failures older than the window, of every account
      await db.delete(t).where(lt(t.at, new Date(Date.now() - SIGN_IN_WINDOW_MS)))
    },
  }
}

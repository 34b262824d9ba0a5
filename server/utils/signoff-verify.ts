import { bindingProblem, openSeal, type SealClaim, type SealTarget } from '#shared/runs/signoff-seal'

// Checks a sealed sign-off (shared/runs/signoff-seal.ts): the online check on the tablet
// (POST /api/runs/:id/signoff-check) and the sync merge both come here, so the rules are one.

export interface Signer { id: number, name: string, role: string, active: boolean, pinHash: string | null, passwordHash: string }

export type SecretCheck = { ok: true } | { ok: false, reason: string, lockedMs?: number, field: 'pin' | 'password' }

/** Opens a seal with this server's key; the reason when it cannot be read. */
export async function openSignoffSeal(seal: unknown) {
  const { publicKey, privateKey } = await useSignoffKeys()
  return openSeal(privateKey, publicKey.keyId, seal)
}

/**
 * Checks the signer's PIN or password in the claim against the stored hash. Each try counts
 * against the signer's sign-off throttle (sign-in-throttle.ts), never against their sign-in;
 * asking for a PIN the signer has not set is no guess and is not counted.
 */
export async function checkSignerSecret(signer: Signer, claim: SealClaim, address: string): Promise<SecretCheck> {
  const field = claim.pin !== undefined ? 'pin' : 'password'
  if (claim.pin !== undefined && !signer.pinHash) return { ok: false, field, reason: `${signer.name} has no PIN; use the password instead.` }
  const attempt = await beginSignoffAttempt(signer.id, address)
  if ('waitMs' in attempt) {
    const minutes = Math.ceil(attempt.waitMs / 60_000)
    return { ok: false, field, lockedMs: attempt.waitMs, reason: `Too many wrong PIN or password tries for ${signer.name}; not checked. Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.` }
  }
  const ok = claim.pin !== undefined ? await verifyPassword(signer.pinHash!, claim.pin) : await verifyPassword(signer.passwordHash, claim.password!)
  if (!ok) {
    await attempt.failed()
    return { ok: false, field, reason: `That ${field === 'pin' ? 'PIN' : 'password'} is not ${signer.name}'s.` }
  }
  await attempt.succeeded()
  return { ok: true }
}

export type MergeVerdict =
  | { outcome: 'reject', reason: string }
  | { outcome: 'verified', nonce: string }
  | { outcome: 'failed', nonce: string, reason: string }

/**
 * The merge's verdict on one sealed sign-off. A seal that is unreadable, signs another event,
 * step, run or signer, is expired, or reuses a nonce is refused (the event stays on the tablet
 * with the reason). A readable, well-bound seal with a wrong or locked secret is stored but not
 * counted ('failed'): the run is flagged, the Ledger and the owner are told.
 */
export async function verdictForSeal(seal: unknown, target: SealTarget, signer: Signer, address: string, nonceTaken: (nonce: string) => boolean | Promise<boolean>, now = Date.now()): Promise<MergeVerdict> {
  if (seal === undefined) return { outcome: 'reject', reason: 'The sign-off was not confirmed with the signer\'s PIN or password.' }
  const opened = await openSignoffSeal(seal)
  if (!opened.ok) return { outcome: 'reject', reason: `The sign-off was not confirmed with the signer's PIN or password: ${opened.reason}` }
  const claim = opened.claim
  const problem = bindingProblem(claim, target, now)
  if (problem) return { outcome: 'reject', reason: problem }
  if (await nonceTaken(claim.nonce)) return { outcome: 'reject', reason: 'This signature was already used once; a signature counts for one sign-off only.' }
  const secret = await checkSignerSecret(signer, claim, address)
  if (!secret.ok) return { outcome: 'failed', nonce: claim.nonce, reason: `The sign-off by ${signer.name} failed its check: ${secret.reason}` }
  return { outcome: 'verified', nonce: claim.nonce }
}

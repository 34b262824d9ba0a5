import { z } from 'zod/mini'
import { MAX_CLOCK_AHEAD_MS } from '../rules/clock'

// A trainer's signature on a tablet, also offline. The tablet puts the signer's PIN or
// password together with what it signs (run, step, signer, the very event, a one-time nonce and
// the time) and encrypts it to the server's public key: a fresh AES-256-GCM key encrypts the
// claim and RSA-OAEP (SHA-256) wraps that key (WebCrypto on both sides). Only this sealed text
// is queued, so nothing on the tablet lets anyone read or try out the PIN; only the server,
// holding the private key, can open it, and it checks the secret against the stored hash.

export const SEAL_VERSION = 'js1'
/** The sealed text is at most this long (a 200-character password fits well inside). */
export const MAX_SEAL_LENGTH = 2400
/** The seal is made with its event: their times may differ by this much at most. */
export const SEAL_EVENT_SKEW_MS = 2 * 60 * 1000
/**
 * How long a seal stays good: a sign-off made offline must reach the server within this time.
 * Long enough for a weekend without Wi-Fi, short enough that a kept seal soon stops counting.
 */
export const SEAL_LIFETIME_MS = 72 * 60 * 60 * 1000
/** An online check of a seal must come within this time of its making. */
export const SEAL_CHECK_WINDOW_MS = 5 * 60 * 1000

// zod/mini: the Run screen loads this file to seal, and the full zod is most of its weight (issue 14)
export const SealClaimSchema = z.strictObject({
  runId: z.uuid(),
  // Null for the sign-off of the whole run.
  stepKey: z.nullable(z.string().check(z.minLength(1), z.maxLength(60))),
  signerId: z.number().check(z.int(), z.positive()),
  eventId: z.uuid(),
  nonce: z.string().check(z.regex(/^[A-Za-z0-9_-]{22,64}$/)),
  time: z.iso.datetime({ offset: true }),
  pin: z.optional(z.string().check(z.regex(/^\d{4,8}$/))),
  password: z.optional(z.string().check(z.minLength(1), z.maxLength(200))),
}).check(z.refine(c => (c.pin === undefined) !== (c.password === undefined), { message: 'A seal holds a PIN or a password.' }))
export type SealClaim = z.infer<typeof SealClaimSchema>

/** What the tablet knows of the server's key (GET /api/signoff-key). */
export interface SealKey { keyId: string, spki: string }

const RSA = { name: 'RSA-OAEP', hash: 'SHA-256' } as const

export function toBase64url(bytes: Uint8Array): string {
  let s = ''
  for (const b of bytes) s += String.fromCharCode(b)
  return btoa(s).replaceAll('+', '-').replaceAll('/', '_').replace(/=+$/, '')
}

export function fromBase64url(text: string): Uint8Array<ArrayBuffer> {
  const s = atob(text.replaceAll('-', '+').replaceAll('_', '/'))
  const out = new Uint8Array(new ArrayBuffer(s.length))
  for (let i = 0; i < s.length; i++) out[i] = s.charCodeAt(i)
  return out
}

/** 16 random bytes, base64url: the seal's one-time nonce. */
export function newNonce(): string {
  return toBase64url(crypto.getRandomValues(new Uint8Array(16)))
}

/** Can this browser seal? WebCrypto's subtle API exists only on HTTPS pages and localhost. */
export function canSeal(): boolean {
  return typeof crypto !== 'undefined' && !!crypto.subtle
}

/** Encrypts the claim to the server's public key. */
export async function sealClaim(key: SealKey, claim: SealClaim): Promise<string> {
  const publicKey = await crypto.subtle.importKey('spki', fromBase64url(key.spki), RSA, false, ['wrapKey'])
  const aes = await crypto.subtle.generateKey({ name: 'AES-GCM', length: 256 }, true, ['encrypt'])
  const iv = crypto.getRandomValues(new Uint8Array(12))
  const body = new TextEncoder().encode(JSON.stringify(claim))
  // The key id is bound in as associated data, so a seal cannot be moved to another key's name.
  const sealed = new Uint8Array(await crypto.subtle.encrypt({ name: 'AES-GCM', iv, additionalData: new TextEncoder().encode(key.keyId) }, aes, body))
  const wrapped = new Uint8Array(await crypto.subtle.wrapKey('raw', aes, publicKey, RSA))
  return [SEAL_VERSION, key.keyId, toBase64url(wrapped), toBase64url(iv), toBase64url(sealed)].join('.')
}

export type OpenResult = { ok: true, claim: SealClaim } | { ok: false, reason: string }

/** Decrypts a seal with the server's private key and checks the claim's shape. */
export async function openSeal(privateKey: CryptoKey, keyId: string, seal: unknown): Promise<OpenResult> {
  if (typeof seal !== 'string' || seal.length > MAX_SEAL_LENGTH) return { ok: false, reason: 'The signature is not a sealed sign-off.' }
  const parts = seal.split('.')
  if (parts.length !== 5 || parts[0] !== SEAL_VERSION || !parts.slice(2).every(p => /^[\w-]+$/.test(p))) return { ok: false, reason: 'The signature is not a sealed sign-off.' }
  if (parts[1] !== keyId) return { ok: false, reason: 'The signature was sealed for another server key.' }
  try {
    const aes = await crypto.subtle.unwrapKey('raw', fromBase64url(parts[2]!), privateKey, RSA, { name: 'AES-GCM', length: 256 }, false, ['decrypt'])
    const body = await crypto.subtle.decrypt({ name: 'AES-GCM', iv: fromBase64url(parts[3]!), additionalData: new TextEncoder().encode(keyId) }, aes, fromBase64url(parts[4]!))
    const parsed = SealClaimSchema.safeParse(JSON.parse(new TextDecoder().decode(body)))
    return parsed.success ? { ok: true, claim: parsed.data } : { ok: false, reason: 'The sealed sign-off is incomplete.' }
  }
  catch {
    return { ok: false, reason: 'The signature could not be opened with this server\'s key.' }
  }
}

export interface SealTarget { runId: string, stepKey: string | null, signerId: number, eventId: string, at: string }

/**
 * Does the claim sign exactly this event, and is it still good at `now`? Returns the reason
 * when not. Pure, so the rules are tested without a server.
 */
export function bindingProblem(claim: SealClaim, target: SealTarget, now: number): string | null {
  if (claim.runId !== target.runId) return 'The signature was given for another run.'
  if (claim.eventId !== target.eventId) return 'The signature was given for another sign-off; a signature counts once, for the sign-off it was made for.'
  if (claim.stepKey !== target.stepKey) return claim.stepKey === null ? 'The signature was given for the whole run, not for this step.' : `The signature was given for step "${claim.stepKey}", not for this one.`
  if (claim.signerId !== target.signerId) return 'The signature is not from the person named as signer.'
  const made = Date.parse(claim.time)
  if (Math.abs(made - Date.parse(target.at)) > SEAL_EVENT_SKEW_MS) return 'The signature was not made together with this sign-off.'
  if (now - made > SEAL_LIFETIME_MS) return `The signature expired: it must reach the server within ${SEAL_LIFETIME_MS / 3_600_000} hours; sign again.`
  if (made - now > SEAL_EVENT_SKEW_MS + MAX_CLOCK_AHEAD_MS) return 'The signature\'s time is not believable; check the tablet\'s date and time.'
  return null
}

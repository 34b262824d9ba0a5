import { createCipheriv, createDecipheriv, createHash, randomBytes } from 'node:crypto'
import { inviteStatus } from '#shared/schemas/invite'
import type { DB } from './db'

// Invite links carry a one-time token; only its SHA-256 is stored (a leaked table holds no
// working links), so the link can be shown exactly once: in the e-mail.

export function newInviteToken() {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashInviteToken(token) }
}

export function hashInviteToken(token: string) {
  return createHash('sha256').update(token).digest('hex')
}

/** Stands in the outbox for the link until the worker sends the mail (sealed token beside it). */
export const INVITE_LINK_PLACEHOLDER = '[the invite link, added when this mail is sent]'

// The sealing key comes from the session secret, which lives outside the database, so a copy of
// the database (a backup) cannot open a sealed token.
function sealKey() {
  return createHash('sha256').update(`jogwise-invite-link:${useRuntimeConfig().session.password}`).digest()
}

/** AES-256-GCM: iv, tag and ciphertext in one base64url string. */
export function sealInviteToken(token: string) {
  const iv = randomBytes(12)
  const cipher = createCipheriv('aes-256-gcm', sealKey(), iv)
  const sealed = Buffer.concat([cipher.update(token, 'utf8'), cipher.final()])
  return Buffer.concat([iv, cipher.getAuthTag(), sealed]).toString('base64url')
}

/** The token again, or null when it was sealed under another secret or is damaged. */
export function openInviteToken(sealed: string): string | null {
  try {
    const raw = Buffer.from(sealed, 'base64url')
    const decipher = createDecipheriv('aes-256-gcm', sealKey(), raw.subarray(0, 12))
    decipher.setAuthTag(raw.subarray(12, 28))
    return Buffer.concat([decipher.update(raw.subarray(28)), decipher.final()]).toString('utf8')
  }
  catch {
    return null
  }
}

export function inviteLink(token: string) {
  return `${siteUrl()}/join/${token}`
}

const GONE: Record<string, string> = {
  accepted: 'This invite has already been used. Sign in with the e-mail address and password chosen then.',
  revoked: 'The owner withdrew this invite. Ask them for a new one.',
  expired: 'This invite has expired. Ask the owner to send a new one.',
  inviter: 'The person who sent this invite can no longer invite people. Ask an owner for a new one.',
}

/** 404 for a token nobody issued, 410 with the reason for one that no longer works. */
export function assertInviteUsable(row: { acceptedAt: Date | null, revokedAt: Date | null, expiresAt: Date } | undefined, inviter?: { active: boolean, role: string }) {
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Not found', message: 'No invite matches this link. Check that the whole link was opened.' })
  const status = inviteStatus(row)
  if (status !== 'pending') throw createError({ statusCode: 410, statusMessage: 'Gone', message: GONE[status], data: { status } })
  // An invite speaks for the owner who sent it: it dies with their owner role or their account.
  if (!inviter || !inviter.active || inviter.role !== 'owner') {
    throw createError({ statusCode: 410, statusMessage: 'Gone', message: GONE.inviter, data: { status: 'revoked' } })
  }
}

/** The inviter's standing, for assertInviteUsable. */
export async function inviterOf(db: DB | Parameters<Parameters<DB['transaction']>[0]>[0], invitedBy: number) {
  // The person who sent the invite
  const [row] = await db.select({ active: tables.users.active, role: tables.users.role }).from(tables.users)
    .where(eq(tables.users.id, invitedBy)).limit(1)
  return row
}

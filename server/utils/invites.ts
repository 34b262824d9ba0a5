import { createHash, randomBytes } from 'node:crypto'
import { inviteStatus } from '#shared/schemas/invite'

// Invite links carry a one-time token; only its SHA-256 is stored (a leaked table holds no
// working links), so the link can be shown exactly once: in the e-mail.

export function newInviteToken() {
  const token = randomBytes(32).toString('base64url')
  return { token, hash: hashInviteToken(token) }
}

export function hashInviteToken(token: string) {
  return createHash('sha256').update(token).digest('hex')
}

const GONE: Record<string, string> = {
  accepted: 'This invite has already been used. Sign in with the e-mail address and password chosen then.',
  revoked: 'The owner withdrew this invite. Ask them for a new one.',
  expired: 'This invite has expired. Ask the owner to send a new one.',
}

/** 404 for a token nobody issued, 410 with the reason for one that no longer works. */
export function assertInviteUsable(row: { acceptedAt: Date | null, revokedAt: Date | null, expiresAt: Date } | undefined) {
  if (!row) throw createError({ statusCode: 404, statusMessage: 'Not found', message: 'No invite matches this link. Check that the whole link was opened.' })
  const status = inviteStatus(row)
  if (status !== 'pending') throw createError({ statusCode: 410, statusMessage: 'Gone', message: GONE[status], data: { status } })
}

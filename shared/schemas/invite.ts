import { z } from 'zod'
import { ROLES } from '../types/roles'
import { LanguageCodeSchema } from './language'

const email = z.string({ error: 'Enter an e-mail address.' }).trim().toLowerCase()
  .max(254, 'That e-mail address is too long.')
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }))
const role = z.enum(ROLES, { error: `Role must be one of: ${ROLES.join(', ')}.` })
// 32 random bytes in base64url are 43 characters; anything else is a broken link.
const token = z.string({ error: 'The invite link has no token.' }).trim()
  .regex(/^[\w-]{43}$/, 'This invite link is not complete; open the link from the e-mail again.')
const name = z.string({ error: 'Enter your name.' }).trim().min(1, 'Enter your name.').max(120, 'Keep the name under 120 characters.')
const password = z.string({ error: 'Choose a password.' })
  .min(10, 'Use at least 10 characters for the password.')
  .max(200, 'Keep the password under 200 characters.')

/** `language`: the language of the invite e-mail (the owner's screen language when left out). */
export const InviteCreateSchema = z.object({ email, role, language: LanguageCodeSchema.optional() }).strict()
export type InviteCreateInput = z.infer<typeof InviteCreateSchema>

export const InviteTokenSchema = z.object({ token })

/** `language`: the screen language the person joined in; it starts their profile's choice. */
export const InviteAcceptSchema = z.object({ token, name, password, language: LanguageCodeSchema.optional() }).strict()
export type InviteAcceptInput = z.infer<typeof InviteAcceptSchema>

/** The join form: the same fields plus the password typed twice (checked in the browser only). */
export const InviteJoinFormSchema = z.object({ name, password, confirm: z.string() })
  .refine(v => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ; type the same one twice.' })

export const INVITE_STATUSES = ['pending', 'accepted', 'expired', 'revoked'] as const
export type InviteStatus = typeof INVITE_STATUSES[number]

export function inviteStatus(row: { acceptedAt: Date | string | null, revokedAt: Date | string | null, expiresAt: Date | string }, now = new Date()): InviteStatus {
  if (row.acceptedAt) return 'accepted'
  if (row.revokedAt) return 'revoked'
  return new Date(row.expiresAt).getTime() <= now.getTime() ? 'expired' : 'pending'
}

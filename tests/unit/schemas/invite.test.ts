import { randomBytes } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { InviteAcceptSchema, InviteCreateSchema, InviteJoinFormSchema, inviteStatus } from '../../../shared/schemas/invite'
import { toIssues } from '../../../shared/schemas/issues'

const paths = (r: { success: boolean, error?: any }) => r.success ? [] : toIssues(r.error).map(i => i.path)

describe('invite schemas', () => {
  it('lower-cases the address and knows the four roles', () => {
    expect(InviteCreateSchema.parse({ email: ' New.Person@Example.TEST ', role: 'trainee' })).toEqual({ email: 'new.person@example.test', role: 'trainee' })
    expect(paths(InviteCreateSchema.safeParse({ email: 'nope', role: 'manager' }))).toEqual(['email', 'role'])
  })

  // A token is 32 bytes in base64url (RFC 4648 §5, no padding): made here by Node's own crypto.
  it.each([
    [randomBytes(32).toString('base64url'), true],
    [randomBytes(32).toString('base64'), false], // may hold + / = : not a link-safe token
    [randomBytes(31).toString('base64url'), false],
    ['../../etc/passwd-aaaaaaaaaaaaaaaaaaaaaaaaaa', false],
  ])('accepts only a whole link token: %s', (token, ok) => {
    const r = InviteAcceptSchema.safeParse({ token, name: 'Ada Brook', password: 'long-enough-password' })
    // base64 of 32 bytes is 44 characters with "=" padding, so it can never pass.
    expect(r.success).toBe(ok)
  })

  it('asks for the password twice in the join form', () => {
    expect(paths(InviteJoinFormSchema.safeParse({ name: 'Ada', password: 'long-enough-password', confirm: 'long-enough-passw0rd' }))).toEqual(['confirm'])
    expect(paths(InviteJoinFormSchema.safeParse({ name: '', password: 'short', confirm: 'short' }))).toEqual(['name', 'password'])
  })
})

describe('inviteStatus', () => {
  const now = new Date('2026-03-01T12:00:00Z')
  it.each([
    [{ acceptedAt: null, revokedAt: null, expiresAt: '2026-03-01T12:00:01Z' }, 'pending'],
    [{ acceptedAt: null, revokedAt: null, expiresAt: '2026-03-01T12:00:00Z' }, 'expired'],
    [{ acceptedAt: '2026-02-28T09:00:00Z', revokedAt: null, expiresAt: '2026-02-27T00:00:00Z' }, 'accepted'],
    [{ acceptedAt: null, revokedAt: '2026-02-28T09:00:00Z', expiresAt: '2026-03-04T00:00:00Z' }, 'revoked'],
  ])('%j is %s', (row, status) => {
    expect(inviteStatus(row, now)).toBe(status)
  })
})

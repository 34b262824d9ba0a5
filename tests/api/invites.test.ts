import { createHash } from 'node:crypto'
import { afterAll, describe, expect, it } from 'vitest'
import { as, call, db, DEMO, otherShop, signIn } from './client'
import { deliveredMail, inviteLink } from './mail'

// Invites by e-mail: the link arrives through the real SMTP path (the fake server catches it),
// works once, runs out, can be withdrawn, and never crosses into another shop.

const stamp = Date.now()
const address = (n: string) => `invite-${n}-${stamp}@demo.jogwise.test`

async function invite(email: string, role = 'trainer', cookie?: string) {
  const res = await call('POST', '/api/invites', { cookie: cookie ?? await as('owner'), body: { email, role } })
  expect(res.status, res.text).toBe(201)
  const { mail } = await deliveredMail(`invite:${res.body.id}`)
  return { id: res.body.id as number, mail, ...inviteLink(mail.text) }
}

afterAll(async () => { await db().end() })

describe('sending an invite', () => {
  it.each([
    [{}, ['email', 'role']],
    [{ email: 'not an address', role: 'trainer' }, ['email']],
    [{ email: address('bad-role'), role: 'boss' }, ['role']],
    [{ email: address('extra'), role: 'operator', password: 'x' }, ['']],
  ])('answers 400 naming each bad field for %j', async (body, paths) => {
    const res = await call('POST', '/api/invites', { cookie: await as('owner'), body })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: any) => i.path).sort()).toEqual(paths)
    expect(res.body.data.issues.every((i: any) => i.message.length > 5)).toBe(true)
  })

  it('refuses a body that is not JSON with 400', async () => {
    const res = await call('POST', '/api/invites', { cookie: await as('owner'), raw: '{"email":' })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].message).toMatch(/JSON/)
  })

  it.each(['trainer', 'operator', 'trainee'] as const)('is the owner\'s alone: a %s gets 403', async (role) => {
    const res = await call('POST', '/api/invites', { cookie: await as(role), body: { email: address(`by-${role}`), role: 'operator' } })
    expect(res.status).toBe(403)
    const [[n]] = await db().query<any[]>('select count(*) as n from invites where email = ?', [address(`by-${role}`)])
    expect(Number(n.n)).toBe(0)
  })

  it('answers 409 for an address that already signs in, or already has a pending invite', async () => {
    const taken = await call('POST', '/api/invites', { cookie: await as('owner'), body: { email: DEMO.trainer, role: 'operator' } })
    expect(taken.status).toBe(409)
    expect(taken.body.data.issues[0]).toMatchObject({ path: 'email', message: expect.stringMatching(/already signs in/) })
    await invite(address('twice'))
    // Upper case is the same address (zod lower-cases it before the lookup).
    const again = await call('POST', '/api/invites', { cookie: await as('owner'), body: { email: address('twice').toUpperCase(), role: 'trainer' } })
    expect(again.status).toBe(409)
    expect(again.body.message).toMatch(/pending invite/)
  })

  it('mails a one-time link whose token is stored only as its SHA-256', async () => {
    const sent = await invite(address('hash'), 'operator')
    expect(sent.mail.to.map(t => t.address)).toEqual([address('hash')])
    expect(sent.url).toBe(`${process.env.NUXT_SITE_URL || process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'}/join/${sent.token}`)
    // 32 random bytes in base64url (RFC 4648 §5) are 43 characters.
    expect(Buffer.from(sent.token, 'base64url')).toHaveLength(32)
    const [[row]] = await db().query<any[]>('select * from invites where id = ?', [sent.id])
    // SHA-256 by Node's own crypto (FIPS 180-4), not the server's helper.
    expect(row.token_hash).toBe(createHash('sha256').update(sent.token).digest('hex'))
    expect(JSON.stringify(row)).not.toContain(sent.token)
    // 72 hours by default
    expect(Math.abs(new Date(row.expires_at).getTime() - new Date(row.created_at).getTime() - 72 * 3600_000)).toBeLessThan(5000)
  })
})

describe('accepting an invite', () => {
  it('shows the shop, sets name and password, signs the person in, and works only once', async () => {
    const sent = await invite(address('accept'), 'trainer')
    const preview = await call('GET', `/api/invites/preview?token=${sent.token}`)
    expect(preview.status).toBe(200)
    const [[shop]] = await db().query<any[]>('select s.name from shops s join invites i on i.shop_id = s.id where i.id = ?', [sent.id])
    expect(preview.body).toMatchObject({ shop: shop.name, email: address('accept'), role: 'trainer' })

    const bad = await call('POST', '/api/invites/accept', { body: { token: sent.token, name: ' ', password: 'short' } })
    expect(bad.status).toBe(400)
    expect(bad.body.data.issues.map((i: any) => i.path).sort()).toEqual(['name', 'password'])

    const res = await fetch(`${process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'}/api/invites/accept`, {
      method: 'POST', headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ token: sent.token, name: 'Ines Marlow', password: 'a-new-long-password' }),
    })
    expect(res.status).toBe(201)
    const cookie = res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    const me = await call('GET', '/api/me', { cookie })
    expect(me.body.user).toMatchObject({ name: 'Ines Marlow', email: address('accept'), role: 'trainer' })
    // The password works for a normal sign-in too.
    await signIn(address('accept'), 'a-new-long-password')

    const second = await call('POST', '/api/invites/accept', { body: { token: sent.token, name: 'Someone Else', password: 'another-long-password' } })
    expect(second.status).toBe(410)
    expect(second.body.message).toMatch(/already been used/)
    expect((await call('GET', `/api/invites/preview?token=${sent.token}`)).status).toBe(410)
    const [[n]] = await db().query<any[]>('select count(*) as n from users where email = ?', [address('accept')])
    expect(Number(n.n)).toBe(1)
    const [[audit]] = await db().query<any[]>('select * from audit_entries where kind = ? and subject_id = ?', ['invite.accepted', String(sent.id)])
    expect(audit.actor_id).toBe(me.body.user.id)
    const list = await call('GET', '/api/invites', { cookie: await as('owner') })
    expect(list.body.find((i: any) => i.id === sent.id).status).toBe('accepted')
  })

  it('answers 410 once the link has run out', async () => {
    const sent = await invite(address('expired'), 'operator')
    await db().query('update invites set expires_at = now(3) - interval 1 minute where id = ?', [sent.id])
    const preview = await call('GET', `/api/invites/preview?token=${sent.token}`)
    expect(preview.status).toBe(410)
    expect(preview.body.message).toMatch(/expired/)
    const accept = await call('POST', '/api/invites/accept', { body: { token: sent.token, name: 'Late Comer', password: 'a-new-long-password' } })
    expect(accept.status).toBe(410)
    const list = await call('GET', '/api/invites', { cookie: await as('owner') })
    expect(list.body.find((i: any) => i.id === sent.id).status).toBe('expired')
  })

  it('answers 404 for a well-formed token nobody issued and 400 for a broken link', async () => {
    const unknown = Buffer.alloc(32, 7).toString('base64url')
    expect((await call('GET', `/api/invites/preview?token=${unknown}`)).status).toBe(404)
    expect((await call('POST', '/api/invites/accept', { body: { token: unknown, name: 'Nobody', password: 'a-new-long-password' } })).status).toBe(404)
    const broken = await call('GET', '/api/invites/preview?token=abc')
    expect(broken.status).toBe(400)
    expect(broken.body.data.issues[0].path).toBe('token')
  })
})

describe('withdrawing an invite', () => {
  it('makes the link answer 410, and another shop cannot touch it', async () => {
    const sent = await invite(address('revoke'), 'operator')
    const other = await otherShop()
    const foreign = await call('POST', `/api/invites/${sent.id}/revoke`, { cookie: other.cookie })
    expect(foreign.status).toBe(404)
    expect(foreign.text).not.toContain(address('revoke'))
    expect((await call('GET', '/api/invites', { cookie: other.cookie })).body).toEqual([])

    const res = await call('POST', `/api/invites/${sent.id}/revoke`, { cookie: await as('owner') })
    expect(res.status).toBe(200)
    expect(res.body.status).toBe('revoked')
    const accept = await call('POST', '/api/invites/accept', { body: { token: sent.token, name: 'Too Late', password: 'a-new-long-password' } })
    expect(accept.status).toBe(410)
    expect(accept.body.message).toMatch(/withdrew/)
    // A new invite to the same address is allowed once the old one is withdrawn.
    expect((await call('POST', '/api/invites', { cookie: await as('owner'), body: { email: address('revoke'), role: 'operator' } })).status).toBe(201)
  })

  it('refuses to withdraw an accepted invite (409)', async () => {
    const sent = await invite(address('accepted-revoke'), 'operator')
    expect((await call('POST', '/api/invites/accept', { body: { token: sent.token, name: 'Quick Joiner', password: 'a-new-long-password' } })).status).toBe(201)
    const res = await call('POST', `/api/invites/${sent.id}/revoke`, { cookie: await as('owner') })
    expect(res.status).toBe(409)
  })
})

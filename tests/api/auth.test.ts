import { afterAll, describe, expect, it } from 'vitest'
import { as, call, db, DEMO, DEMO_PASSWORD, signIn } from './client'

afterAll(async () => { await db().end() })

describe('sign-in', () => {
  it('accepts the right password and answers who signed in', async () => {
    const res = await call('POST', '/api/auth/login', { body: { email: DEMO.operator, password: DEMO_PASSWORD } })
    expect(res.status).toBe(200)
    expect(res.body.user).toMatchObject({ email: DEMO.operator, role: 'operator' })
    expect(JSON.stringify(res.body)).not.toContain('password')
  })

  it('answers 401 with a clear message for a wrong password', async () => {
    const res = await call('POST', '/api/auth/login', { body: { email: DEMO.operator, password: 'wrong-password' } })
    expect(res.status).toBe(401)
    expect(res.body.message).toBe('That e-mail and password do not match a Jogwise account.')
  })

  it('answers the same 401 for an unknown e-mail (no hint which part was wrong)', async () => {
    const res = await call('POST', '/api/auth/login', { body: { email: 'nobody@demo.jogwise.test', password: 'whatever-it-is' } })
    expect(res.status).toBe(401)
    expect(res.body.message).toBe('That e-mail and password do not match a Jogwise account.')
  })

  it.each([
    [{ password: 'x' }, 'email'],
    [{ email: 'not-an-address', password: 'x' }, 'email'],
    [{ email: DEMO.owner }, 'password'],
    [{ email: DEMO.owner, password: '' }, 'password'],
    [{ email: DEMO.owner, password: 42 }, 'password'],
    [{ email: DEMO.owner, password: 'x', extra: true }, ''],
  ])('rejects %j naming the field %s', async (body, path) => {
    const res = await call('POST', '/api/auth/login', { body })
    expect(res.status).toBe(400)
    expect(res.body.data.issues.map((i: any) => i.path)).toContain(path)
  })

  it('rejects malformed JSON and an empty body with 400, not 500', async () => {
    expect((await call('POST', '/api/auth/login', { raw: '{"email":' })).status).toBe(400)
    expect((await call('POST', '/api/auth/login', { raw: '' })).status).toBe(400)
  })

  it('rejects an oversized body with 413 before reading it', async () => {
    const res = await call('POST', '/api/auth/login', { raw: JSON.stringify({ email: DEMO.owner, password: 'x'.repeat(3 * 1024 * 1024) }) })
    expect(res.status).toBe(413)
    expect(res.body.message).toContain('over 2 MB')
  })

  it('ends the session on sign-out', async () => {
    const cookie = await signIn(DEMO.operator)
    expect((await call('GET', '/api/me', { cookie })).status).toBe(200)
    const out = await fetch(`${process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3100'}/api/auth/logout`, { method: 'POST', headers: { cookie } })
    const cleared = out.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    expect((await call('GET', '/api/me', { cookie: cleared })).status).toBe(401)
  })

  it('a deactivated person is signed out at once and cannot sign in again', async () => {
    const owner = await as('owner')
    const email = `leaver-${Date.now()}@demo.jogwise.test`
    const made = await call('POST', '/api/users', { cookie: owner, body: { name: 'Leaver', email, role: 'operator', password: 'leaver-password' } })
    const cookie = await signIn(email, 'leaver-password')
    expect((await call('PATCH', `/api/users/${made.body.id}`, { cookie: owner, body: { active: false } })).status).toBe(200)
    expect((await call('GET', '/api/machines', { cookie })).status).toBe(401)
    const again = await call('POST', '/api/auth/login', { body: { email, password: 'leaver-password' } })
    expect(again.status).toBe(401)
    expect(again.body.message).toContain('deactivated')
  })
})

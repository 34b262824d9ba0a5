import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type AppServer } from '../support/app-server'
import { as, BASE_URL, call, db, DEMO, DEMO_PASSWORD } from './client'
import { seal } from './seal'

// Sign-in throttling, session cookie flags and security headers against the real server.
// Throttling is the practice of OWASP's Authentication Cheat Sheet ("Protect Against Automated
// Attacks"); cookie attributes are RFC 6265 section 4.1.2; header names and values are those of
// the W3C Content Security Policy Level 3 and Permissions Policy specs and MDN's HTTP headers.

const stamp = Date.now()
const created: string[] = []

async function login(email: string, password: string, headers: Record<string, string> = {}, base = BASE_URL) {
  const res = await fetch(`${base}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', ...headers }, body: JSON.stringify({ email, password }) })
  const text = await res.text()
  return { status: res.status, body: text ? JSON.parse(text) : undefined, headers: res.headers }
}

async function newPerson(role: 'operator' | 'trainer', extra: Record<string, unknown> = {}) {
  const email = `throttle-${role}-${stamp}-${created.length}@demo.jogwise.test`
  const made = await call('POST', '/api/users', { cookie: await as('owner'), body: { name: `Throttle ${role} ${created.length}`, email, role, password: 'right-password-1', ...extra } })
  if (made.status !== 201) throw new Error(made.text)
  created.push(email)
  return { email, id: made.body.id as number }
}

const failuresOf = async (email: string) => (await db().query<any[]>('select count(*) as n from sign_in_failures where email = ?', [email]))[0][0].n as number

afterAll(async () => {
  // Leave no failures behind for the tests that sign in after these (same loopback address).
  await db().query('delete from sign_in_failures where email like ?', [`throttle-%-${stamp}-%`])
  await db().query('delete from sign_in_failures where email like ?', [`nobody-${stamp}-%`])
  await db().end()
})

describe('sign-in throttling', () => {
  it('refuses the 6th try at one account within 15 minutes, right password included, with Retry-After', async () => {
    const { email } = await newPerson('operator')
    for (let i = 0; i < 5; i++) expect((await login(email, `wrong-${i}`)).status).toBe(401)
    const locked = await login(email, 'right-password-1')
    expect(locked.status).toBe(429)
    const retry = Number(locked.headers.get('retry-after'))
    // RFC 9110 section 10.2.3: Retry-After as delay-seconds; the oldest failure leaves the window in ≤ 15 min
    expect(retry).toBeGreaterThan(14 * 60)
    expect(retry).toBeLessThanOrEqual(15 * 60)
    expect(locked.body.message).toBe('Too many failed sign-ins. Try again in 15 minutes.')
    expect(locked.body.data.retryAfterSeconds).toBe(retry)
    expect(locked.headers.getSetCookie().join()).not.toContain('nuxt-session')
    // a refused try is not a failure of its own: the lock does not grow
    expect(await failuresOf(email)).toBe(5)
  })

  it('lets the account in again once its failures leave the window, and a success clears them', async () => {
    const { email } = await newPerson('operator')
    for (let i = 0; i < 5; i++) await login(email, `wrong-${i}`)
    expect((await login(email, 'right-password-1')).status).toBe(429)
    // The window slides: move the two oldest failures 16 minutes back, as if time had passed.
    await db().query('update sign_in_failures set at = at - interval 16 minute where email = ? order by at limit 2', [email])
    expect(await failuresOf(email)).toBe(5)
    const ok = await login(email, 'right-password-1')
    expect(ok.status).toBe(200)
    expect(await failuresOf(email)).toBe(0)
  })

  it('counts only failures: many right sign-ins in a row are never throttled', async () => {
    const { email } = await newPerson('operator')
    for (let i = 0; i < 12; i++) expect((await login(email, 'right-password-1')).status).toBe(200)
    expect(await failuresOf(email)).toBe(0)
  })

  it('does not count bad input (400) as a failure', async () => {
    const { email } = await newPerson('operator')
    for (let i = 0; i < 8; i++) expect((await login(email, '')).status).toBe(400)
    expect(await failuresOf(email)).toBe(0)
    expect((await login(email, 'right-password-1')).status).toBe(200)
  })

  it('throttles one address trying many accounts after 20 failures, whatever X-Forwarded-For says', async () => {
    const first = await login(`nobody-${stamp}-0@demo.jogwise.test`, 'guess', { 'x-forwarded-for': '203.0.113.1' })
    expect(first.status).toBe(401)
    const [[row]] = await db().query<any[]>('select address from sign_in_failures where email = ?', [`nobody-${stamp}-0@demo.jogwise.test`])
    // the socket's address, not the header the client wrote
    expect(row.address).not.toBe('203.0.113.1')
    const [[{ n }]] = await db().query<any[]>('select count(*) as n from sign_in_failures where address = ? and at > now(3) - interval 15 minute', [row.address])
    for (let i = 1; i < 20 - Number(n) + 1; i++) {
      expect((await login(`nobody-${stamp}-${i}@demo.jogwise.test`, 'guess', { 'x-forwarded-for': `203.0.113.${i + 1}` })).status).toBe(401)
    }
    // Another account, right password, same address: refused too
    const { email } = await newPerson('operator')
    const locked = await login(email, 'right-password-1', { 'x-forwarded-for': '198.51.100.7' })
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
    await db().query('delete from sign_in_failures where email like ?', [`nobody-${stamp}-%`])
    expect((await login(email, 'right-password-1')).status).toBe(200)
  })

  it('throttles the trainer PIN of a sign-off per signer, without locking their password sign-in', async () => {
    const trainer = await newPerson('trainer', { pin: '8642' })
    const machineId = (await call('GET', '/api/machines', { cookie: await as('owner') })).body[0].id
    const versionId = (await call('GET', '/api/procedures', { cookie: await as('owner') })).body[0].current.id
    const traineeId = (await call('GET', '/api/me', { cookie: await as('trainee') })).body.user.id
    const runId = uuidv7()
    const started = await call('POST', '/api/sync', { cookie: await as('trainee'), body: { deviceId: 'throttle', events: [{
      id: uuidv7(), runId, type: 'run.started', at: new Date().toISOString(), actorId: traineeId, deviceId: 'throttle', procedureVersionId: versionId, machineId, mode: 'guided',
    }] } })
    expect(started.body.accepted, started.text).toHaveLength(1)
    const cookie = await as('trainee')
    const check = async (pin: string) => call('POST', `/api/runs/${runId}/signoff-check`, { cookie, body: {
      seal: await seal(cookie, { runId, stepKey: null, signerId: trainer.id, eventId: uuidv7(), time: new Date().toISOString(), pin }),
    } })
    for (let i = 0; i < 5; i++) expect((await check(`000${i}`)).status).toBe(403)
    const locked = await check('8642')
    expect(locked.status).toBe(429)
    expect(locked.body.message).toMatch(/^Too many failed PIN or password tries for Throttle trainer \d+\. Try again in 15 minutes\.$/)
    // issue 18 (Low): a crew member typing wrong PINs must not lock the trainer out of signing in
    expect(await failuresOf(trainer.email)).toBe(0)
    expect((await login(trainer.email, 'right-password-1')).status).toBe(200)
    await db().query('delete from sign_in_failures where email = ?', [`signoff:${trainer.id}`])
  })
})

describe('session cookie', () => {
  it('is HttpOnly and SameSite=Lax, without Secure over plain http', async () => {
    const res = await login(DEMO.operator, DEMO_PASSWORD)
    const cookie = res.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))!
    expect(cookie).toMatch(/;\s*HttpOnly/i)
    expect(cookie).toMatch(/;\s*SameSite=Lax/i)
    expect(cookie).not.toMatch(/;\s*Secure/i)
  })

  it('ignores X-Forwarded-Proto from a client when no proxy is trusted', async () => {
    const res = await login(DEMO.operator, DEMO_PASSWORD, { 'x-forwarded-proto': 'https' })
    expect(res.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))).not.toMatch(/;\s*Secure/i)
  })

  it('ends on sign-out: the old cookie no longer works', async () => {
    const res = await login(DEMO.operator, DEMO_PASSWORD)
    const cookie = res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    expect((await call('GET', '/api/me', { cookie })).status).toBe(200)
    const out = await fetch(`${BASE_URL}/api/auth/logout`, { method: 'POST', headers: { cookie } })
    const cleared = out.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))!
    // RFC 6265 section 3.1: an expiry in the past removes the cookie
    expect(cleared).toMatch(/Max-Age=0/i)
    expect((await call('GET', '/api/me', { cookie: cleared.split(';')[0] })).status).toBe(401)
    // a copy of the cookie taken before the sign-out is refused too, and by the session read
    const copy = await call('GET', '/api/me', { cookie })
    expect(copy.status).toBe(401)
    expect(copy.body.message).toBe('This sign-in has ended. Sign in again.')
    const session = await call('GET', '/api/_auth/session', { cookie })
    expect(session.body?.user).toBeUndefined()
  })

  it('ends on deactivation: the person\'s cookie is refused at once, also by the session read', async () => {
    const { email, id } = await newPerson('operator')
    const res = await login(email, 'right-password-1')
    const cookie = res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    expect((await call('GET', '/api/_auth/session', { cookie })).body.user.email).toBe(email)
    expect((await call('PATCH', `/api/users/${id}`, { cookie: await as('owner'), body: { active: false } })).status).toBe(200)
    expect((await call('GET', '/api/me', { cookie })).status).toBe(401)
    expect((await call('GET', '/api/_auth/session', { cookie })).body?.user).toBeUndefined()
  })

  describe('behind a trusted HTTPS proxy (NUXT_TRUST_PROXY=1)', () => {
    let proxied: AppServer
    beforeAll(async () => { proxied = await startApp({ NUXT_TRUST_PROXY: '1' }) }, 60_000)
    afterAll(async () => { await proxied?.stop() })

    it('marks the session cookie Secure when the proxy says https, and not when it says http', async () => {
      const https = await login(DEMO.operator, DEMO_PASSWORD, { 'x-forwarded-proto': 'https', 'x-forwarded-for': '192.0.2.10' }, proxied.url)
      expect(https.status).toBe(200)
      const secure = https.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))!
      expect(secure).toMatch(/;\s*Secure/i)
      expect(secure).toMatch(/;\s*HttpOnly/i)
      const http = await login(DEMO.operator, DEMO_PASSWORD, { 'x-forwarded-proto': 'http', 'x-forwarded-for': '192.0.2.10' }, proxied.url)
      expect(http.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))).not.toMatch(/;\s*Secure/i)
    })

    it('counts failures by the address the proxy appended last', async () => {
      const email = `nobody-${stamp}-proxy@demo.jogwise.test`
      const res = await login(email, 'guess', { 'x-forwarded-for': '203.0.113.99, 192.0.2.44' }, proxied.url)
      expect(res.status).toBe(401)
      const [[row]] = await db().query<any[]>('select address from sign_in_failures where email = ?', [email])
      expect(row.address).toBe('192.0.2.44')
    })
  })
})

describe('security headers', () => {
  // Nitro's error handler answers API errors with its own stricter set: no referrer at all and
  // a policy that lets no script run (nitropack runtime error handler).
  const expectErrorHeaders = (h: Headers) => {
    expect(h.get('x-content-type-options')).toBe('nosniff')
    expect(h.get('x-frame-options')).toBe('DENY')
    expect(h.get('referrer-policy')).toBe('no-referrer')
    expect(h.get('permissions-policy')).toMatch(/(^|, )camera=\(self\)(,|$)/)
    expect(h.get('content-security-policy')).toMatch(/script-src 'none'.*frame-ancestors 'none'/)
  }
  const expectHeaders = (h: Headers) => {
    // MDN HTTP headers reference for each name and value
    expect(h.get('x-content-type-options')).toBe('nosniff')
    expect(h.get('x-frame-options')).toBe('DENY')
    expect(h.get('referrer-policy')).toBe('strict-origin-when-cross-origin')
    expect(h.get('permissions-policy')).toMatch(/(^|, )camera=\(self\)(,|$)/)
    const csp = h.get('content-security-policy')!
    const directives = Object.fromEntries(csp.split(';').map(d => d.trim().split(/\s+/)).map(([k, ...v]) => [k, v]))
    expect(directives['frame-ancestors']).toEqual(['\'none\''])
    expect(directives['object-src']).toEqual(['\'none\''])
    expect(directives['base-uri']).toEqual(['\'self\''])
    expect(directives['form-action']).toEqual(['\'self\''])
    expect(directives['script-src']).not.toContain('\'unsafe-inline\'')
    expect(directives['script-src']).not.toContain('\'unsafe-eval\'')
    return directives
  }

  it('are on a server-rendered page, whose inline scripts are allowed by hash only', async () => {
    const res = await fetch(`${BASE_URL}/login`)
    const html = await res.text()
    const directives = expectHeaders(res.headers)
    const inline = [...html.matchAll(/<script(?![^>]*\bsrc=)(?![^>]*type="application\/json")[^>]*>([\s\S]*?)<\/script>/g)].map(m => m[1]!)
    expect(inline.length).toBeGreaterThan(0)
    const { createHash } = await import('node:crypto')
    // CSP Level 3 section 8.4 (hash-source): base64 of the SHA-256 of the script's UTF-8 text
    for (const s of inline) expect(directives['script-src']).toContain(`'sha256-${createHash('sha256').update(s).digest('base64')}'`)
  })

  it('are on the prerendered app shell, compressed or not', async () => {
    for (const encoding of ['br', 'gzip', 'identity']) {
      const res = await fetch(`${BASE_URL}/shell`, { headers: { 'accept-encoding': encoding } })
      const html = await res.text()
      const directives = expectHeaders(res.headers)
      const inline = [...html.matchAll(/<script>([\s\S]*?)<\/script>/g)].map(m => m[1]!)
      const { createHash } = await import('node:crypto')
      for (const s of inline) expect(directives['script-src']).toContain(`'sha256-${createHash('sha256').update(s).digest('base64')}'`)
    }
  })

  it('are on a page that is not there, with the hashes of its own inline scripts', async () => {
    const res = await fetch(`${BASE_URL}/no-such-page`, { headers: { accept: 'text/html', cookie: await as('owner') } })
    expect(res.status).toBe(404)
    const html = await res.text()
    const directives = expectHeaders(res.headers)
    const { createHash } = await import('node:crypto')
    for (const [, s] of html.matchAll(/<script>([\s\S]*?)<\/script>/g)) expect(directives['script-src']).toContain(`'sha256-${createHash('sha256').update(s!).digest('base64')}'`)
  })

  it('are on an API answer, an error and the service worker', async () => {
    expectHeaders((await fetch(`${BASE_URL}/api/health`)).headers)
    const denied = await fetch(`${BASE_URL}/api/machines`)
    expect(denied.status).toBe(401)
    expectErrorHeaders(denied.headers)
    const bad = await call('POST', '/api/auth/login', { body: {} })
    expect(bad.status).toBe(400)
    expectHeaders((await fetch(`${BASE_URL}/sw.js`)).headers)
  })
})

import { spawn, spawnSync, type ChildProcess } from 'node:child_process'
import { existsSync } from 'node:fs'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { as, call, db, DEMO, DEMO_PASSWORD } from './client'
import { freePort } from '../support/app-server'
import { caughtMail, MAIL_API, outboxRow, sleep, until } from './mail'

// The SMTP server goes away while mail is being written: the mail waits in the outbox with its
// tries and the error, and once the server is back every mail arrives exactly once, even with
// two app processes (the suite's server and a second one started here) working the same outbox.

const ENTRY = process.env.JOGWISE_SERVER_ENTRY || '.data/test-output/server/index.mjs'
// The suite's fake SMTP server (scripts/maildev.sh name and ports), stopped and started again.
const FAKE = process.env.JOGWISE_MAILDEV_NAME || 'maildev-test'
const SMTP_PORT = process.env.NUXT_MAIL_SMTP_PORT || '3427'
const WEB_PORT = new URL(MAIL_API).port
let PORT = 0
let SECOND = ''
let server: ChildProcess | undefined

function fake(cmd: 'start' | 'stop') {
  const args = cmd === 'start' ? ['scripts/maildev.sh', 'start', FAKE, SMTP_PORT, WEB_PORT] : ['scripts/maildev.sh', 'stop', FAKE]
  const res = spawnSync('bash', args, { encoding: 'utf8' })
  if (res.status !== 0) throw new Error(`maildev ${cmd} failed: ${res.stdout}${res.stderr}`)
}
const fakeUp = () => fetch(`${MAIL_API}/api/healthz`).then(r => r.ok, () => false)

beforeAll(async () => {
  if (!existsSync(ENTRY)) throw new Error(`no build at ${ENTRY}; run npm test`)
  PORT = await freePort()
  SECOND = `http://127.0.0.1:${PORT}`
  // Same database and SMTP settings, but no caught-mail page (NUXT_MAIL_FAKE_API_URL empty).
  server = spawn(process.execPath, [ENTRY], { env: { ...process.env, PORT: String(PORT), HOST: '127.0.0.1', NUXT_DEMO_SEED: '', NUXT_MAIL_FAKE_API_URL: '' }, stdio: 'ignore' })
  await until('the second server', () => fetch(`${SECOND}/api/health`).then(r => r.ok, () => false), 30_000)
})
afterAll(async () => {
  if (!(await fakeUp())) fake('start')
  server?.kill('SIGTERM')
  await db().end()
})

describe('the mail outbox', () => {
  it('keeps mail while the SMTP server is down and delivers each exactly once after', async () => {
    expect(await fakeUp()).toBe(true)
    fake('stop')
    expect(await fakeUp()).toBe(false)

    const cookie = await as('owner')
    const stamp = Date.now()
    const ids: number[] = []
    for (let i = 0; i < 3; i++) {
      const res = await call('POST', '/api/invites', { cookie, body: { email: `outbox-${i}-${stamp}@demo.jogwise.test`, role: 'operator' } })
      expect(res.status, res.text).toBe(201)
      ids.push(res.body.id)
    }
    // Each waits with at least two failed tries and the reason (both processes keep trying).
    for (const id of ids) {
      const row = await until(`invite ${id} to fail twice`, async () => {
        const r = await outboxRow(`invite:${id}`)
        return r && r.attempts >= 2 ? r : undefined
      })
      expect(row.status).toBe('waiting')
      expect(row.last_error).toMatch(/ECONNREFUSED|connect/i)
      expect(row.message_id).toBeNull()
    }
    // The owner sees the same on the outbox page's API.
    const outbox = await call('GET', '/api/mail/outbox', { cookie })
    const waiting = outbox.body.items.find((m: any) => m.kind === 'invite' && m.to === `outbox-0-${stamp}@demo.jogwise.test`)
    expect(waiting).toMatchObject({ status: 'waiting', lastError: expect.any(String) })
    expect(waiting.attempts).toBeGreaterThanOrEqual(2)

    fake('start')
    const rows = []
    for (const id of ids) {
      rows.push(await until(`invite ${id} to be sent`, async () => {
        const r = await outboxRow(`invite:${id}`)
        return r?.status === 'sent' ? r : undefined
      }))
    }
    // Several worker ticks later, still one copy each: counted in the fake by Message-ID.
    await sleep(3000)
    const caught = await caughtMail()
    for (const row of rows) {
      expect(row.message_id).toMatch(new RegExp(`^<jogwise-outbox-${row.id}@`))
      const copies = caught.filter(m => m.headers['message-id'] === row.message_id)
      expect(copies, row.message_id!).toHaveLength(1)
      expect(copies[0]!.to.map(t => t.address)).toEqual([row.to_address])
      expect(copies[0]!.subject).toBe(row.subject)
      const after = await outboxRow(`invite:${ids[rows.indexOf(row)]}`)
      expect(after!.status).toBe('sent')
    }
  }, 90_000)

  it('hides the caught-mail list (404) on a server without the fake', async () => {
    const login = await fetch(`${SECOND}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: DEMO.owner, password: DEMO_PASSWORD }) })
    const cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    const res = await fetch(`${SECOND}/api/mail/caught`, { headers: { cookie, accept: 'application/json' } })
    expect(res.status).toBe(404)
    const outbox = await (await fetch(`${SECOND}/api/mail/outbox`, { headers: { cookie } })).json()
    expect(outbox.fakeInUse).toBe(false)
    // and the suite's server, with the fake, lists this shop's caught mail
    const here = await call('GET', '/api/mail/caught', { cookie: await as('owner') })
    expect(here.status).toBe(200)
    expect(here.body.length).toBeGreaterThan(0)
  })
})

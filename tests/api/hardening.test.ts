import { request } from 'node:http'
import { readFileSync } from 'node:fs'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type AppServer } from '../support/app-server'
import { as, BASE_URL, call, db, DEMO, otherShop, signIn } from './client'
import { deliveredMail, outboxRow } from './mail'

// Findings of the security review (issue 18, medium 5–7 and the low items) and the bare 431 of
// issue 13, each reproduced through the API against MariaDB. Status codes and headers are those
// of RFC 9110 (413, 415, 431 from RFC 6585), Fetch Metadata / Origin from the Fetch standard,
// Strict-Transport-Security from RFC 6797; a lone surrogate is ill-formed UTF-16 per Unicode
// section 3.9 (D91) and cannot be encoded in UTF-8 (RFC 3629).

const stamp = Date.now()
const ids: Record<string, number> = {}
let machineId: number
let versionId: number
let procedureId: number

const PROCEDURE = {
  title: `Hardening check ${stamp}`,
  summary: 'A short procedure with a spindle-hour check, used by the hardening checks.',
  category: 'daily',
  steps: [
    { key: 'prep', kind: 'instruction', title: 'Prepare the machine', body: 'Get the machine ready.' },
    { key: 'hours', kind: 'check', title: 'Read the spindle hours', body: 'Read the spindle hour counter.', label: 'Spindle hours', unit: 'h', min: 0, max: 100000 },
    { key: 'done', kind: 'instruction', title: 'Finish', body: 'Tidy the bench.' },
    { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The bench is tidy and the counter is read.' },
  ],
}

const now = () => new Date().toISOString()
function ev(runId: string, type: string, extra: Record<string, unknown> = {}, actor = 'owner', at = now()) {
  return { id: uuidv7(), runId, type, at, actorId: ids[actor], deviceId: 'tablet-h', ...extra }
}
const start = (runId: string, extra: Record<string, unknown> = {}) =>
  ev(runId, 'run.started', { procedureVersionId: versionId, machineId, mode: 'solo', ...extra })
const sync = async (events: unknown[], role: 'owner' | 'operator' = 'owner') =>
  call('POST', '/api/sync', { cookie: await as(role), body: { deviceId: 'tablet-h', events } })
const storedIds = async (runId: string) =>
  (await db().query<any[]>('select id from run_events where run_id = ?', [runId]))[0].map(r => r.id as string)

beforeAll(async () => {
  for (const role of ['owner', 'operator'] as const) ids[role] = (await call('GET', '/api/me', { cookie: await as(role) })).body.user.id
  const made = await call('POST', '/api/procedures', { cookie: await as('owner'), body: { procedure: PROCEDURE } })
  expect(made.status, made.text).toBe(201)
  versionId = made.body.versionId
  procedureId = made.body.id
  machineId = (await call('GET', '/api/machines', { cookie: await as('owner') })).body[0].id
})
const madePeople: number[] = []
afterAll(async () => {
  // Leave the shared demo shop as the browser tests expect it: no extra procedure in the
  // Library and Qualifications, no extra active people on the Crew screens.
  await call('POST', `/api/procedures/${procedureId}/retire`, { cookie: await as('owner') })
  for (const id of madePeople) await call('PATCH', `/api/users/${id}`, { cookie: await as('owner'), body: { active: false } })
  await db().end()
})

/** Resident memory of a process in bytes (Linux proc(5), VmRSS in kB). */
const rss = (pid: number) => Number(readFileSync(`/proc/${pid}/status`, 'utf8').match(/VmRSS:\s+(\d+)/)![1]) * 1024

/** Sends `total` bytes as a chunked body (no Content-Length) and stops once the answer comes. */
// pauseAt: after that many bytes the client stops and waits up to 15 s for an answer before it
// sends the rest, so a server that refuses early is seen to have refused before the rest was
// sent, whatever the machine's load. (A server past its limit reads and drops what still comes,
// so a client that kept writing could send the whole body before the answer reached it.)
function sendChunked(base: string, path: string, total: number, onProgress?: () => void, pauseAt = Number.POSITIVE_INFINITY) {
  return new Promise<{ status: number, body: string, sent: number, type: string }>((resolve, reject) => {
    const url = new URL(path, base)
    const req = request({ host: url.hostname, port: url.port, path: url.pathname, method: 'POST', headers: { 'content-type': 'application/json', 'transfer-encoding': 'chunked' } })
    const chunk = Buffer.alloc(64 * 1024, 'a')
    let sent = 0
    let answered = false
    let waited = false
    req.on('response', (res) => {
      answered = true
      let body = ''
      res.on('data', (d) => { body += d })
      res.on('end', () => resolve({ status: res.statusCode!, body, sent, type: String(res.headers['content-type']) }))
    })
    // The server may close the socket while bytes are still on their way; the answer counts.
    req.on('error', (e) => { if (!answered) reject(e) })
    const pump = () => {
      while (!answered && sent < total) {
        if (sent >= pauseAt && !waited) { waited = true; setTimeout(pump, 15_000); return }
        sent += chunk.length
        onProgress?.()
        if (!req.write(chunk)) { req.once('drain', pump); return }
      }
      if (!answered) req.end()
    }
    req.write('{"email":"')
    pump()
  })
}

describe('Medium 5: bodies are counted as they arrive', () => {
  let app: AppServer
  beforeAll(async () => { app = await startApp({}) }, 60_000)
  afterAll(async () => { await app?.stop() })

  it('answers a 30 MB chunked sign-in with 413 and a message, without buffering it', async () => {
    const before = rss(app.pid)
    let peak = before
    const res = await sendChunked(app.url, '/api/auth/login', 30 * 1024 * 1024, () => { peak = Math.max(peak, rss(app.pid)) }, 4 * 1024 * 1024)
    peak = Math.max(peak, rss(app.pid))
    console.log(`30 MB chunked sign-in: ${res.status} after ${(res.sent / 1024 / 1024).toFixed(1)} MB sent; server RSS ${((peak - before) / 1024 / 1024).toFixed(1)} MB above the ${(before / 1024 / 1024).toFixed(0)} MB before`)
    expect(res.status).toBe(413)
    expect(res.type).toMatch(/application\/json/)
    expect(JSON.parse(res.body).message).toMatch(/over 2 MB/)
    // Refused on the first 4 MB: the client waited there for the answer, which came before it
    // sent any more (a server that needed the whole body would have let it go on after 15 s).
    expect(res.sent).toBe(4 * 1024 * 1024)
    // The review saw +117 MB; a 2 MB buffer plus socket buffers stays far below 40 MB.
    expect(peak - before).toBeLessThan(40 * 1024 * 1024)
    // The server still answers.
    expect((await fetch(`${app.url}/api/health`)).status).toBe(200)
  }, 60_000)

  it('counts chunked bodies on the session routes, /api/sync and photo uploads too', async () => {
    const owner = await as('owner')
    for (const [method, path, limit] of [['POST', '/api/sync', 2], ['PUT', `/api/uploads/${uuidv7()}?runId=${uuidv7()}`, 11]] as const) {
      const res = await new Promise<{ status: number, body: string }>((resolve, reject) => {
        const url = new URL(path, BASE_URL)
        const req = request({ host: url.hostname, port: url.port, path: url.pathname + url.search, method, headers: { 'cookie': owner, 'content-type': method === 'PUT' ? 'image/png' : 'application/json', 'transfer-encoding': 'chunked' } })
        let answered = false
        req.on('response', (r) => {
          answered = true
          let body = ''
          r.on('data', (d) => { body += d })
          r.on('end', () => resolve({ status: r.statusCode!, body }))
        })
        req.on('error', (e) => { if (!answered) reject(e) })
        const chunk = Buffer.alloc(256 * 1024, 'a')
        let sent = 0
        const pump = () => {
          while (!answered && sent < (limit + 4) * 1024 * 1024) {
            sent += chunk.length
            if (!req.write(chunk)) { req.once('drain', pump); return }
          }
          if (!answered) req.end()
        }
        pump()
      })
      expect(res.status, `${method} ${path}`).toBe(413)
      expect(JSON.parse(res.body).message).toMatch(new RegExp(`over ${limit} MB`))
    }
  }, 60_000)
})

describe('Medium 6: ill-formed text', () => {
  it('refuses a lone surrogate in a new machine with 400 naming the field, and stores nothing', async () => {
    const name = `Router \ud800 ${stamp}`
    const body = { name, travelXMm: 600, travelYMm: 400, travelZMm: 100, units: 'mm', spindleKind: 'trim-router', hasLengthSensor: false, spoilboardMaterial: 'MDF', spoilboardNominalMm: 18, spoilboardMinMm: 12 }
    // JSON.stringify writes a lone surrogate as the escape \ud800 (ECMA-262, well-formed JSON.stringify).
    expect(JSON.stringify(name)).toContain('\\ud800')
    for (let i = 0; i < 2; i++) {
      const res = await call('POST', '/api/machines', { cookie: await as('owner'), body })
      expect(res.status).toBe(400)
      expect(res.body.data.issues).toEqual([{ path: 'name', message: expect.stringMatching(/surrogate/) }])
    }
    const [[n]] = await db().query<any[]>('select count(*) as n from machines where name like ?', [`Router % ${stamp}`])
    expect(Number(n.n)).toBe(0)
    // A good machine is one row and one audit line, written together.
    const good = await call('POST', '/api/machines', { cookie: await as('owner'), body: { ...body, name: `Router ${stamp}` } })
    expect(good.status).toBe(201)
    const [audit] = await db().query<any[]>('select kind from audit_entries where subject_type = ? and subject_id = ?', ['machine', String(good.body.id)])
    expect(audit.map(a => a.kind)).toEqual(['machine.created'])
  })

  it('refuses a lone surrogate in a person\'s name and in a field name', async () => {
    const res = await call('PATCH', `/api/users/${ids.operator}`, { cookie: await as('owner'), body: { name: 'Oper\udc00ator' } })
    expect(res.status).toBe(400)
    expect(res.body.data.issues[0].path).toBe('name')
    const [[user]] = await db().query<any[]>('select name from users where id = ?', [ids.operator])
    expect(user.name).not.toContain('\udc00')
    const key = await call('POST', '/api/auth/login', { raw: '{"email":"a@b.test","password":"x","\\ud800":1}' })
    expect(key.status).toBe(400)
    expect(key.body.data.issues[0].message).toMatch(/surrogate/)
  })

  it('in /api/sync refuses only the event with a lone surrogate, names the field, and stores the rest', async () => {
    const runId = uuidv7()
    const good = [start(runId), ev(runId, 'step.done', { stepKey: 'prep' })]
    const bad = ev(runId, 'note.added', { stepKey: 'prep', text: 'Dust shoe \ud800 loose' })
    const res = await sync([...good, bad])
    expect(res.status).toBe(200)
    expect(res.body.accepted.sort()).toEqual(good.map(e => e.id).sort())
    expect(res.body.rejected).toEqual([{ id: bad.id, reason: expect.stringMatching(/^text: .*surrogate/) }])
    expect((await storedIds(runId)).sort()).toEqual(good.map(e => e.id).sort())
  })

  it('counts an override as accepted only with its row stored, and alerts only then', async () => {
    const runId = uuidv7()
    const override = ev(runId, 'hold.overridden', { stepKey: 'prep', reason: 'Guard \udbff checked by hand before the override.' })
    const res = await sync([start(runId), override])
    expect(res.body.accepted).not.toContain(override.id)
    expect(res.body.rejected.map((r: any) => r.id)).toEqual([override.id])
    const [[alerts]] = await db().query<any[]>('select count(*) as n from mail_outbox where dedupe_key like ?', [`override:${override.id}:%`])
    expect(Number(alerts.n)).toBe(0)
  })
})

describe('Medium 7: finite numbers that overflow', () => {
  it('rejects a 3e303 spindle-hour reading on its own; the good events are stored and the next batch goes through', async () => {
    const runId = uuidv7()
    const good = [start(runId), ev(runId, 'step.done', { stepKey: 'prep' })]
    const poison = ev(runId, 'value.recorded', { stepKey: 'hours', value: 3e303, unit: 'h' })
    const after = ev(runId, 'note.added', { stepKey: 'hours', text: 'Counter read again below.' })
    const first = await sync([...good, poison, after])
    expect(first.status).toBe(200)
    expect(first.body.accepted.sort()).toEqual([...good, after].map(e => e.id).sort())
    expect(first.body.rejected).toEqual([{ id: poison.id, reason: expect.stringMatching(/^value: /) }])

    const next = [ev(runId, 'value.recorded', { stepKey: 'hours', value: 1234.5, unit: 'h' }), ev(runId, 'step.done', { stepKey: 'hours' })]
    const second = await sync(next)
    expect(second.status).toBe(200)
    expect(second.body.accepted.sort()).toEqual(next.map(e => e.id).sort())
    // 1234.5 h × 60 = 74070 spindle minutes (one hour is sixty minutes).
    const [[run]] = await db().query<any[]>('select spindle_minutes from runs where id = ?', [runId])
    expect(Number(run.spindle_minutes)).toBe(74070)
  })

  it('refuses huge finite numbers in any body, query or id with a 400 naming the field', async () => {
    const owner = await as('owner')
    const cases: [string, string, unknown, string][] = [
      ['POST', '/api/maintenance-intervals', { procedureId, machineId, everyDays: null, everySpindleHours: 7e306 }, 'everySpindleHours'],
      ['PUT', '/api/qualifications', { userId: 1e300, procedureId, qualified: true }, 'userId'],
      ['POST', '/api/sync', { deviceId: 'tablet-h', since: 1e308, events: [] }, 'since'],
      ['POST', '/api/auth/login', { email: 'a@b.test', password: 'x', extra: 9e300 }, 'extra'],
    ]
    for (const [method, path, body, field] of cases) {
      const res = await call(method, path, { cookie: owner, body })
      expect(res.status, `${method} ${path}`).toBe(400)
      expect(res.body.data.issues.map((i: any) => i.path), `${method} ${path}`).toContain(field)
    }
    expect((await call('GET', '/api/runs?machineId=3e303', { cookie: owner })).status).toBe(400)
    expect((await call('GET', '/api/machines/99999999999999', { cookie: owner })).status).toBe(404)
  })
})

describe('Low: invites', () => {
  it('keeps no working link in the outbox: the link is sealed beside the row and cleared once sent', async () => {
    const email = `sealed-${stamp}@demo.jogwise.test`
    const res = await call('POST', '/api/invites', { cookie: await as('owner'), body: { email, role: 'operator' } })
    expect(res.status).toBe(201)
    const waiting = await outboxRow(`invite:${res.body.id}`)
    expect(waiting!.text_body).not.toMatch(/\/join\//)
    const { row, mail } = await deliveredMail(`invite:${res.body.id}`)
    const token = mail.text.match(/\/join\/([\w-]+)/)![1]!
    const [[stored]] = await db().query<any[]>('select * from mail_outbox where id = ?', [row.id])
    expect(JSON.stringify(stored)).not.toContain(token)
    expect(stored.link_secret).toBeNull()
  })

  it('dies when its inviter is deactivated or loses the owner role', async () => {
    const owner = await as('owner')
    for (const change of [{ active: false }, { role: 'trainer' }]) {
      const email = `second-owner-${stamp}-${Object.keys(change)[0]}@demo.jogwise.test`
      const made = await call('POST', '/api/users', { cookie: owner, body: { name: 'Second Owner', email, role: 'owner', password: 'second-owner-pass' } })
      expect(made.status).toBe(201)
      madePeople.push(made.body.id)
      const second = await signIn(email, 'second-owner-pass')
      const sent = await call('POST', '/api/invites', { cookie: second, body: { email: `by-second-${stamp}-${Object.keys(change)[0]}@demo.jogwise.test`, role: 'operator' } })
      expect(sent.status).toBe(201)
      const { mail } = await deliveredMail(`invite:${sent.body.id}`)
      const token = mail.text.match(/\/join\/([\w-]+)/)![1]!
      expect((await call('GET', `/api/invites/preview?token=${token}`)).status).toBe(200)
      expect((await call('PATCH', `/api/users/${made.body.id}`, { cookie: owner, body: change })).status).toBe(200)
      const preview = await call('GET', `/api/invites/preview?token=${token}`)
      expect(preview.status).toBe(410)
      expect(preview.body.message).toMatch(/can no longer invite/)
      const accept = await call('POST', '/api/invites/accept', { body: { token, name: 'Too Late', password: 'a-long-password-1' } })
      expect(accept.status).toBe(410)
    }
  })

  it('answers an owner the same for another shop\'s address as for a new one', async () => {
    const other = await otherShop()
    const [[elsewhere]] = await db().query<any[]>('select email from users where shop_id = ? limit 1', [other.shopId])
    const fresh = await call('POST', '/api/invites', { cookie: await as('owner'), body: { email: `fresh-${stamp}@demo.jogwise.test`, role: 'operator' } })
    const taken = await call('POST', '/api/invites', { cookie: await as('owner'), body: { email: elsewhere.email, role: 'operator' } })
    expect(taken.status).toBe(fresh.status)
    expect(Object.keys(taken.body).sort()).toEqual(Object.keys(fresh.body).sort())
    expect(taken.body.status).toBe('pending')
    // The address's owner is told, without a link.
    const { mail } = await deliveredMail(`invite:${taken.body.id}`)
    expect(mail.text).not.toMatch(/\/join\//)
    // Direct creation: one answer whether the address is in this shop or another.
    const body = (email: string) => ({ name: 'Same Answer', email, role: 'operator', password: 'a-long-password-1' })
    const mine = await call('POST', '/api/users', { cookie: await as('owner'), body: body(DEMO.operator) })
    const theirs = await call('POST', '/api/users', { cookie: await as('owner'), body: body(elsewhere.email) })
    expect(theirs.status).toBe(mine.status)
    expect(theirs.body.message).toBe(mine.body.message)
  })
})

describe('Low: state changes take JSON from our own pages only', () => {
  it('refuses a form-encoded cross-port POST that would create a user, and stores nothing', async () => {
    const email = `csrf-${stamp}@demo.jogwise.test`
    const form = new URLSearchParams({ name: 'Forged', email, role: 'owner', password: 'forged-password-1' }).toString()
    const crossPort = new URL(BASE_URL)
    crossPort.port = String(Number(crossPort.port) + 1)
    const attempts: Record<string, string>[] = [
      { 'content-type': 'application/x-www-form-urlencoded', 'origin': crossPort.origin, 'sec-fetch-site': 'same-site' },
      { 'content-type': 'application/x-www-form-urlencoded' },
      { 'content-type': 'text/plain', 'origin': crossPort.origin },
      { 'content-type': 'application/json', 'origin': crossPort.origin },
    ]
    for (const headers of attempts) {
      const res = await call('POST', '/api/users', { cookie: await as('owner'), raw: headers['content-type'] === 'application/json' ? JSON.stringify({ name: 'Forged', email, role: 'owner', password: 'forged-password-1' }) : form, headers })
      expect([403, 415], JSON.stringify(headers)).toContain(res.status)
      expect(res.body.message.length).toBeGreaterThan(10)
    }
    const [[n]] = await db().query<any[]>('select count(*) as n from users where email = ?', [email])
    expect(Number(n.n)).toBe(0)
    // Our own page's request (same origin) still works.
    const own = await call('POST', '/api/users', { cookie: await as('owner'), body: { name: 'Own Page', email, role: 'operator', password: 'own-page-password' }, headers: { 'origin': new URL(BASE_URL).origin, 'sec-fetch-site': 'same-origin' } })
    expect(own.status).toBe(201)
    madePeople.push(own.body.id)
  })
})

describe('Low: runs and versions', () => {
  it('refuses a new run on a superseded version unless the tablet started it before the new version', async () => {
    const before = new Date(Date.now() - 60_000).toISOString()
    const published = await call('PUT', `/api/procedures/${procedureId}`, { cookie: await as('owner'), body: { procedure: PROCEDURE, changeNote: 'Second version' } })
    expect(published.status, published.text).toBe(200)
    const late = uuidv7()
    const lateRes = await sync([start(late)])
    expect(lateRes.body.rejected).toEqual([{ id: expect.any(String), reason: expect.stringMatching(/was published before the run started/) }])
    const offline = uuidv7()
    const offlineRes = await sync([ev(offline, 'run.started', { procedureVersionId: versionId, machineId, mode: 'solo' }, 'owner', before)])
    expect(offlineRes.body.rejected).toEqual([])
    versionId = published.body.versionId
    expect((await sync([start(uuidv7())])).body.rejected).toEqual([])
  })

  it('caps the notes of one run, and so the size of the run', async () => {
    const runId = uuidv7()
    const text = 'n'.repeat(2000)
    const notes = Array.from({ length: 501 }, (_, i) => ev(runId, 'note.added', { text: `${i} ${text}`.slice(0, 2000) }))
    const first = await sync([start(runId), ...notes.slice(0, 499)])
    expect(first.body.accepted).toHaveLength(500)
    const second = await sync(notes.slice(499))
    expect(second.body.accepted).toEqual([notes[499]!.id])
    expect(second.body.rejected).toEqual([{ id: notes[500]!.id, reason: expect.stringMatching(/500 notes/) }])
    // The review's 10,000 notes made 21 MB; the cap keeps a run near 1 MB.
    const run = await call('GET', `/api/runs/${runId}`, { cookie: await as('owner') })
    expect(run.status).toBe(200)
    expect(run.text.length).toBeLessThan(1.5 * 1024 * 1024)
  }, 60_000)
})

describe('Low: headers and health', () => {
  it('says whether the server is ready, never how many shops there are', async () => {
    const res = await call('GET', '/api/health')
    expect(res.body).toEqual({ ok: true, ready: true })
  })

  it('allows only the build\'s inline scripts: the same hashes on every page, none for an injected one', async () => {
    const policies = new Set<string>()
    for (const path of ['/', '/shell', '/no-such-page']) policies.add((await fetch(`${BASE_URL}${path}`)).headers.get('content-security-policy')!)
    expect(policies.size).toBe(1)
    const [policy] = [...policies]
    const { createHash } = await import('node:crypto')
    const injected = createHash('sha256').update('alert(document.cookie)').digest('base64')
    expect(policy).not.toContain(injected)
    expect(policy).toMatch(/script-src 'self' 'wasm-unsafe-eval'( 'sha256-[\w+/=]+')+;/)
  })

  it('sends Strict-Transport-Security over HTTPS only', async () => {
    const app = await startApp({ NUXT_TRUST_PROXY: '1' })
    try {
      const https = await fetch(`${app.url}/api/health`, { headers: { 'x-forwarded-proto': 'https' } })
      // RFC 6797 section 6.1: max-age in seconds; one year.
      expect(https.headers.get('strict-transport-security')).toBe('max-age=31536000')
      expect((await fetch(`${app.url}/api/health`)).headers.get('strict-transport-security')).toBeNull()
    }
    finally { await app.stop() }
  }, 60_000)

  it('answers an address over 16 KB with a JSON 431 and a message (issue 13)', async () => {
    const res = await fetch(`${BASE_URL}/api/machines?q=${'x'.repeat(20_000)}`)
    expect(res.status).toBe(431)
    expect(res.headers.get('content-type')).toMatch(/application\/json/)
    expect((await res.json()).message).toMatch(/too long/)
  })
})

describe('Low: the daily digest', () => {
  it('is stored in a column that holds more than 64 KB', async () => {
    const [[column]] = await db().query<any[]>('select data_type from information_schema.columns where table_schema = database() and table_name = ? and column_name = ?', ['mail_outbox', 'text_body'])
    // MariaDB data-type storage requirements: MEDIUMTEXT holds up to 16 MB, TEXT 64 KB.
    expect(column.data_type).toBe('mediumtext')
  })
})

import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { startApp, type AppServer } from '../support/app-server'
import { as, BASE_URL, DEMO, DEMO_PASSWORD, db } from './client'

// Two app servers on one database, as behind a load balancer on a Galera cluster: the suite's
// server (A) and the same build started once more (B) with the same settings and the same
// session secret. What one process used to keep for itself must hold across both.

let b: AppServer
const ids: Record<string, number> = {}
let versionId: number
let machineId: number

const STEPS = Array.from({ length: 12 }, (_, i) => ({ key: `s${i + 1}`, kind: 'instruction', title: `Cluster step ${i + 1}`, body: `Do part ${i + 1} of the work.` }))
// Every procedure ends with a sign-off (shared/procedures/schema.ts); the runs here never reach it.
const SIGN = { key: 'sign', kind: 'signoff', title: 'Sign off', body: 'Sign the run.', statement: 'The work is done and the machine is safe.' }

async function post(url: string, path: string, cookie: string, body: unknown) {
  const res = await fetch(url + path, { method: 'POST', headers: { 'content-type': 'application/json', 'accept': 'application/json', cookie }, body: JSON.stringify(body) })
  const text = await res.text()
  return { status: res.status, body: text ? JSON.parse(text) : undefined }
}
async function get(url: string, path: string, cookie: string) {
  const res = await fetch(url + path, { headers: { accept: 'application/json', cookie } })
  const text = await res.text()
  return { status: res.status, body: text ? JSON.parse(text) : undefined }
}
async function login(url: string, email: string, password: string) {
  return fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json', 'accept': 'application/json' }, body: JSON.stringify({ email, password }) })
}

beforeAll(async () => {
  b = await startApp({})
  for (const role of ['owner', 'operator'] as const) ids[role] = (await get(BASE_URL, '/api/me', await as(role))).body.user.id
  const made = await post(BASE_URL, '/api/procedures', await as('owner'), { procedure: { title: 'Cluster merge procedure', summary: 'Twelve plain steps, for the two-server merge checks.', category: 'daily', steps: [...STEPS, SIGN] } })
  expect(made.status, JSON.stringify(made.body)).toBe(201)
  versionId = made.body.versionId
  machineId = (await get(BASE_URL, '/api/machines', await as('owner'))).body[0].id
})
afterAll(async () => {
  await b?.stop()
  await db().end()
})

const at = (round: number, minute: number) => new Date(Date.UTC(2026, 1, 2, 8 + round, minute)).toISOString()
const ev = (runId: string, type: string, round: number, minute: number, extra: Record<string, unknown> = {}) =>
  ({ id: uuidv7(), runId, type, at: at(round, minute), actorId: ids.operator, deviceId: 'cluster-tablet', ...extra })

describe('two app servers on one database', () => {
  it('accepts a session made on one server on the other (the same NUXT_SESSION_PASSWORD)', async () => {
    const cookie = await as('operator')
    const me = await get(b.url, '/api/me', cookie)
    expect(me.status).toBe(200)
    expect(me.body.user.email).toBe(DEMO.operator)
  })

  it('merges events of the same run sent to both servers at the same moment: both converge, nothing is doubled', async () => {
    const cookie = await as('operator')
    for (let round = 0; round < 6; round++) {
      const runId = uuidv7()
      const control = uuidv7()
      const started = ev(runId, 'run.started', round, 0, { procedureVersionId: versionId, machineId, mode: 'guided' })
      expect((await post(BASE_URL, '/api/sync', cookie, { deviceId: 'cluster-tablet', events: [started] })).status).toBe(200)
      // Steps 1-6 go to A and 7-12 to B, at once; one event is sent to both.
      const done = STEPS.map((s, i) => ev(runId, 'step.done', round, i + 1, { stepKey: s.key }))
      const shared = ev(runId, 'note.added', round, 30, { stepKey: 's12', text: 'Sent to both servers.' })
      const [toA, toB] = await Promise.all([
        post(BASE_URL, '/api/sync', cookie, { deviceId: 'cluster-tablet', events: [...done.slice(0, 6), shared] }),
        post(b.url, '/api/sync', cookie, { deviceId: 'cluster-tablet', events: [...done.slice(6), shared] }),
      ])
      expect(toA.status).toBe(200)
      expect(toB.status).toBe(200)
      expect(toA.body.rejected).toEqual([])
      expect(toB.body.rejected).toEqual([])
      expect(toA.body.accepted).toContain(shared.id)
      expect(toB.body.accepted).toContain(shared.id)

      // Every event stored exactly once, and the trigger counted each once
      const all = [started, ...done, shared]
      const [rows] = await db().query<any[]>('select id from run_events where run_id = ? order by id', [runId])
      expect(rows.map(r => r.id)).toEqual(all.map(e => e.id).sort())
      const [[merges]] = await db().query<any[]>('select merges from run_merges where run_id = ?', [runId])
      expect(merges.merges).toBe(all.length)

      // The same events in one batch to one server, for the summary a single merge gives
      const controlEvents = all.map(e => ({ ...e, id: uuidv7(), runId: control }))
      expect((await post(BASE_URL, '/api/sync', cookie, { deviceId: 'cluster-tablet', events: controlEvents })).status).toBe(200)
      const [[summary]] = await db().query<any[]>('select status, current_step_key, finished_at from runs where id = ?', [runId])
      const [[expected]] = await db().query<any[]>('select status, current_step_key, finished_at from runs where id = ?', [control])
      expect(summary).toEqual(expected)

      // Both servers give the same run with all its events
      const [fromA, fromB] = await Promise.all([get(BASE_URL, `/api/runs/${runId}`, cookie), get(b.url, `/api/runs/${runId}`, cookie)])
      expect(fromA.status).toBe(200)
      expect(fromB.body).toEqual(fromA.body)
      expect(JSON.stringify(fromA.body)).toContain(done[11]!.id)
    }
  })

  it('counts failed sign-ins across both servers: 5 failures spread over two servers lock the account', async () => {
    const email = `cluster-throttle-${Date.now()}@demo.jogwise.test`
    try {
      for (let i = 0; i < 5; i++) {
        const res = await login(i % 2 ? b.url : BASE_URL, email, 'wrong-password-1')
        expect(res.status).toBe(401)
      }
      // OWASP Authentication Cheat Sheet practice as in sign-in-throttle.ts: 5 per account per 15 min
      for (const url of [BASE_URL, b.url]) {
        const res = await login(url, email, 'wrong-password-1')
        expect(res.status).toBe(429)
        expect(Number(res.headers.get('retry-after'))).toBeGreaterThan(0)
      }
    }
    finally {
      // The loopback address is shared with the rest of the suite
      await db().query('delete from sign_in_failures where email = ?', [email])
    }
  })

  it('ends a session signed out on one server on the other too', async () => {
    const res = await login(BASE_URL, DEMO.owner, DEMO_PASSWORD)
    expect(res.status).toBe(200)
    const cookie = res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    expect((await get(b.url, '/api/me', cookie)).status).toBe(200)
    const out = await fetch(`${b.url}/api/auth/logout`, { method: 'POST', headers: { cookie } })
    expect(out.status).toBeLessThan(300)
    const [[row]] = await db().query<any[]>('select count(*) as n from revoked_sessions where until > now(3)')
    expect(Number(row.n)).toBeGreaterThan(0)
    // The copy of the cookie is refused by both servers
    for (const url of [BASE_URL, b.url]) {
      const me = await get(url, '/api/me', cookie)
      expect(me.status).toBe(401)
      expect(me.body.message).toBe('This sign-in has ended. Sign in again.')
    }
  })

  it('lets one server at a time send mail, through the mail-sender lease row', async () => {
    // Both workers tick every NUXT_MAIL_WORKER_INTERVAL_MS; after a few ticks one holds the lease.
    await new Promise(r => setTimeout(r, 2500))
    const [leases] = await db().query<any[]>('select holder, expires_at from worker_leases where name = ?', ['mail-sender'])
    expect(leases).toHaveLength(1)
    const holder = leases[0].holder as string
    // The holder keeps it: a second look some ticks later finds the same process, renewed.
    await new Promise(r => setTimeout(r, 2000))
    const [[again]] = await db().query<any[]>('select holder, expires_at from worker_leases where name = ?', ['mail-sender'])
    expect(again.holder).toBe(holder)
    expect(new Date(again.expires_at).getTime()).toBeGreaterThan(new Date(leases[0].expires_at).getTime())
  })
})

import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync } from 'node:fs'
import { v7 as uuidv7 } from 'uuid'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { freePort } from '../support/app-server'
import { call, db, DEMO, DEMO_PASSWORD, signIn } from './client'

// The app process killed in the middle of a sync batch and started again: the tablet sends
// the same batch again, and the database ends with every event exactly once.

const ENTRY = process.env.JOGWISE_SERVER_ENTRY || '.data/test-output/server/index.mjs'
let PORT = 0
let URL_ = ''
let server: ChildProcess | undefined

async function startServer() {
  server = spawn(process.execPath, [ENTRY], { env: { ...process.env, PORT: String(PORT), HOST: '127.0.0.1', NUXT_DEMO_SEED: '' }, stdio: 'ignore' })
  for (let i = 0; i < 120; i++) {
    try { if ((await fetch(`${URL_}/api/health`)).ok) return }
    catch {}
    await new Promise(r => setTimeout(r, 250))
  }
  throw new Error('the second server did not start')
}
function killServer() {
  server?.kill('SIGKILL')
  return new Promise(r => server!.once('exit', r))
}

beforeAll(async () => {
  if (!existsSync(ENTRY)) throw new Error(`no build at ${ENTRY}; run npm test`)
  PORT = await freePort()
  URL_ = `http://127.0.0.1:${PORT}`
  await startServer()
})
afterAll(async () => {
  if (server && server.exitCode === null) await killServer()
  await db().end()
})

describe('a server killed during a sync', () => {
  it('loses nothing and doubles nothing when the batch is sent again', async () => {
    const login = await fetch(`${URL_}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: DEMO.operator, password: DEMO_PASSWORD }) })
    const cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
    const me = (await (await fetch(`${URL_}/api/me`, { headers: { cookie } })).json()).user
    const machine = (await (await fetch(`${URL_}/api/machines`, { headers: { cookie } })).json())[0]
    const procedure = (await (await fetch(`${URL_}/api/procedures`, { headers: { cookie } })).json())[0]
    const runId = uuidv7()
    const t0 = Date.now() - 60_000
    const base = { runId, actorId: me.id, deviceId: 'crash-tablet' }
    const events = [
      { ...base, id: uuidv7(), type: 'run.started', at: new Date(t0).toISOString(), procedureVersionId: procedure.current.id, machineId: machine.id, mode: 'guided' },
      ...Array.from({ length: 499 }, (_, i) => ({ ...base, id: uuidv7(), type: 'note.added', at: new Date(t0 + 1 + i).toISOString(), text: `Reading ${i} noted before the power cut.` })),
    ]
    const body = JSON.stringify({ deviceId: 'crash-tablet', events })

    // Send, then pull the plug on the server while it works on the batch.
    const sent = fetch(`${URL_}/api/sync`, { method: 'POST', headers: { 'content-type': 'application/json', cookie }, body }).catch(() => null)
    await new Promise(r => setTimeout(r, 40))
    await killServer()
    const first = await sent
    const [[before]] = await db().query<any[]>('select count(*) as n from run_events where run_id = ?', [runId])
    // One transaction per batch: all of it or none of it made it in.
    expect([0, 500]).toContain(Number(before.n))

    await startServer()
    for (let attempt = 0; attempt < 2; attempt++) {
      const res = await fetch(`${URL_}/api/sync`, { method: 'POST', headers: { 'content-type': 'application/json', cookie }, body })
      const answer = await res.json()
      expect(answer.accepted).toHaveLength(500)
      expect(answer.rejected).toEqual([])
    }
    const [[after]] = await db().query<any[]>('select count(*) as n, count(distinct id) as d from run_events where run_id = ?', [runId])
    expect(Number(after.n)).toBe(500)
    expect(Number(after.d)).toBe(500)
    // The main test server sees the same run.
    const seen = await call('GET', `/api/runs/${runId}`, { cookie: await signIn(DEMO.operator) })
    expect(seen.body.events).toHaveLength(500)
    // The first answer never arrived, or arrived complete before the plug was pulled.
    expect(first === null || first.status === 200).toBe(true)
  })
})

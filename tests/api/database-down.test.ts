import { spawn, type ChildProcess } from 'node:child_process'
import { existsSync } from 'node:fs'
import { createServer, connect, type Server, type Socket } from 'node:net'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { v7 as uuidv7 } from 'uuid'
import { as, call } from './client'
import { freePort } from '../support/app-server'

// MariaDB out of reach and back again, seen by a second app server from the same build. It
// reaches the suite's MariaDB through a small TCP relay started here; closing the relay (and
// cutting its open connections) is, for the app, the database going away, without stopping the
// MariaDB the other tests use. While it is away the app must answer a plain 503, and once it is
// back the very same process must serve again.

const ENTRY = process.env.JOGWISE_SERVER_ENTRY || '.data/test-output/server/index.mjs'
const DB_PORT = Number(process.env.NUXT_DB_PORT || 3418)

// The relay: each client connection piped to MariaDB.
let relayPort = 0
let relay: Server | undefined
const open = new Set<Socket>()
function relayUp() {
  return new Promise<void>((resolve) => {
    relay = createServer((client) => {
      const upstream = connect(DB_PORT, '127.0.0.1')
      for (const s of [client, upstream]) { open.add(s); s.on('close', () => open.delete(s)); s.on('error', () => {}) }
      client.pipe(upstream).pipe(client)
    }).listen(relayPort, '127.0.0.1', () => {
      relayPort = (relay!.address() as { port: number }).port
      resolve()
    })
  })
}
function relayDown() {
  for (const s of open) s.destroy()
  return new Promise<void>(resolve => relay!.close(() => resolve()))
}

let app: ChildProcess
let url = ''
async function get(path: string, cookie?: string) {
  const res = await fetch(url + path, { headers: { accept: 'application/json', ...(cookie ? { cookie } : {}) } })
  return { status: res.status, retryAfter: res.headers.get('retry-after'), text: await res.text() }
}

beforeAll(async () => {
  if (!existsSync(ENTRY)) throw new Error(`no build at ${ENTRY}; run npm test`)
  await relayUp()
  const port = await freePort()
  url = `http://127.0.0.1:${port}`
  app = spawn(process.execPath, [ENTRY], {
    env: { ...process.env, PORT: String(port), HOST: '127.0.0.1', NUXT_DEMO_SEED: '', NUXT_DB_PORT: String(relayPort), NUXT_MAIL_SMTP_HOST: '' },
    stdio: 'ignore',
  })
  for (let i = 0; i < 160; i++) {
    try { if ((await fetch(`${url}/api/health`)).ok) return }
    catch {}
    await new Promise(r => setTimeout(r, 250))
  }
  throw new Error('the second app server did not start')
}, 60_000)

afterAll(async () => {
  app?.kill('SIGKILL')
  for (const s of open) s.destroy()
  relay?.close()
})

describe('MariaDB out of reach', () => {
  it('answers a plain 503 with Retry-After, then serves again from the same process once it is back', async () => {
    // The suite's session cookie is sealed with the same NUXT_SESSION_PASSWORD, so it works here too.
    const cookie = await as('operator')
    expect((await get('/api/machines', cookie)).status).toBe(200)
    const me = (await call('GET', '/api/me', { cookie })).body.user

    await relayDown()
    const reads = [await get('/api/health'), await get('/api/machines', cookie), await get('/api/procedures', cookie)]
    const runId = uuidv7()
    const syncRes = await fetch(`${url}/api/sync`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'accept': 'application/json', cookie },
      body: JSON.stringify({ deviceId: 'db-down-check', events: [{ id: uuidv7(), runId, type: 'note.added', at: new Date().toISOString(), actorId: me.id, deviceId: 'db-down-check', text: 'Written while the database was away.' }] }),
    })
    const sync = { status: syncRes.status, retryAfter: syncRes.headers.get('retry-after'), text: await syncRes.text() }
    for (const answer of [...reads, sync]) {
      // RFC 9110 §15.6.4: 503 Service Unavailable, with Retry-After (§10.2.3) saying when to try again.
      expect(answer.status, answer.text).toBe(503)
      expect(answer.retryAfter).toBe('5')
      const body = JSON.parse(answer.text)
      expect(body.message).toMatch(/database is not answering just now/)
      expect(answer.text).not.toMatch(/ECONNREFUSED|Failed query|\bat .+\.m?js:\d+/)
    }

    await relayUp()
    let back = 0
    for (let i = 0; i < 50 && back !== 200; i++) {
      back = (await get('/api/machines', cookie)).status
      if (back !== 200) await new Promise(r => setTimeout(r, 100))
    }
    expect(back).toBe(200)
    expect(app.exitCode).toBeNull() // the same process, never restarted
    expect((await get('/api/health')).status).toBe(200)
  }, 30_000)
})

// Sync benchmark: 20 000 run events merged in batches of 500 through POST /api/sync on
// loopback, then the same number of rows written with plain mysql2 multi-row INSERTs into the
// same table, for comparison. Run: npm run bench:sync
// Each side first does a few batches that are not timed: a server that has just started spends
// its first seconds compiling its hot code (V8's optimizing compiler works on other threads), which
// a shop's server, running for days, does not; the plain INSERTs get the same warm-up.
// JOGWISE_BENCH_WARMUP=0 times the first batches too.
import { readFileSync } from 'node:fs'
import mysql from 'mysql2/promise'
import { v7 as uuidv7 } from 'uuid'

const BASE = process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3150'
const TOTAL = 20_000
const BATCH = 500
const WARMUP = Number(process.env.JOGWISE_BENCH_WARMUP ?? 5)

async function json(path: string, init: RequestInit & { cookie?: string } = {}) {
  const res = await fetch(BASE + path, { ...init, headers: { 'content-type': 'application/json', ...(init.cookie ? { cookie: init.cookie } : {}) } })
  if (!res.ok) throw new Error(`${path}: ${res.status} ${await res.text()}`)
  return { res, body: await res.json() as any }
}

const login = await json('/api/auth/login', { method: 'POST', body: JSON.stringify({ email: 'operator@demo.jogwise.test', password: 'shopfloor-demo-1' }) })
const cookie = login.res.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
const me = login.body.user
const machine = (await json('/api/machines', { cookie })).body[0]
const procedures = (await json('/api/procedures', { cookie })).body as any[]
const version = procedures.find(p => p.slug === 'daily-start-up').current

// Each batch is one run as a tablet would send it after a long offline spell: the start, then
// readings and notes (the fold still re-checks the whole run on every batch).
function batchFor(runId: string) {
  const t0 = Date.now() - 3_600_000
  const base = { runId, actorId: me.id, deviceId: 'bench-tablet' }
  const events: Record<string, unknown>[] = [{ ...base, id: uuidv7(), type: 'run.started', at: new Date(t0).toISOString(), procedureVersionId: version.id, machineId: machine.id, mode: 'guided' }]
  for (let i = 1; i < BATCH; i++) events.push({ ...base, id: uuidv7(), type: 'note.added', at: new Date(t0 + i * 10).toISOString(), text: `Bench note ${i}: chips cleared from the dust shoe.` })
  return events
}

// CPU time (user + system, ms) the app server and MariaDB spend: on a shared machine the wall
// clock moves with the other work on it, the CPU each side uses much less (Linux /proc).
function cpuMs(pidFile: string) {
  try {
    const pid = readFileSync(pidFile, 'utf8').trim()
    const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')
    return (Number(fields[11]) + Number(fields[12])) * 1000 / 100 // utime + stime, in clock ticks of 1/100 s
  }
  catch { return Number.NaN }
}
const serverPidFile = process.env.JOGWISE_BENCH_SERVER_PID_FILE || '.data/bench-server.pid'
const dbPidFile = `.data/${process.env.JOGWISE_BENCH_DB_DIR || 'mariadb-test'}/mariadb.pid`

async function merge(batches: Record<string, unknown>[][]) {
  for (const events of batches) {
    const { body } = await json('/api/sync', { method: 'POST', cookie, body: JSON.stringify({ deviceId: 'bench-tablet', events }) })
    if (body.accepted.length !== events.length) throw new Error(`rejected: ${JSON.stringify(body.rejected.slice(0, 3))}`)
  }
}
let t = performance.now()
await merge(Array.from({ length: WARMUP }, () => batchFor(uuidv7())))
const warmSyncMs = performance.now() - t
const batches = Array.from({ length: TOTAL / BATCH }, () => batchFor(uuidv7()))
const cpu0 = { server: cpuMs(serverPidFile), db: cpuMs(dbPidFile) }
t = performance.now()
await merge(batches)
const syncMs = performance.now() - t
const syncCpu = { server: cpuMs(serverPidFile) - cpu0.server, db: cpuMs(dbPidFile) - cpu0.db }

// The same rows, straight into MariaDB.
const db = await mysql.createConnection({
  host: process.env.NUXT_DB_HOST || '127.0.0.1', port: Number(process.env.NUXT_DB_PORT || 3418),
  user: 'jogwise', password: process.env.NUXT_DB_PASSWORD || 'jogwise-local', database: process.env.NUXT_DB_NAME || 'jogwise_bench',
})
const [[shop]] = await db.query<any[]>('select shop_id from users where id = ?', [me.id])
async function insertPlain(batches: Record<string, unknown>[][]) {
  for (const events of batches) {
    const runId = uuidv7()
    const rows = events.map(e => {
      const { id: _i, runId: _r, type, at, actorId, deviceId, ...payload } = e as any
      return [uuidv7(), shop.shop_id, runId, type, actorId, deviceId, new Date(at), JSON.stringify(payload)]
    })
    await db.query('insert into run_events (id, shop_id, run_id, type, actor_id, device_id, at, payload) values ?', [rows])
  }
}
t = performance.now()
await insertPlain(batches.slice(0, WARMUP))
const warmRawMs = performance.now() - t
const rawDb0 = cpuMs(dbPidFile)
t = performance.now()
await insertPlain(batches)
const rawMs = performance.now() - t
const rawDbCpu = cpuMs(dbPidFile) - rawDb0
const [[count]] = await db.query<any[]>('select count(*) as n from run_events')
await db.end()

const rate = (ms: number) => Math.round(TOTAL / (ms / 1000))
console.log(`warm-up, not timed: ${WARMUP} batches each, merge ${warmSyncMs.toFixed(0)} ms, plain INSERT ${warmRawMs.toFixed(0)} ms`)
console.log(`events: ${TOTAL} in batches of ${BATCH} (rows in run_events now: ${count.n})`)
console.log(`POST /api/sync: ${syncMs.toFixed(0)} ms, ${rate(syncMs)} events/s (validation, authorization, dedupe, insert, fold, flags)`)
console.log(`plain INSERT:   ${rawMs.toFixed(0)} ms, ${rate(rawMs)} events/s`)
console.log(`CPU during the merge: app server ${syncCpu.server.toFixed(0)} ms, MariaDB ${syncCpu.db.toFixed(0)} ms; during the plain INSERTs: MariaDB ${rawDbCpu.toFixed(0)} ms`)
console.log(`ratio sync/raw: ${(rawMs / syncMs).toFixed(2)} (aim ≥ 0.5)`)

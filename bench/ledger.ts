// Ledger benchmark: 200,000 run events across 5 shops written straight into MariaDB with
// batched multi-row INSERTs (with the ledger_entries the merge would have made for them), then
// the Ledger's filtered first page timed over HTTP on loopback, many times per filter, and the
// CSV export of one shop. Run: npm run bench:ledger (scripts/bench-server.sh starts the server).
import mysql from 'mysql2/promise'
import { v7 as uuidv7 } from 'uuid'

const BASE = process.env.JOGWISE_BASE_URL || 'http://127.0.0.1:3150'
const TOTAL_EVENTS = 200_000
const SHOPS = 5
const REPS = Number(process.env.JOGWISE_BENCH_REPS || 200)
const INSERT_BATCH = 2000
const YEAR_MS = 365 * 86_400_000

const db = await mysql.createConnection({
  host: process.env.NUXT_DB_HOST || '127.0.0.1', port: Number(process.env.NUXT_DB_PORT || 3418),
  user: process.env.NUXT_DB_USER || 'jogwise', password: process.env.NUXT_DB_PASSWORD || 'jogwise-local',
  database: process.env.NUXT_DB_NAME || 'jogwise_bench', timezone: 'Z',
})

// A fixed pseudo-random sequence, so every run of the benchmark seeds the same mix.
let seed = 20260112
const rnd = () => ((seed = (seed * 1_103_515_245 + 12_345) % 2_147_483_648) / 2_147_483_648)
const pick = <T>(xs: readonly T[]) => xs[Math.floor(rnd() * xs.length)]!

async function insertMany(table: string, columns: string[], rows: unknown[][]) {
  for (let i = 0; i < rows.length; i += INSERT_BATCH) {
    await db.query(`insert into ${table} (${columns.join(', ')}) values ?`, [rows.slice(i, i + INSERT_BATCH)])
  }
}

// 1. Five shops: the demo shop the server seeded, and four more beside it.
const [[demoOwner]] = await db.query<any[]>('select id, shop_id, password_hash from users where email = ?', ['owner@demo.jogwise.test'])
if (!demoOwner) throw new Error('The demo shop is missing; start the server with NUXT_DEMO_SEED=1.')
interface Shop { id: number, users: number[], machines: number[], procedures: { id: number, versionId: number }[] }
const shops: Shop[] = []
const t0 = performance.now()
for (let s = 0; s < SHOPS; s++) {
  let shopId = demoOwner.shop_id as number
  if (s > 0) {
    const [res] = await db.query<any>('insert into shops (name, units) values (?, ?)', [`Bench Workshop ${s}`, 'mm'])
    shopId = res.insertId
  }
  // People: eight besides the demo four, all with the demo password's hash (never used to sign in)
  const people = Array.from({ length: 8 }, (_, i) => [shopId, `bench-${s}-${i}-${Date.now()}@bench.jogwise.test`, `Bench Person ${s}.${i}`, demoOwner.password_hash, pick(['operator', 'operator', 'trainee', 'trainer'])])
  await insertMany('users', ['shop_id', 'email', 'name', 'password_hash', 'role'], people)
  const [users] = await db.query<any[]>('select id from users where shop_id = ?', [shopId])
  const machineRows = Array.from({ length: 3 }, (_, i) => [shopId, `Bench Router ${s}.${i}`, 1250, 2500, 150, 'mm', 'air-spindle', 1, 'MDF', 19, 12])
  await insertMany('machines', ['shop_id', 'name', 'travel_x_mm', 'travel_y_mm', 'travel_z_mm', 'units', 'spindle_kind', 'has_length_sensor', 'spoilboard_material', 'spoilboard_nominal_mm', 'spoilboard_min_mm'], machineRows)
  const [machines] = await db.query<any[]>('select id from machines where shop_id = ?', [shopId])
  if (s > 0) {
    for (let p = 0; p < 6; p++) {
      const [proc] = await db.query<any>('insert into procedures (shop_id, slug, category) values (?, ?, ?)', [shopId, `bench-procedure-${p}`, 'maintenance'])
      const [version] = await db.query<any>('insert into procedure_versions (shop_id, procedure_id, version, title, summary) values (?, ?, 1, ?, ?)', [shopId, proc.insertId, `Bench procedure ${p}`, 'A procedure for the Ledger benchmark.'])
      await db.query('update procedures set current_version_id = ? where id = ?', [version.insertId, proc.insertId])
    }
  }
  const [procedures] = await db.query<any[]>('select id, current_version_id as versionId from procedures where shop_id = ? and current_version_id is not null', [shopId])
  shops.push({ id: shopId, users: users.map(u => u.id), machines: machines.map(m => m.id), procedures })
}

// 2. Runs of about 20 events each, spread over the last year. The mix per run: start, steps
//    done and holds acknowledged (each an entry), four readings (one in five out of range), a photo, a note,
//    an override in one run in six, a late event past a hold in one in twenty, a skipped check
//    in one in ten, and a finish in nine runs of ten.
const now = Date.now()
let events = 0
let entries = 0
let runCount = 0
let runRows: unknown[][] = []
let eventRows: unknown[][] = []
let entryRows: unknown[][] = []
async function flush(force = false) {
  if (force || eventRows.length >= 20_000) {
    await insertMany('runs', ['id', 'shop_id', 'machine_id', 'procedure_version_id', 'started_by', 'mode', 'status', 'spindle_minutes', 'started_at', 'finished_at'], runRows)
    await insertMany('run_events', ['id', 'shop_id', 'run_id', 'type', 'actor_id', 'device_id', 'at', 'payload', 'flag'], eventRows)
    await insertMany('ledger_entries', ['shop_id', 'event_id', 'run_id', 'kind', 'actor_id', 'machine_id', 'procedure_id', 'step_key', 'at', 'detail', 'received_at', 'entry_key'], entryRows)
    runRows = []
    eventRows = []
    entryRows = []
  }
}
while (events < TOTAL_EVENTS) {
  const shop = shops[Math.floor(rnd() * SHOPS)]!
  const runId = uuidv7()
  const actor = pick(shop.users)
  const machine = pick(shop.machines)
  const proc = pick(shop.procedures)
  const startedAt = now - Math.floor(rnd() * YEAR_MS)
  let t = startedAt
  const ev = (type: string, payload: Record<string, unknown>, flag: string | null = null, by = actor) => {
    t += 20_000 + Math.floor(rnd() * 100_000)
    const id = uuidv7()
    eventRows.push([id, shop.id, runId, type, by, 'bench-tablet', new Date(t), JSON.stringify(payload), flag])
    events++
    return { id, at: new Date(t), by }
  }
  const entry = (e: { id: string, at: Date, by: number }, kind: string, stepKey: string, detail: Record<string, unknown>) => {
    entryRows.push([shop.id, e.id, runId, kind, e.by, machine, proc.id, stepKey, e.at, JSON.stringify(detail), e.at, `${e.id}:${kind}:1`])
    entries++
  }
  ev('run.started', { procedureVersionId: proc.versionId, machineId: machine, mode: 'solo' })
  // Every acknowledgement is an entry too (issue 11).
  const ack = (stepKey: string, stepTitle: string) => entry(ev('hold.acknowledged', { stepKey }), 'hold-acknowledged', stepKey, { stepTitle, signalWord: 'WARNING' })
  ack('isolate', 'Isolate the power')
  if (rnd() < 1 / 6) {
    const o = ev('hold.overridden', { stepKey: 'guard', reason: 'Guard checked by hand, the sensor is faulty' }, null, pick(shop.users))
    entry(o, 'override', 'guard', { stepTitle: 'Fit the guard', reason: 'Guard checked by hand, the sensor is faulty', signalWord: 'WARNING' })
  }
  else ack('guard', 'Fit the guard')
  if (rnd() < 1 / 20) {
    const late = ev('step.done', { stepKey: 'clear' }, 'passed-unacknowledged-hold')
    entry(late, 'late-past-hold', 'clear', { stepTitle: 'Clear the bed', eventType: 'step.done', code: 'passed-unacknowledged-hold', reason: 'Marking done came before the hold was acknowledged; it was not applied.' })
  }
  for (const k of ['clear', 'zero', 'tool', 'dust']) ev('step.done', { stepKey: k })
  for (let r = 0; r < 4; r++) {
    const out = rnd() < 0.2
    const value = out ? 0.08 + rnd() * 0.2 : rnd() * 0.05
    const v = ev('value.recorded', { stepKey: `check-${r}`, value, unit: 'mm', ...(out ? { reason: 'Within what the job needs' } : {}) })
    if (out) entry(v, 'out-of-range', `check-${r}`, { stepTitle: `Check ${r + 1}`, value, unit: 'mm', side: 'above', range: '0 to 0.05 mm', reason: 'Within what the job needs', min: 0, max: 0.05 })
    ev('step.done', { stepKey: `check-${r}` })
  }
  if (rnd() < 0.1) {
    const passed = ev('step.done', { stepKey: 'tidy' })
    entry(passed, 'skipped-check', 'final-check', { stepTitle: 'Final check', reason: 'No reading recorded for "Final check" before work on "Tidy".' })
  }
  ev('photo.attached', { stepKey: 'photo', uploadId: uuidv7(), note: 'Bed after the job' })
  ev('step.done', { stepKey: 'photo' })
  ev('note.added', { text: 'Chips cleared from the dust shoe.' })
  const finished = rnd() < 0.9 ? ev('run.finished', {}) : null
  runRows.push([runId, shop.id, machine, proc.versionId, actor, 'solo', finished ? 'finished' : 'active', Math.round(rnd() * 90), new Date(startedAt), finished?.at ?? null])
  runCount++
  await flush()
}
await flush(true)
const seedMs = performance.now() - t0
await db.query('analyze table ledger_entries, run_events, runs')
const [[perShop]] = await db.query<any[]>('select count(*) as n from ledger_entries where shop_id = ?', [demoOwner.shop_id])

// 3. The Ledger over HTTP as the demo shop's owner.
const login = await fetch(`${BASE}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'owner@demo.jogwise.test', password: 'shopfloor-demo-1' }) })
if (!login.ok) throw new Error(`sign-in: ${login.status}`)
const cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
const demo = shops[0]!
const month = new Date(now - 30 * 86_400_000).toISOString()
const filters: [string, Record<string, string | number>][] = [
  ['no filter', {}],
  ['kind=override', { kind: 'override' }],
  ['kind=out-of-range', { kind: 'out-of-range' }],
  ['person', { actorId: demo.users[0]! }],
  ['machine', { machineId: demo.machines[0]! }],
  ['procedure', { procedureId: demo.procedures[0]!.id }],
  ['last 30 days', { from: month }],
  ['kind+machine+30 days', { kind: 'out-of-range', machineId: demo.machines[1]!, from: month }],
  ['person+procedure', { actorId: demo.users[1]!, procedureId: demo.procedures[1]!.id }],
  ['page 20, no filter', { page: 20 }],
]
const pct = (xs: number[], p: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor((p / 100) * xs.length))]!
async function time(path: string) {
  const t = performance.now()
  const res = await fetch(BASE + path, { headers: { cookie } })
  const body = await res.text()
  if (!res.ok) throw new Error(`${path}: ${res.status} ${body.slice(0, 200)}`)
  return { ms: performance.now() - t, body }
}
// The filters are asked in turn, round after round, so a busy moment on the machine falls on
// all of them alike; GET /api/me (session and role check only) is the floor under every figure.
const paths: [string, string][] = [
  ['baseline GET /api/me', '/api/me'],
  ...filters.map(([name, q]): [string, string] => [name, `/api/ledger?${new URLSearchParams(Object.entries({ pageSize: 25, ...q }).map(([k, v]) => [k, String(v)]))}`]),
]
const times = new Map<string, number[]>(paths.map(([name]) => [name, []]))
const totals = new Map<string, number>()
for (const [, path] of paths) for (let i = 0; i < 5; i++) await time(path) // warm-up
for (let i = 0; i < REPS; i++) {
  for (const [name, path] of paths) {
    const r = await time(path)
    times.get(name)!.push(r.ms)
    if (path.startsWith('/api/ledger')) totals.set(name, JSON.parse(r.body).total)
  }
}
console.log(`seeded ${events} events, ${entries} ledger entries, ${runCount} runs in ${SHOPS} shops in ${(seedMs / 1000).toFixed(1)} s (demo shop: ${perShop.n} entries)`)
console.log(`first page (pageSize 25), ${REPS} requests each, loopback HTTP, ms:`)
for (const [name] of paths) {
  const xs = times.get(name)!
  const total = totals.has(name) ? `  (total ${totals.get(name)})` : ''
  console.log(`  ${name.padEnd(22)} p50 ${pct(xs, 50).toFixed(1).padStart(6)}  p95 ${pct(xs, 95).toFixed(1).padStart(6)}  max ${Math.max(...xs).toFixed(1).padStart(6)}${total}`)
}
const runTimes: number[] = []
for (let i = 0; i < REPS; i++) runTimes.push((await time('/api/ledger/runs?pageSize=10')).ms)
console.log(`  ${'run list (10)'.padEnd(22)} p50 ${pct(runTimes, 50).toFixed(1).padStart(6)}  p95 ${pct(runTimes, 95).toFixed(1).padStart(6)}`)

// 4. The whole Ledger of the demo shop as CSV, three times, and the server's memory around it.
for (let i = 0; i < 3; i++) {
  const r = await time('/api/ledger/export.csv')
  const lines = r.body.trimEnd().split('\n').length - 1
  console.log(`CSV export, demo shop: ${r.ms.toFixed(0)} ms, ${(r.body.length / 1024).toFixed(0)} KiB, ~${lines} rows (header excluded)`)
}
// 5. A stress case for the export: one shop with 200,000 Ledger entries (synthetic rows, far
//    beyond any real shop), streamed while the server's peak memory is watched (VmHWM).
const big = shops[1]!
const [[bigUser]] = await db.query<any[]>('select email from users where shop_id = ? and email like ? limit 1', [big.id, 'bench-%'])
const bigRows: unknown[][] = []
for (let i = 0; i < 200_000; i++) {
  bigRows.push([big.id, uuidv7(), uuidv7(), pick(['override', 'out-of-range', 'skipped-check', 'late-past-hold']), pick(big.users), pick(big.machines), pick(big.procedures).id, 'check-0',
    new Date(now - Math.floor(rnd() * YEAR_MS)), JSON.stringify({ stepTitle: 'Check 1', value: rnd(), unit: 'mm', reason: 'Stress row for the export' })])
}
await insertMany('ledger_entries', ['shop_id', 'event_id', 'run_id', 'kind', 'actor_id', 'machine_id', 'procedure_id', 'step_key', 'at', 'detail'], bigRows)
const bigLogin = await fetch(`${BASE}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: bigUser.email, password: 'shopfloor-demo-1' }) })
const bigCookie = bigLogin.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
const { readFileSync } = await import('node:fs')
const serverPid = (() => {
  try { return readFileSync(process.env.JOGWISE_BENCH_SERVER_PID_FILE || '.data/bench-server.pid', 'utf8').trim() }
  catch { return '' }
})()
const peakMiB = () => {
  try { return Number(/VmHWM:\s+(\d+)/.exec(readFileSync(`/proc/${serverPid}/status`, 'utf8'))![1]) / 1024 }
  catch { return Number.NaN }
}
const before = peakMiB()
const tBig = performance.now()
const res = await fetch(`${BASE}/api/ledger/export.csv`, { headers: { cookie: bigCookie } })
let bytes = 0
let newlines = 0
for await (const chunk of res.body as unknown as AsyncIterable<Uint8Array>) {
  bytes += chunk.length
  for (const b of chunk) if (b === 10) newlines++
}
console.log(`CSV export, one shop with ${(await db.query<any[]>('select count(*) as n from ledger_entries where shop_id = ?', [big.id]))[0][0].n} entries: ${(performance.now() - tBig).toFixed(0)} ms, ${(bytes / 1048576).toFixed(1)} MiB, ${newlines - 1} rows; server peak memory ${before.toFixed(0)} → ${peakMiB().toFixed(0)} MiB`)
await db.end()
// Last, the ratio: the slowest first page of the filters against the session-only floor, both
// taken in the same rounds (the aim is about 6 ms at the server for a first page).
const floor = pct(times.get('baseline GET /api/me')!, 50)
const slowest = Math.max(...filters.map(([name]) => pct(times.get(name)!, 50)))
console.log(`ratio slowest first page p50 / GET /api/me p50: ${(slowest / floor).toFixed(2)} (${slowest.toFixed(1)} ms against ${floor.toFixed(1)} ms; aim about 6 ms)`)

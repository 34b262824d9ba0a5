// Soak: simulated tablets sync run events and read the library for a fixed time while MariaDB is
// stopped and started again and the app process is killed (SIGKILL) and started again. At the end
// every event a tablet made must be stored exactly once and every run on the server must fold to
// the same state as on its tablet. Started by scripts/soak.sh (npm run soak), which prepares the
// database, the build and the environment; this file starts and kills the app server itself.
import { spawn, execFile, type ChildProcess } from 'node:child_process'
import { openSync, writeFileSync } from 'node:fs'
import { isDeepStrictEqual, promisify } from 'node:util'
import autocannon from 'autocannon'
import mysql from 'mysql2/promise'
import { foldRun } from '../shared/runs'
import { api as apiAt, canon, env, makeTablets, ms, percentile, signIn as signInAt, sleep, SoakStats, type Tally } from './soak-kit'

const PORT = Number(env('SOAK_PORT', '3134'))
const BASE = `http://127.0.0.1:${PORT}`
const TABLETS = Number(env('SOAK_TABLETS', '50'))
const LOAD_S = Number(env('SOAK_SECONDS', '60'))
const TAP_MS = Number(env('SOAK_TAP_MS', '700')) // mean time between two taps on one tablet
const READ_RATE = Number(env('SOAK_READ_RATE', '2')) // library/machine reads per tablet per second
const DRAIN_S = Number(env('SOAK_DRAIN_SECONDS', '90'))
const DB_DOWN_AT_S = Number(env('SOAK_DB_DOWN_AT', '12'))
const DB_DOWN_FOR_S = Number(env('SOAK_DB_DOWN_FOR', '6'))
const APP_KILL_AT_S = Number(env('SOAK_APP_KILL_AT', '36'))
const DB_DIR_NAME = env('SOAK_DB_DIR', 'mariadb-soak')
const DB_PORT = env('NUXT_DB_PORT', '3434')
const SERVER_ENTRY = env('SOAK_SERVER_ENTRY', '.data/soak-output/server/index.mjs')
const SERVER_LOG = env('SOAK_SERVER_LOG', '.data/soak-server.log')
const SERVER_PIDFILE = env('SOAK_SERVER_PIDFILE', '.data/soak-server.pid')
const DEMO_PASSWORD = env('NUXT_DEMO_PASSWORD', 'shopfloor-demo-1')
const REQUEST_TIMEOUT_MS = 15_000

const run = promisify(execFile)
const started = performance.now()
const clock = () => ((performance.now() - started) / 1000).toFixed(1).padStart(6)
const say = (text: string) => console.log(`[soak ${clock()} s] ${text}`)

// ---------------------------------------------------------------- phases and counters (soak-kit.ts)

const stats = new SoakStats()
const { byPhase, syncLatency, readLatency, samples503, rejected } = stats
const count = stats.count.bind(stats)

// ---------------------------------------------------------------- the app server

let server: ChildProcess | undefined
async function startServer() {
  // Another process on the port would answer in this server's place and spoil every figure.
  const taken = await fetch(`${BASE}/api/health`, { signal: AbortSignal.timeout(1000) }).then(() => true, () => false)
  if (taken) throw new Error(`port ${PORT} is already in use; stop what listens there or set SOAK_PORT`)
  const log = openSync(SERVER_LOG, 'a')
  server = spawn(process.execPath, [SERVER_ENTRY], {
    env: { ...process.env, PORT: String(PORT), HOST: '127.0.0.1', NUXT_DEMO_SEED: '1', NUXT_DEMO_PASSWORD: DEMO_PASSWORD },
    detached: true, stdio: ['ignore', log, log],
  })
  writeFileSync(SERVER_PIDFILE, String(server.pid))
  const until = Date.now() + 90_000
  while (Date.now() < until) {
    try {
      const res = await fetch(`${BASE}/api/health`, { signal: AbortSignal.timeout(2000) })
      // Ready once the demo shop exists (scripts/lib.sh wait_for_ready asks the same).
      if (res.ok && (await res.json()).ready === true && server.exitCode === null) return
    }
    catch {}
    await sleep(200)
  }
  throw new Error(`the app server did not become ready (log: ${SERVER_LOG})`)
}

// ---------------------------------------------------------------- HTTP helpers (soak-kit.ts)

const api = (method: string, path: string, opts: { cookie?: string, body?: unknown } = {}) => apiAt(BASE, method, path, opts)
const signIn = (email: string, password: string) => signInAt(BASE, email, password)

// ---------------------------------------------------------------- the soak

async function main() {
  say(`starting the app server on ${BASE}`)
  await startServer()

  // Setup through the API, as an owner would: one operator per tablet, qualified to run two
  // starter procedures alone (solo runs need no trainer on site).
  // The seed writes the shop before its people, so the owner may need a moment.
  let owner: Awaited<ReturnType<typeof signIn>> | undefined
  for (let i = 0; !owner; i++) {
    try { owner = await signIn('owner@demo.jogwise.test', DEMO_PASSWORD) }
    catch (error) { if (i >= 60) throw error; await sleep(500) }
  }
  // One operator per tablet, qualified for two starter procedures (soak-kit.ts)
  const tablets = await makeTablets(BASE, owner.cookie, TABLETS, () => BASE, stats)
  say(`${TABLETS} operators created and signed in, each on its own tablet`)

  // Reads: autocannon, one connection per tablet with that tablet's session, at READ_RATE each.
  const readPaths = ['/api/procedures', '/api/machines']
  let readCursor = 0
  const readResults: autocannon.Result[] = []
  let reader: autocannon.Instance | undefined
  let readerDone: Promise<void> = Promise.resolve()
  const startReads = (seconds: number) => {
    readerDone = new Promise((resolve) => {
      const instance = autocannon({
        url: BASE, connections: TABLETS, connectionRate: READ_RATE, duration: Math.max(1, Math.round(seconds)), timeout: REQUEST_TIMEOUT_MS / 1000,
        requests: readPaths.map(path => ({
          method: 'GET', path,
          setupRequest: (req: any) => ({ ...req, headers: { ...req.headers, accept: 'application/json', cookie: tablets[readCursor++ % tablets.length]!.cookie } }),
        })),
      }, (error, result) => {
        if (!error && result) readResults.push(result)
        resolve()
      })
      reader = instance
      instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTime: number) => {
        readLatency.push(responseTime)
        count('read', { status: statusCode })
      })
      instance.on('reqError', () => count('read', { network: true }))
    })
  }
  const stopReads = async () => { reader?.stop(); await readerDone }

  // Taps and syncs on every tablet until the load time is over, then only syncs (drain).
  const loadStart = Date.now()
  const loadEnds = loadStart + LOAD_S * 1000
  let loadOver = false
  let drainEnds = Infinity
  const tabletLoops = tablets.map(async (tablet) => {
    await sleep(Math.random() * TAP_MS)
    while (!loadOver) {
      tablet.tap()
      void tablet.sync()
      await sleep(TAP_MS * (0.5 + Math.random()))
    }
  })
  const syncLoops = tablets.map(async (tablet) => {
    while (!loadOver || tablet.queue.length) {
      await tablet.sync()
      await sleep(250)
      if (stats.phase === 'drain' && Date.now() > drainEnds) break
    }
  })
  say(`load: ${TABLETS} tablets tapping about every ${TAP_MS} ms and reading ${READ_RATE}×/s each, for ${LOAD_S} s`)
  startReads(APP_KILL_AT_S)

  // Fault 1: MariaDB stopped for a few seconds under load; the same app process must recover.
  const faults: string[] = []
  await sleep(DB_DOWN_AT_S * 1000)
  const pidBefore = server!.pid
  say('fault: stopping MariaDB')
  stats.phase = 'db-down'
  await run('bash', ['scripts/db.sh', 'stop', DB_DIR_NAME])
  const health = await api('GET', '/api/health').catch(e => ({ status: 0, text: String(e) }))
  say(`while MariaDB is down /api/health answers ${health.status}: ${(health as any).body?.message ?? health.text}`)
  await sleep(DB_DOWN_FOR_S * 1000)
  say('fault: starting MariaDB again')
  await run('bash', ['scripts/db.sh', 'start', DB_DIR_NAME, DB_PORT], { env: { ...process.env, JOGWISE_DB_NAME: process.env.NUXT_DB_NAME } })
  stats.phase = 'steady'
  let recovered = NaN
  const back = performance.now()
  for (let i = 0; i < 100; i++) {
    const h = await api('GET', '/api/health').catch(() => ({ status: 0 }))
    if (h.status === 200) { recovered = performance.now() - back; break }
    await sleep(100)
  }
  faults.push(`MariaDB stopped for ${DB_DOWN_FOR_S} s: /api/health answered ${health.status} meanwhile; the same app process (pid ${pidBefore} → ${server!.pid}) answered 200 again ${ms(recovered)} after MariaDB was back`)
  say(faults.at(-1)!)

  // Fault 2: the app process killed with SIGKILL while sync batches are in flight.
  await sleep(Math.max(0, APP_KILL_AT_S * 1000 - (Date.now() - loadStart)))
  await stopReads()
  for (let i = 0; i < 200 && stats.syncInFlight < 3; i++) await sleep(10)
  const inFlight = stats.syncInFlight
  say(`fault: SIGKILL to the app server (pid ${server!.pid}) with ${inFlight} sync batches in flight`)
  stats.phase = 'app-down'
  const killedAt = performance.now()
  process.kill(server!.pid!, 'SIGKILL')
  await sleep(1000)
  await startServer()
  stats.phase = 'steady'
  faults.push(`app killed (SIGKILL) with ${inFlight} sync batches in flight, serving again after ${ms(performance.now() - killedAt)} (pid ${server!.pid})`)
  say(faults.at(-1)!)
  startReads(Math.max(1, (loadEnds - Date.now()) / 1000))

  await sleep(Math.max(0, loadEnds - Date.now()))
  loadOver = true
  stats.phase = 'drain'
  drainEnds = Date.now() + DRAIN_S * 1000
  await stopReads()
  await Promise.all(tabletLoops)
  say(`load over; tablets send what still waits (at most ${DRAIN_S} s)`)
  await Promise.all(syncLoops)
  const loadSeconds = LOAD_S

  // ---------------------------------------------------------------- the check
  const generated = tablets.flatMap(t => [...t.runs.values()].flatMap(r => r.events))
  const waiting = tablets.reduce((n, t) => n + t.queue.length, 0)
  const db = await mysql.createConnection({
    host: process.env.NUXT_DB_HOST || '127.0.0.1', port: Number(DB_PORT),
    user: process.env.NUXT_DB_USER || 'jogwise', password: process.env.NUXT_DB_PASSWORD || 'jogwise-local', database: process.env.NUXT_DB_NAME || 'jogwise_soak',
  })
  const [[stored]] = await db.query<any[]>(`select count(*) as n, count(distinct id) as ids, sum(flag is not null) as flagged from run_events where device_id like 'soak-tablet-%'`)
  const [rows] = await db.query<any[]>(`select id from run_events where device_id like 'soak-tablet-%'`)
  const [runRows] = await db.query<any[]>(`select id, status, current_step_key as stepKey from runs where id in (select distinct run_id from run_events where device_id like 'soak-tablet-%')`)
  await db.end()
  const storedIds = new Set(rows.map(r => r.id))
  const generatedIds = new Set(generated.map(e => e.id))
  const lost = generated.filter(e => !storedIds.has(e.id)).length
  const duplicated = Number(stored.n) - Number(stored.ids)
  const strangers = [...storedIds].filter(id => !generatedIds.has(id)).length

  // Every run: the server's summary row and the fold of the server's events equal the fold of
  // the tablet's own events.
  const runsById = new Map(runRows.map(r => [r.id, r]))
  const mismatches: string[] = []
  const allRuns = tablets.flatMap(t => [...t.runs.entries()].map(([id, r]) => ({ id, tablet: t, ...r })))
  for (let i = 0; i < allRuns.length; i += 10) {
    await Promise.all(allRuns.slice(i, i + 10).map(async (r) => {
      const mine = foldRun(r.steps, canon(r.events))
      const row = runsById.get(r.id)
      const wantStatus = mine.status === 'not-started' ? 'active' : mine.status
      if (!row || row.status !== wantStatus || row.stepKey !== (mine.steps[mine.currentStepIndex]?.key ?? null)) {
        mismatches.push(`${r.id}: server row ${JSON.stringify(row)} vs tablet ${mine.status}/${mine.steps[mine.currentStepIndex]?.key}`)
        return
      }
      const answer = await api('GET', `/api/runs/${r.id}`, { cookie: r.tablet.cookie })
      const theirs = foldRun(answer.body.version.steps, canon(answer.body.events))
      if (!isDeepStrictEqual(JSON.parse(JSON.stringify(theirs)), JSON.parse(JSON.stringify(mine)))) mismatches.push(`${r.id}: folds differ`)
    }))
  }

  // ---------------------------------------------------------------- the figures
  const sum = (kind: 'sync' | 'read', key: 'requests' | 'ok' | 'network' | 'timeouts') => Object.values(byPhase).reduce((n, p) => n + p[kind][key], 0)
  const statusLine = (t: Tally) => `${t.requests} requests, ${t.ok} ok${Object.entries(t.statuses).map(([s, n]) => `, ${n}× ${s}`).join('')}${t.network ? `, ${t.network} network errors` : ''}${t.timeouts ? `, ${t.timeouts} timeouts` : ''}`
  const errorsOutside = () => ['steady', 'drain'].reduce((n, name) => {
    const p = byPhase[name]
    return n + (p ? p.sync.requests - p.sync.ok + p.read.requests - p.read.ok : 0)
  }, 0)
  const acP = (p: 'p50' | 'p97_5' | 'p99') => readResults.map(r => r.latency[p]).join(' / ')
  const lines = [
    '',
    '================ Jogwise soak ================',
    `tablets:            ${TABLETS} (each its own operator and session), load ${loadSeconds} s, total ${clock().trim()} s`,
    `sync requests:      ${sum('sync', 'requests')} (${(sum('sync', 'requests') / loadSeconds).toFixed(1)}/s), events made ${generated.length} (${(generated.length / loadSeconds).toFixed(1)}/s), runs ${allRuns.length}`,
    `sync latency:       p50 ${ms(percentile(syncLatency, 50))}, p95 ${ms(percentile(syncLatency, 95))}, p99 ${ms(percentile(syncLatency, 99))}`,
    `reads (autocannon): ${sum('read', 'requests')} (${(sum('read', 'requests') / loadSeconds).toFixed(1)}/s), GET ${readPaths.join(' and ')}; paused while the app restarts`,
    `read latency:       p50 ${ms(percentile(readLatency, 50))}, p95 ${ms(percentile(readLatency, 95))}, p99 ${ms(percentile(readLatency, 99))} (autocannon per window p50 ${acP('p50')}, p97.5 ${acP('p97_5')}, p99 ${acP('p99')} ms)`,
    `all requests:       ${sum('sync', 'requests') + sum('read', 'requests')} (${((sum('sync', 'requests') + sum('read', 'requests')) / loadSeconds).toFixed(1)}/s); errors outside the faults: ${errorsOutside()}`,
    `replayed batches:   ${stats.replaysSent} events sent a second time and answered, ${stats.replaysAccepted} of them accepted again as replays`,
    ...Object.entries(byPhase).flatMap(([name, t]) => [`${`${name}:`.padEnd(20)}sync ${statusLine(t.sync)}`, `${''.padEnd(20)}read ${statusLine(t.read)}`]),
    `503 while down:     ${samples503[0] ?? '(none seen)'}`,
    ...faults.map(f => `fault:              ${f}`),
    `events generated:   ${generated.length} (ids unique: ${generatedIds.size === generated.length})`,
    `events stored:      ${stored.n} rows, ${stored.ids} distinct ids, ${Number(stored.flagged ?? 0)} flagged, ${strangers} not made by a tablet`,
    `still queued:       ${waiting}; rejected by the server: ${rejected.length}${rejected.length ? ` (first: ${rejected[0]!.reason})` : ''}`,
    `lost:               ${lost}`,
    `duplicated:         ${duplicated}`,
    `runs converged:     ${allRuns.length - mismatches.length} of ${allRuns.length} (server row and fold equal the tablet's fold)`,
  ]
  console.log(lines.join('\n'))
  for (const m of mismatches.slice(0, 5)) console.log(`  mismatch ${m}`)
  const ok = lost === 0 && duplicated === 0 && strangers === 0 && waiting === 0 && rejected.length === 0 && mismatches.length === 0 && stored.n === generated.length
  console.log(ok ? 'RESULT: PASS — every event stored exactly once, every run converged' : 'RESULT: FAIL')
  process.exitCode = ok ? 0 : 1
}

main().catch((error) => {
  console.error(`[soak] ${error?.message ?? error}`)
  process.exitCode = 1
}).finally(() => {
  if (server?.pid) {
    try { process.kill(-server.pid, 'SIGTERM') }
    catch {}
  }
})

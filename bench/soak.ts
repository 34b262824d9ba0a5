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
import { foldRun, makeEvent, newRunId, nextAction, type RunEvent } from '../shared/runs'
import type { ProcedureStep } from '../shared/procedures/schema'
import { nextDelay } from '../utils/backoff'

const env = (name: string, fallback: string) => process.env[name] || fallback
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
const PASSWORD = 'soak-tablet-password-1'
const REQUEST_TIMEOUT_MS = 15_000

const run = promisify(execFile)
const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))
const started = performance.now()
const clock = () => ((performance.now() - started) / 1000).toFixed(1).padStart(6)
const say = (text: string) => console.log(`[soak ${clock()} s] ${text}`)

// ---------------------------------------------------------------- phases and counters

type Phase = 'steady' | 'db-down' | 'app-down' | 'drain'
let phase: Phase = 'steady'
interface Tally { requests: number, ok: number, statuses: Record<string, number>, network: number, timeouts: number }
const tally = () => ({ requests: 0, ok: 0, statuses: {}, network: 0, timeouts: 0 }) as Tally
const byPhase: Record<string, { sync: Tally, read: Tally }> = {}
const phaseTally = (kind: 'sync' | 'read') => ((byPhase[phase] ??= { sync: tally(), read: tally() })[kind])
const syncLatency: number[] = []
const readLatency: number[] = []
const samples503: string[] = []
let syncInFlight = 0
let replaysSent = 0
let replaysAccepted = 0
const rejected: { id: string, reason: string }[] = []

function count(kind: 'sync' | 'read', outcome: { status?: number, network?: boolean, timeout?: boolean }) {
  const t = phaseTally(kind)
  t.requests++
  if (outcome.timeout) t.timeouts++
  else if (outcome.network) t.network++
  else if (outcome.status! >= 200 && outcome.status! < 300) t.ok++
  else t.statuses[outcome.status!] = (t.statuses[outcome.status!] ?? 0) + 1
}

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

// ---------------------------------------------------------------- HTTP helpers

async function api(method: string, path: string, opts: { cookie?: string, body?: unknown } = {}) {
  const res = await fetch(BASE + path, {
    method,
    headers: { accept: 'application/json', ...(opts.body ? { 'content-type': 'application/json' } : {}), ...(opts.cookie ? { cookie: opts.cookie } : {}) },
    body: opts.body ? JSON.stringify(opts.body) : undefined,
    signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS),
  })
  const text = await res.text()
  let body: any
  try { body = JSON.parse(text) }
  catch {}
  return { status: res.status, body, text, res }
}

async function signIn(email: string, password: string) {
  const answer = await api('POST', '/api/auth/login', { body: { email, password } })
  if (answer.status !== 200) throw new Error(`sign-in of ${email}: ${answer.status} ${answer.text}`)
  return { cookie: answer.res.headers.getSetCookie().map(c => c.split(';')[0]).join('; '), user: answer.body.user }
}

// ---------------------------------------------------------------- one tablet

interface Procedure { id: number, slug: string, current: { id: number, steps: ProcedureStep[] } }

class Tablet {
  readonly deviceId: string
  cookie = ''
  userId = 0
  /** Events waiting for the server, oldest first, kept until accepted (the app's queue). */
  queue: RunEvent[] = []
  /** Every event this tablet made, by run: the tablet's own log. */
  runs = new Map<string, { steps: ProcedureStep[], events: RunEvent[] }>()
  made = 0
  failures = 0
  retryAt = 0
  current: string | null = null
  sending = false

  constructor(readonly n: number, readonly email: string, readonly machineId: number, readonly procedures: Procedure[]) {
    this.deviceId = `soak-tablet-${String(n).padStart(2, '0')}`
  }

  async signIn() {
    const s = await signIn(this.email, PASSWORD)
    this.cookie = s.cookie
    this.userId = s.user.id
  }

  private append(event: RunEvent) {
    this.runs.get(event.runId)!.events.push(event)
    this.queue.push(event)
    this.made++
  }

  /** One tap on the Run screen: whatever the fold says comes next, made on the tablet. */
  tap() {
    const ctx = { runId: this.current ?? '', actorId: this.userId, deviceId: this.deviceId }
    const log = this.current ? this.runs.get(this.current)! : null
    const state = log ? foldRun(log.steps, log.events) : null
    const next = state && log ? nextAction(state, log.steps, { actorId: this.userId }) : null
    if (!log || !next || next.action === 'none') {
      const procedure = this.procedures[(this.n + this.runs.size) % this.procedures.length]!
      this.current = newRunId()
      this.runs.set(this.current, { steps: procedure.current.steps, events: [] })
      this.append(makeEvent({ ...ctx, runId: this.current }, 'run.started', { procedureVersionId: procedure.current.id, machineId: this.machineId, mode: 'solo' }))
      return
    }
    if (Math.random() < 0.08) {
      this.append(makeEvent(ctx, 'note.added', { stepKey: next.stepKey ?? undefined, text: `Soak note from ${this.deviceId}: dust shoe brushes checked.` }))
      return
    }
    const step = next.step as any
    switch (next.action) {
      case 'acknowledge-hold': this.append(makeEvent(ctx, 'hold.acknowledged', { stepKey: next.stepKey! })); break
      case 'mark-done': this.append(makeEvent(ctx, 'step.done', { stepKey: next.stepKey! })); break
      case 'record-value': this.append(makeEvent(ctx, 'value.recorded', { stepKey: next.stepKey!, value: (step.min + step.max) / 2, unit: step.unit, reason: undefined })); break
      case 'finish': this.append(makeEvent(ctx, 'run.finished')); break
      default:
        // Solo runs of these procedures need no signature or photo; anything else ends the run.
        this.append(makeEvent(ctx, 'run.abandoned', { reason: `The soak tablet cannot do "${next.action}" on its own, so it stops this run.` }))
    }
  }

  /** Sends what waits (at most 500), like stores/sync.ts: backoff with jitter after a failure. */
  async sync(): Promise<void> {
    // One request at a time per tablet, as the app's store does.
    if (this.sending || !this.queue.length || Date.now() < this.retryAt) return
    this.sending = true
    const batch = this.queue.slice(0, 500)
    const t0 = performance.now()
    syncInFlight++
    try {
      const answer = await api('POST', '/api/sync', { cookie: this.cookie, body: { deviceId: this.deviceId, events: batch } })
      syncLatency.push(performance.now() - t0)
      count('sync', { status: answer.status })
      if (answer.status === 401) { await this.signIn(); return }
      if (answer.status !== 200) {
        if (answer.status === 503 && samples503.length < 3) samples503.push(answer.body?.message ?? answer.text)
        throw new Error(String(answer.status))
      }
      const accepted = new Set<string>(answer.body.accepted)
      for (const r of answer.body.rejected) rejected.push(r)
      this.queue = this.queue.filter(e => !accepted.has(e.id))
      this.failures = 0
      // Now and then the same batch again, as a tablet does when an answer was lost: the server
      // must accept it once more and store nothing twice.
      if (Math.random() < 0.1) {
        const again = await api('POST', '/api/sync', { cookie: this.cookie, body: { deviceId: this.deviceId, events: batch } })
        count('sync', { status: again.status })
        if (again.status === 200) {
          replaysSent += batch.length
          replaysAccepted += again.body.accepted.length
          for (const r of again.body.rejected) rejected.push(r)
        }
      }
    }
    catch (error: any) {
      if (error?.name === 'TimeoutError') count('sync', { timeout: true })
      else if (!/^\d+$/.test(error?.message)) count('sync', { network: true })
      this.failures++
      this.retryAt = Date.now() + nextDelay(this.failures)
    }
    finally {
      syncInFlight--
      this.sending = false
    }
  }
}

function percentile(values: number[], p: number) {
  if (!values.length) return NaN
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!
}
const ms = (v: number) => `${v.toFixed(1)} ms`

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
  const procedures = (await api('GET', '/api/procedures', { cookie: owner.cookie })).body as Procedure[]
  const chosen = ['daily-start-up', 'emergency-stop-test'].map(slug => procedures.find(p => p.slug === slug)!)
  const machines = (await api('GET', '/api/machines', { cookie: owner.cookie })).body as { id: number }[]
  const stamp = Date.now().toString(36)
  const tablets: Tablet[] = []
  for (let n = 1; n <= TABLETS; n++) {
    const email = `soak-${stamp}-${n}@demo.jogwise.test`
    const made = await api('POST', '/api/users', { cookie: owner.cookie, body: { name: `Soak Operator ${n}`, email, role: 'operator', password: PASSWORD } })
    if (made.status !== 201) throw new Error(`creating ${email}: ${made.status} ${made.text}`)
    for (const p of chosen) {
      const q = await api('PUT', '/api/qualifications', { cookie: owner.cookie, body: { userId: made.body.id, procedureId: p.id, qualified: true } })
      if (q.status !== 200) throw new Error(`qualifying ${email}: ${q.status} ${q.text}`)
    }
    tablets.push(new Tablet(n, email, machines[n % machines.length]!.id, chosen))
  }
  // Ten at a time: every try counts against the address until its password is checked (so a
  // parallel burst of guesses cannot slip past the limit of 20), and all tablets share 127.0.0.1.
  for (let i = 0; i < tablets.length; i += 10) await Promise.all(tablets.slice(i, i + 10).map(t => t.signIn()))
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
      if (phase === 'drain' && Date.now() > drainEnds) break
    }
  })
  say(`load: ${TABLETS} tablets tapping about every ${TAP_MS} ms and reading ${READ_RATE}×/s each, for ${LOAD_S} s`)
  startReads(APP_KILL_AT_S)

  // Fault 1: MariaDB stopped for a few seconds under load; the same app process must recover.
  const faults: string[] = []
  await sleep(DB_DOWN_AT_S * 1000)
  const pidBefore = server!.pid
  say('fault: stopping MariaDB')
  phase = 'db-down'
  await run('bash', ['scripts/db.sh', 'stop', DB_DIR_NAME])
  const health = await api('GET', '/api/health').catch(e => ({ status: 0, text: String(e) }))
  say(`while MariaDB is down /api/health answers ${health.status}: ${(health as any).body?.message ?? health.text}`)
  await sleep(DB_DOWN_FOR_S * 1000)
  say('fault: starting MariaDB again')
  await run('bash', ['scripts/db.sh', 'start', DB_DIR_NAME, DB_PORT], { env: { ...process.env, JOGWISE_DB_NAME: process.env.NUXT_DB_NAME } })
  phase = 'steady'
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
  for (let i = 0; i < 200 && syncInFlight < 3; i++) await sleep(10)
  const inFlight = syncInFlight
  say(`fault: SIGKILL to the app server (pid ${server!.pid}) with ${inFlight} sync batches in flight`)
  phase = 'app-down'
  const killedAt = performance.now()
  process.kill(server!.pid!, 'SIGKILL')
  await sleep(1000)
  await startServer()
  phase = 'steady'
  faults.push(`app killed (SIGKILL) with ${inFlight} sync batches in flight, serving again after ${ms(performance.now() - killedAt)} (pid ${server!.pid})`)
  say(faults.at(-1)!)
  startReads(Math.max(1, (loadEnds - Date.now()) / 1000))

  await sleep(Math.max(0, loadEnds - Date.now()))
  loadOver = true
  phase = 'drain'
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
  const canon = (events: unknown[]) => JSON.parse(JSON.stringify(events, (k, v) => (k === 'seq' || k === 'flag') ? undefined : v)) as RunEvent[]
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
    `replayed batches:   ${replaysSent} events sent a second time and answered, ${replaysAccepted} of them accepted again as replays`,
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

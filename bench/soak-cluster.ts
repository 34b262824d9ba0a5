// Soak on a cluster: two app servers on a three-node MariaDB Galera cluster, all on loopback.
// 50 simulated tablets, half on each app server (as a sticky load balancer would split them),
// sync run events and read the library for 60 s while one database node is killed with SIGKILL
// and brought back (it rejoins by IST or SST) and one app server is killed and started again.
// At the end every event a tablet made must be stored exactly once, and every run must fold
// to the same state on all three nodes as on its tablet. Started by scripts/soak-cluster.sh
// (npm run soak:cluster), which makes the cluster, the build and the environment, and stops
// everything on exit; this file starts, kills and restarts the app servers and the one node.
import { execFile, spawn, type ChildProcess } from 'node:child_process'
import { openSync, readFileSync, writeFileSync } from 'node:fs'
import { isDeepStrictEqual, promisify } from 'node:util'
import mysql from 'mysql2/promise'
import { foldRun, type RunEvent } from '../shared/runs'
import { api, canon, env, makeTablets, ms, percentile, signIn, sleep, SoakStats } from './soak-kit'

const TABLETS = Number(env('SOAK_TABLETS', '50'))
const LOAD_S = Number(env('SOAK_SECONDS', '60'))
const TAP_MS = Number(env('SOAK_TAP_MS', '700'))
const READ_RATE = Number(env('SOAK_READ_RATE', '1')) // reads per tablet per second
const DRAIN_S = Number(env('SOAK_DRAIN_SECONDS', '90'))
const NODE_KILL_AT_S = Number(env('SOAK_NODE_KILL_AT', '8'))
const NODE_DOWN_FOR_S = Number(env('SOAK_NODE_DOWN_FOR', '5'))
const KILLED_NODE = Number(env('SOAK_KILLED_NODE', '1'))
const APP_KILL_AT_S = Number(env('SOAK_APP_KILL_AT', '30'))
const APP_PORTS = env('SOAK_APP_PORTS', '4501,4502').split(',').map(Number)
const NODE_PORTS = env('SOAK_NODE_PORTS', '4411,4421,4431').split(',').map(Number)
const SERVER_ENTRY = env('SOAK_SERVER_ENTRY', '.data/soak-output/server/index.mjs')
const LOG_DIR = env('SOAK_LOG_DIR', '.data')
const DEMO_PASSWORD = env('NUXT_DEMO_PASSWORD', 'shopfloor-demo-1')
const DB = { user: env('NUXT_DB_USER', 'jogwise'), password: env('NUXT_DB_PASSWORD', 'jogwise-local'), database: env('NUXT_DB_NAME', 'jogwise_cluster') }

const run = promisify(execFile)
const started = performance.now()
const clock = () => ((performance.now() - started) / 1000).toFixed(1).padStart(6)
const say = (text: string) => console.log(`[soak:cluster ${clock()} s] ${text}`)
const stats = new SoakStats()

// ---------------------------------------------------------------- app servers

interface App { name: string, port: number, base: string, hosts: string, child?: ChildProcess }
// Each app server lists every node, its own first (db-nodes.ts): A writes through node 1, B
// through node 2, so their merges meet in Galera's certification.
const apps: App[] = APP_PORTS.map((port, i) => ({
  name: String.fromCharCode(65 + i), port, base: `http://127.0.0.1:${port}`,
  hosts: NODE_PORTS.map((_, j) => `127.0.0.1:${NODE_PORTS[(i + j) % NODE_PORTS.length]}`).join(','),
}))

async function startApp(app: App, seed: boolean) {
  const taken = await fetch(`${app.base}/api/health`, { signal: AbortSignal.timeout(1000) }).then(() => true, () => false)
  if (taken) throw new Error(`port ${app.port} is already in use; stop what listens there or set SOAK_APP_PORTS`)
  const log = openSync(`${LOG_DIR}/soak-cluster-app-${app.name}.log`, 'a')
  app.child = spawn(process.execPath, [SERVER_ENTRY], {
    env: { ...process.env, PORT: String(app.port), HOST: '127.0.0.1', NUXT_DB_HOST: app.hosts, NUXT_DEMO_SEED: seed ? '1' : '', NUXT_DEMO_PASSWORD: DEMO_PASSWORD },
    detached: true, stdio: ['ignore', log, log],
  })
  writeFileSync(`${LOG_DIR}/soak-cluster-app-${app.name}.pid`, String(app.child.pid))
  const until = Date.now() + 90_000
  while (Date.now() < until) {
    try {
      const res = await fetch(`${app.base}/api/health`, { signal: AbortSignal.timeout(2000) })
      if (res.ok && (await res.json()).ready === true && app.child.exitCode === null) return
    }
    catch {}
    await sleep(200)
  }
  throw new Error(`app server ${app.name} did not become ready (log: ${LOG_DIR}/soak-cluster-app-${app.name}.log)`)
}

// ---------------------------------------------------------------- database nodes

async function nodeStatus(port: number) {
  const c = await mysql.createConnection({ host: '127.0.0.1', port, ...DB, connectTimeout: 2000 })
  try {
    const [rows] = await c.query<any[]>(`show status where variable_name in ('wsrep_local_state_comment', 'wsrep_cluster_size', 'wsrep_last_committed')`)
    return Object.fromEntries(rows.map(r => [r.Variable_name, r.Value])) as Record<string, string>
  }
  finally { await c.end() }
}

async function waitSynced(port: number, seconds: number) {
  const until = Date.now() + seconds * 1000
  while (Date.now() < until) {
    const s = await nodeStatus(port).catch(() => null)
    if (s?.wsrep_local_state_comment === 'Synced' && Number(s.wsrep_cluster_size) === NODE_PORTS.length) return s
    await sleep(500)
  }
  return null
}

// ---------------------------------------------------------------- the soak

const down = { node: false, app: false }
const setPhase = (drain = false) => { stats.phase = drain ? 'drain' : down.app ? 'app-down' : down.node ? 'db-node-down' : 'steady' }

async function main() {
  say(`starting app server A on ${apps[0]!.base} (nodes ${apps[0]!.hosts}), with the demo seed`)
  await startApp(apps[0]!, true)
  for (const app of apps.slice(1)) {
    say(`starting app server ${app.name} on ${app.base} (nodes ${app.hosts})`)
    await startApp(app, false)
  }
  let owner: Awaited<ReturnType<typeof signIn>> | undefined
  for (let i = 0; !owner; i++) {
    try { owner = await signIn(apps[0]!.base, 'owner@demo.jogwise.test', DEMO_PASSWORD) }
    catch (error) { if (i >= 60) throw error; await sleep(500) }
  }
  const tablets = await makeTablets(apps[0]!.base, owner.cookie, TABLETS, n => apps[n % apps.length]!.base, stats)
  for (const t of tablets) t.twinBase = apps[(t.n + 1) % apps.length]!.base
  say(`${TABLETS} operators created and signed in, ${tablets.filter(t => t.base === apps[0]!.base).length} on A and ${tablets.filter(t => t.base !== apps[0]!.base).length} on the other`)

  const loadStart = Date.now()
  const loadEnds = loadStart + LOAD_S * 1000
  let loadOver = false
  let drainEnds = Infinity
  const readPaths = ['/api/procedures', '/api/machines']
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
  const readLoops = tablets.map(async (tablet, i) => {
    await sleep(Math.random() * 1000 / READ_RATE)
    while (!loadOver) {
      const t0 = performance.now()
      try {
        const answer = await api(tablet.base, 'GET', readPaths[i++ % readPaths.length]!, { cookie: tablet.cookie })
        stats.readLatency.push(performance.now() - t0)
        stats.count('read', { status: answer.status })
      }
      catch (error: any) { stats.count('read', error?.name === 'TimeoutError' ? { timeout: true } : { network: true }) }
      await sleep(1000 / READ_RATE * (0.5 + Math.random()))
    }
  })
  say(`load: ${TABLETS} tablets tapping about every ${TAP_MS} ms and reading ${READ_RATE}×/s each, for ${LOAD_S} s`)

  // Fault 1: one database node killed (SIGKILL) and started again; it rejoins by IST or SST.
  const faults: string[] = []
  const nodeFault = (async () => {
    try { return await nodeKillAndRejoin() }
    catch (error: any) {
      down.node = false; setPhase(loadOver)
      faults.push(`database node ${KILLED_NODE}: ${String(error?.message ?? error).split('\n')[0]}`)
      say(faults.at(-1)!)
      return false
    }
  })()
  async function nodeKillAndRejoin() {
    await sleep(NODE_KILL_AT_S * 1000)
    const port = NODE_PORTS[KILLED_NODE - 1]!
    say(`fault: SIGKILL to database node ${KILLED_NODE} (127.0.0.1:${port}), app server A's first node`)
    down.node = true; setPhase()
    await run('bash', ['scripts/galera.sh', 'kill', String(KILLED_NODE)])
    const others = NODE_PORTS.filter(p => p !== port)
    await sleep(2000)
    const seen = await nodeStatus(others[0]!).catch(e => ({ error: String(e) }))
    say(`the others meanwhile: ${JSON.stringify(seen)}`)
    await sleep(Math.max(0, NODE_DOWN_FOR_S * 1000 - 2000))
    say(`fault: starting database node ${KILLED_NODE} again`)
    const t0 = performance.now()
    const logOf = (n: number) => `${process.env.GALERA_DATA_DIR ?? '.data'}/${process.env.GALERA_PREFIX ?? 'galera-soak'}-${n}/error.log`
    const linesOf = (n: number) => readFileSync(logOf(n), 'utf8').split('\n')
    const before = NODE_PORTS.map((_, i) => linesOf(i + 1).length)
    await run('bash', ['scripts/galera.sh', 'start', String(KILLED_NODE)], { env: process.env })
    const synced = await waitSynced(port, 120)
    // How it rejoined: the donor's log since the restart. A donor serving IST runs the SST
    // script with --bypass (nothing copied); without it the joiner got a full copy (SST).
    const donorLines = NODE_PORTS.flatMap((_, i) => i + 1 === KILLED_NODE ? [] : linesOf(i + 1).slice(before[i]! - 1))
      .filter(l => /Running: 'wsrep_sst_\S+ --role 'donor'/.test(l))
    const how = !donorLines.length ? 'with no state transfer seen' : donorLines.every(l => l.includes('--bypass')) ? 'by IST (only the write-sets it missed)' : 'by SST (a full copy)'
    down.node = false; setPhase(loadOver)
    faults.push(`database node ${KILLED_NODE} SIGKILLed at ${NODE_KILL_AT_S} s, started again after ${NODE_DOWN_FOR_S} s, ${synced ? `Synced again in ${ms(performance.now() - t0)} (cluster size ${synced.wsrep_cluster_size}), rejoined ${how}` : 'NOT synced within 120 s'}`)
    say(faults.at(-1)!)
    return !!synced
  }

  // Fault 2: an app server killed (SIGKILL) with batches in flight, and started again.
  await sleep(Math.max(0, APP_KILL_AT_S * 1000 - (Date.now() - loadStart)))
  const victim = apps[apps.length - 1]!
  for (let i = 0; i < 200 && stats.syncInFlight < 3; i++) await sleep(10)
  const inFlight = stats.syncInFlight
  say(`fault: SIGKILL to app server ${victim.name} (pid ${victim.child!.pid}) with ${inFlight} sync batches in flight (both servers)`)
  down.app = true; setPhase()
  const killedAt = performance.now()
  process.kill(victim.child!.pid!, 'SIGKILL')
  await sleep(1000)
  await startApp(victim, false)
  down.app = false; setPhase()
  faults.push(`app server ${victim.name} killed (SIGKILL) with ${inFlight} sync batches in flight, serving again after ${ms(performance.now() - killedAt)} (pid ${victim.child!.pid})`)
  say(faults.at(-1)!)

  await sleep(Math.max(0, loadEnds - Date.now()))
  loadOver = true
  setPhase(true)
  drainEnds = Date.now() + DRAIN_S * 1000
  await Promise.all([...tabletLoops, ...readLoops])
  say(`load over; tablets send what still waits (at most ${DRAIN_S} s)`)
  await Promise.all(syncLoops)
  const nodeBack = await nodeFault

  // ---------------------------------------------------------------- the check
  say('waiting until all three nodes are Synced, then reading every node')
  const synced = await Promise.all(NODE_PORTS.map(p => waitSynced(p, 120)))
  const generated = tablets.flatMap(t => [...t.runs.values()].flatMap(r => r.events))
  const generatedIds = new Set(generated.map(e => e.id))
  const waiting = tablets.reduce((n, t) => n + t.queue.length, 0)
  const perNode = await Promise.all(NODE_PORTS.map(port => readNode(port)))
  const first = perNode[0]!
  const storedIds = new Set(first.rows.map(r => r.id))
  const lost = generated.filter(e => !storedIds.has(e.id)).length
  const duplicated = first.rows.length - storedIds.size
  const strangers = [...storedIds].filter(id => !generatedIds.has(id)).length
  const sameRowsOnAll = perNode.every(n => n.rows.length === first.rows.length && n.checksum === first.checksum)

  // Every run folded from each node's events, and each node's summary row, against the tablet.
  const allRuns = tablets.flatMap(t => [...t.runs.entries()].map(([id, r]) => ({ id, tablet: t, ...r })))
  const disagreements: string[] = []
  for (const r of allRuns) {
    const mine = JSON.parse(JSON.stringify(foldRun(r.steps, canon(r.events))))
    const wantStatus = mine.status === 'not-started' ? 'active' : mine.status
    const wantStep = mine.steps[mine.currentStepIndex]?.key ?? null
    perNode.forEach((node, i) => {
      const theirs = JSON.parse(JSON.stringify(foldRun(r.steps, node.eventsByRun.get(r.id) ?? [])))
      const row = node.runs.get(r.id)
      if (!isDeepStrictEqual(theirs, mine)) disagreements.push(`${r.id}: node ${i + 1}'s fold differs from the tablet's`)
      else if (!row || row.status !== wantStatus || row.stepKey !== wantStep) disagreements.push(`${r.id}: node ${i + 1}'s run row ${JSON.stringify(row)} vs tablet ${wantStatus}/${wantStep}`)
    })
  }
  const retried = perNode.map(n => n.certFailures)

  // ---------------------------------------------------------------- the figures
  const loadSeconds = LOAD_S
  const syncs = stats.sum('sync', 'requests')
  const reads = stats.sum('read', 'requests')
  const lines = [
    '',
    '================ Jogwise soak on a cluster ================',
    `topology:           3 Galera nodes (127.0.0.1:${NODE_PORTS.join(', :')}), ${apps.length} app servers (${apps.map(a => `${a.name} ${a.base} → ${a.hosts.split(',')[0]} first`).join('; ')})`,
    `tablets:            ${TABLETS} (each its own operator and session, split across the app servers), load ${loadSeconds} s, total ${clock().trim()} s`,
    `sync requests:      ${syncs} (${(syncs / loadSeconds).toFixed(1)}/s), events made ${generated.length} (${(generated.length / loadSeconds).toFixed(1)}/s), runs ${allRuns.length}`,
    `sync latency:       p50 ${ms(percentile(stats.syncLatency, 50))}, p95 ${ms(percentile(stats.syncLatency, 95))}, p99 ${ms(percentile(stats.syncLatency, 99))}`,
    `reads:              ${reads} (${(reads / loadSeconds).toFixed(1)}/s), GET ${readPaths.join(' and ')}`,
    `read latency:       p50 ${ms(percentile(stats.readLatency, 50))}, p95 ${ms(percentile(stats.readLatency, 95))}, p99 ${ms(percentile(stats.readLatency, 99))}`,
    `all requests:       ${syncs + reads} (${((syncs + reads) / loadSeconds).toFixed(1)}/s); failed answers outside the faults: ${stats.errorsOutside()}`,
    `replayed batches:   ${stats.replaysSent} events sent a second time and answered, ${stats.replaysAccepted} of them accepted again as replays`,
    `twin batches:       ${stats.twinsSent} batches sent to both app servers at the same moment, ${stats.twinsBothOk} answered 200 by both`,
    ...stats.phaseLines(),
    `503 during faults:  ${stats.samples503[0] ?? '(none seen)'}`,
    ...faults.map(f => `fault:              ${f}`),
    `certification:      failures counted by each node (wsrep_local_cert_failures): ${retried.join(' / ')}; brute-force aborts: ${perNode.map(n => n.bfAborts).join(' / ')}`,
    `nodes synced:       ${synced.map((s, i) => `node ${i + 1} ${s ? `${s.wsrep_local_state_comment} at ${s.wsrep_last_committed}` : 'NOT synced'}`).join(', ')}`,
    `events generated:   ${generated.length} (ids unique: ${generatedIds.size === generated.length})`,
    `events stored:      ${perNode.map((n, i) => `node ${i + 1}: ${n.rows.length}`).join(', ')}; same rows and checksum on every node: ${sameRowsOnAll}; ${strangers} not made by a tablet`,
    `still queued:       ${waiting}; rejected by the server: ${stats.rejected.length}${stats.rejected.length ? ` (first: ${stats.rejected[0]!.reason})` : ''}`,
    `lost:               ${lost}`,
    `duplicated:         ${duplicated}`,
    `folds agree:        ${disagreements.length === 0 ? 'yes' : 'NO'}: ${allRuns.length * perNode.length - disagreements.length} of ${allRuns.length * perNode.length} (${allRuns.length} runs × ${perNode.length} nodes; each node's fold and run row equal the tablet's fold)`,
  ]
  console.log(lines.join('\n'))
  for (const d of disagreements.slice(0, 5)) console.log(`  disagreement ${d}`)
  const ok = lost === 0 && duplicated === 0 && strangers === 0 && waiting === 0 && stats.rejected.length === 0 && disagreements.length === 0
    && sameRowsOnAll && nodeBack && synced.every(Boolean) && first.rows.length === generated.length
  console.log(ok ? 'RESULT: PASS — every event stored exactly once on every node, every run folds the same on all three nodes' : 'RESULT: FAIL')
  process.exitCode = ok ? 0 : 1
}

/** One node's copy: the soak's events by run (in seq order), the run rows and a checksum. */
async function readNode(port: number) {
  const c = await mysql.createConnection({ host: '127.0.0.1', port, ...DB, timezone: 'Z' })
  try {
    const [rows] = await c.query<any[]>(`select seq, id, run_id as runId, type, actor_id as actorId, device_id as deviceId, at, payload from run_events where device_id like 'soak-tablet-%' order by seq`)
    const [runRows] = await c.query<any[]>(`select id, status, current_step_key as stepKey from runs where id in (select distinct run_id from run_events where device_id like 'soak-tablet-%')`)
    const [[sum]] = await c.query<any[]>(`select count(*) as n, coalesce(sum(crc32(concat_ws('|', seq, id, run_id, type, actor_id, device_id, at, payload, coalesce(flag, '')))), 0) as checksum from run_events where device_id like 'soak-tablet-%'`)
    const [st] = await c.query<any[]>(`show status where variable_name in ('wsrep_local_cert_failures', 'wsrep_local_bf_aborts')`)
    const status = Object.fromEntries(st.map(r => [r.Variable_name, r.Value]))
    const eventsByRun = new Map<string, RunEvent[]>()
    for (const r of rows) {
      const payload = typeof r.payload === 'string' ? JSON.parse(r.payload) : r.payload
      const event = { ...payload, id: r.id, runId: r.runId, type: r.type, at: new Date(r.at).toISOString(), actorId: r.actorId, deviceId: r.deviceId } as RunEvent
      ;(eventsByRun.get(r.runId) ?? eventsByRun.set(r.runId, []).get(r.runId)!).push(event)
    }
    return {
      rows: rows as { id: string }[], eventsByRun, checksum: `${sum.n}:${sum.checksum}`,
      runs: new Map(runRows.map(r => [r.id, { status: r.status, stepKey: r.stepKey }])),
      certFailures: Number(status.wsrep_local_cert_failures ?? 0), bfAborts: Number(status.wsrep_local_bf_aborts ?? 0),
    }
  }
  finally { await c.end() }
}

main().catch((error) => {
  console.error(`[soak:cluster] ${error?.stack ?? error}`)
  console.log('RESULT: FAIL')
  process.exitCode = 1
}).finally(() => {
  for (const app of apps) {
    if (app.child?.pid && app.child.exitCode === null) {
      try { process.kill(-app.child.pid, 'SIGTERM') }
      catch {}
    }
  }
})

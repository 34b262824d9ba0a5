// Pieces of the soak shared by npm run soak (bench/soak.ts, one app server) and npm run
// soak:cluster (bench/soak-cluster.ts, two app servers on a Galera cluster): the simulated
// tablet, the HTTP helpers, the counters per phase and the percentiles.
import { foldRun, makeEvent, newRunId, nextAction, type RunEvent } from '../shared/runs'
import type { ProcedureStep } from '../shared/procedures/schema'
import { nextDelay } from '../utils/backoff'

export const env = (name: string, fallback: string) => process.env[name] || fallback
export const sleep = (ms: number) => new Promise(r => setTimeout(r, ms))
export const REQUEST_TIMEOUT_MS = 15_000

// ---------------------------------------------------------------- phases and counters

export interface Tally { requests: number, ok: number, statuses: Record<string, number>, network: number, timeouts: number }
const tally = () => ({ requests: 0, ok: 0, statuses: {}, network: 0, timeouts: 0 }) as Tally

/** What the tablets and readers saw, per phase of the soak (steady, a fault, the drain). */
export class SoakStats {
  phase = 'steady'
  byPhase: Record<string, { sync: Tally, read: Tally }> = {}
  syncLatency: number[] = []
  readLatency: number[] = []
  samples503: string[] = []
  syncInFlight = 0
  replaysSent = 0
  replaysAccepted = 0
  /** Batches sent to two app servers at the same moment (soak:cluster), and answered 200 by both. */
  twinsSent = 0
  twinsBothOk = 0
  rejected: { id: string, reason: string }[] = []

  count(kind: 'sync' | 'read', outcome: { status?: number, network?: boolean, timeout?: boolean }) {
    const t = (this.byPhase[this.phase] ??= { sync: tally(), read: tally() })[kind]
    t.requests++
    if (outcome.timeout) t.timeouts++
    else if (outcome.network) t.network++
    else if (outcome.status! >= 200 && outcome.status! < 300) t.ok++
    else t.statuses[outcome.status!] = (t.statuses[outcome.status!] ?? 0) + 1
  }

  sum(kind: 'sync' | 'read', key: 'requests' | 'ok' | 'network' | 'timeouts') {
    return Object.values(this.byPhase).reduce((n, p) => n + p[kind][key], 0)
  }

  /** Failed answers in the phases without a fault. */
  errorsOutside(quiet = ['steady', 'drain']) {
    return quiet.reduce((n, name) => {
      const p = this.byPhase[name]
      return n + (p ? p.sync.requests - p.sync.ok + p.read.requests - p.read.ok : 0)
    }, 0)
  }

  phaseLines() {
    const line = (t: Tally) => `${t.requests} requests, ${t.ok} ok${Object.entries(t.statuses).map(([s, n]) => `, ${n}× ${s}`).join('')}${t.network ? `, ${t.network} network errors` : ''}${t.timeouts ? `, ${t.timeouts} timeouts` : ''}`
    return Object.entries(this.byPhase).flatMap(([name, t]) => [`${`${name}:`.padEnd(20)}sync ${line(t.sync)}`, `${''.padEnd(20)}read ${line(t.read)}`])
  }
}

export function percentile(values: number[], p: number) {
  if (!values.length) return NaN
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.min(sorted.length - 1, Math.ceil((p / 100) * sorted.length) - 1)]!
}
export const ms = (v: number) => `${v.toFixed(1)} ms`

// ---------------------------------------------------------------- HTTP helpers

export async function api(base: string, method: string, path: string, opts: { cookie?: string, body?: unknown } = {}) {
  const res = await fetch(base + path, {
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

export async function signIn(base: string, email: string, password: string) {
  const answer = await api(base, 'POST', '/api/auth/login', { body: { email, password } })
  if (answer.status !== 200) throw new Error(`sign-in of ${email}: ${answer.status} ${answer.text}`)
  return { cookie: answer.res.headers.getSetCookie().map(c => c.split(';')[0]).join('; '), user: answer.body.user }
}

// ---------------------------------------------------------------- one tablet

export interface Procedure { id: number, slug: string, current: { id: number, steps: ProcedureStep[] } }

export const TABLET_PASSWORD = 'soak-tablet-password-1'

export class Tablet {
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
  /** Another app server: now and then a batch goes to both at once (soak:cluster). */
  twinBase = ''

  /** `base` is the app server this tablet talks to (a sticky load balancer's choice). */
  constructor(readonly n: number, readonly email: string, readonly machineId: number, readonly procedures: Procedure[], readonly base: string, readonly stats: SoakStats) {
    this.deviceId = `soak-tablet-${String(n).padStart(2, '0')}`
  }

  async signIn() {
    const s = await signIn(this.base, this.email, TABLET_PASSWORD)
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
    const stats = this.stats
    const batch = this.queue.slice(0, 500)
    const t0 = performance.now()
    stats.syncInFlight++
    try {
      const body = { deviceId: this.deviceId, events: batch }
      // Now and then the same batch to two app servers at the same moment, as when a tablet's
      // retry meets a load balancer that switched servers: both must store it once together.
      const twin = this.twinBase && Math.random() < 0.1
        ? api(this.twinBase, 'POST', '/api/sync', { cookie: this.cookie, body }).catch(() => null)
        : null
      const answer = await api(this.base, 'POST', '/api/sync', { cookie: this.cookie, body })
      stats.syncLatency.push(performance.now() - t0)
      if (twin) {
        const other = await twin
        stats.twinsSent++
        if (other) stats.count('sync', { status: other.status })
        if (other?.status === 200 && answer.status === 200) {
          stats.twinsBothOk++
          for (const r of other.body.rejected) stats.rejected.push(r)
        }
      }
      stats.count('sync', { status: answer.status })
      if (answer.status === 401) { await this.signIn(); return }
      if (answer.status !== 200) {
        if (answer.status === 503 && stats.samples503.length < 3) stats.samples503.push(answer.body?.message ?? answer.text)
        throw new Error(String(answer.status))
      }
      const accepted = new Set<string>(answer.body.accepted)
      for (const r of answer.body.rejected) stats.rejected.push(r)
      this.queue = this.queue.filter(e => !accepted.has(e.id))
      this.failures = 0
      // Now and then the same batch again, as a tablet does when an answer was lost: the server
      // must accept it once more and store nothing twice.
      if (Math.random() < 0.1) {
        const again = await api(this.base, 'POST', '/api/sync', { cookie: this.cookie, body: { deviceId: this.deviceId, events: batch } })
        stats.count('sync', { status: again.status })
        if (again.status === 200) {
          stats.replaysSent += batch.length
          stats.replaysAccepted += again.body.accepted.length
          for (const r of again.body.rejected) stats.rejected.push(r)
        }
      }
    }
    catch (error: any) {
      if (error?.name === 'TimeoutError') stats.count('sync', { timeout: true })
      else if (!/^\d+$/.test(error?.message)) stats.count('sync', { network: true })
      this.failures++
      this.retryAt = Date.now() + nextDelay(this.failures)
    }
    finally {
      stats.syncInFlight--
      this.sending = false
    }
  }
}

/**
 * One operator per tablet, created by the owner through the API and qualified to run two starter
 * procedures alone (solo runs need no trainer on site). `baseOf(n)` picks tablet n's app server.
 */
export async function makeTablets(ownerBase: string, ownerCookie: string, count: number, baseOf: (n: number) => string, stats: SoakStats) {
  const procedures = (await api(ownerBase, 'GET', '/api/procedures', { cookie: ownerCookie })).body as Procedure[]
  const chosen = ['daily-start-up', 'emergency-stop-test'].map(slug => procedures.find(p => p.slug === slug)!)
  const machines = (await api(ownerBase, 'GET', '/api/machines', { cookie: ownerCookie })).body as { id: number }[]
  const stamp = Date.now().toString(36)
  const tablets: Tablet[] = []
  for (let n = 1; n <= count; n++) {
    const email = `soak-${stamp}-${n}@demo.jogwise.test`
    const made = await api(ownerBase, 'POST', '/api/users', { cookie: ownerCookie, body: { name: `Soak Operator ${n}`, email, role: 'operator', password: TABLET_PASSWORD } })
    if (made.status !== 201) throw new Error(`creating ${email}: ${made.status} ${made.text}`)
    for (const p of chosen) {
      const q = await api(ownerBase, 'PUT', '/api/qualifications', { cookie: ownerCookie, body: { userId: made.body.id, procedureId: p.id, qualified: true } })
      if (q.status !== 200) throw new Error(`qualifying ${email}: ${q.status} ${q.text}`)
    }
    tablets.push(new Tablet(n, email, machines[n % machines.length]!.id, chosen, baseOf(n), stats))
  }
  // Ten at a time: every try counts against the address until its password is checked (so a
  // parallel burst of guesses cannot slip past the limit of 20), and all tablets share 127.0.0.1.
  for (let i = 0; i < tablets.length; i += 10) await Promise.all(tablets.slice(i, i + 10).map(t => t.signIn()))
  return tablets
}

/** Events without the server's own fields, for folding what the server sent back. */
export const canon = (events: unknown[]) => JSON.parse(JSON.stringify(events, (k, v) => (k === 'seq' || k === 'flag') ? undefined : v)) as RunEvent[]

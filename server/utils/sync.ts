import { foldRun, parseRunEvent } from '#shared/runs'
import type { RunEvent } from '#shared/runs'
import type { ServerEvent, SyncRejection, SyncRequest, SyncResponse } from '#shared/schemas/sync'
import { runModeFor } from '#shared/types/roles'
import type { ShopUser } from './authz'
import type { FoldedRun } from './ledger-write'

// The server side of offline sync. Each event is checked on its own (one bad event never sinks
// the batch), the good ones are stored in one transaction, ids make replays harmless, and the
// touched runs are folded again with the same shared/runs code the tablets use, so events the
// fold refuses (a late event that passed an open hold…) are stored with a flag for the Ledger.

const BASE_KEYS = new Set(['id', 'runId', 'type', 'at', 'actorId', 'deviceId'])
// MariaDB TIMESTAMP ends in 2038; a tablet clock that far off is wrong in any case.
const MAX_CLOCK_AHEAD_MS = 24 * 60 * 60 * 1000
const EARLIEST_EVENT = Date.parse('2020-01-01T00:00:00Z')

interface StoredRow { seq: number, id: string, runId: string, type: string, actorId: number, deviceId: string, at: Date, payload: Record<string, unknown>, flag: string | null }

export function toServerEvent(row: StoredRow): ServerEvent {
  return { ...row.payload, id: row.id, runId: row.runId, type: row.type, at: row.at.toISOString(), actorId: row.actorId, deviceId: row.deviceId, seq: row.seq, flag: row.flag }
}

export function toRunEvent(row: StoredRow): RunEvent {
  return { ...row.payload, id: row.id, runId: row.runId, type: row.type, at: row.at.toISOString(), actorId: row.actorId, deviceId: row.deviceId } as RunEvent
}

function payloadOf(event: RunEvent): Record<string, unknown> {
  const out: Record<string, unknown> = {}
  for (const [k, v] of Object.entries(event)) if (!BASE_KEYS.has(k) && v !== undefined) out[k] = v
  return out
}

const storedColumns = {
  seq: tables.runEvents.seq, id: tables.runEvents.id, runId: tables.runEvents.runId, type: tables.runEvents.type,
  actorId: tables.runEvents.actorId, deviceId: tables.runEvents.deviceId, at: tables.runEvents.at,
  payload: tables.runEvents.payload, flag: tables.runEvents.flag,
}

export async function mergeSync(user: ShopUser, request: SyncRequest): Promise<SyncResponse> {
  const db = useDB()
  const rejected: SyncRejection[] = []
  const reject = (id: unknown, reason: string) => rejected.push({ id: typeof id === 'string' ? id : String(id ?? ''), reason })

  // 1. Each event on its own: shape, author, clock.
  const candidates: { event: RunEvent, raw: Record<string, unknown> }[] = []
  const seenInBatch = new Set<string>()
  const now = Date.now()
  for (const raw of request.events) {
    const parsed = parseRunEvent(raw)
    if (!parsed.ok) {
      reject(raw.id, parsed.issues.map(i => (i.path ? `${i.path}: ${i.message}` : i.message)).join(' '))
      continue
    }
    const event = parsed.event
    if (seenInBatch.has(event.id)) continue
    seenInBatch.add(event.id)
    if (event.actorId !== user.id) {
      reject(event.id, `This event was made by another person (user ${event.actorId}); it is sent when they sign in on this tablet.`)
      continue
    }
    const t = Date.parse(event.at)
    if (t > now + MAX_CLOCK_AHEAD_MS || t < EARLIEST_EVENT) {
      reject(event.id, `Event time ${event.at} is not believable; check the tablet's date and time.`)
      continue
    }
    candidates.push({ event, raw })
  }

  // 2. Ids already stored: the same event again is accepted (a replay), another one is not.
  const ids = candidates.map(c => c.event.id)
  const existing = ids.length
    ? await db.select({ id: tables.runEvents.id, runId: tables.runEvents.runId, shopId: tables.runEvents.shopId })
      .from(tables.runEvents).where(inArray(tables.runEvents.id, ids))
    : []
  const existingById = new Map(existing.map(e => [e.id, e]))

  // 3. The runs these events belong to, and what a new run needs to be allowed.
  const runIds = [...new Set(candidates.map(c => c.event.runId))]
  const runRows = runIds.length
    ? await db.select({ id: tables.runs.id, shopId: tables.runs.shopId, procedureVersionId: tables.runs.procedureVersionId })
      .from(tables.runs).where(inArray(tables.runs.id, runIds))
    : []
  const runsById = new Map(runRows.map(r => [r.id, r]))
  const people = await db.select({ id: tables.users.id, role: tables.users.role, active: tables.users.active })
    .from(tables.users).where(eq(tables.users.shopId, user.shopId))
  const personById = new Map(people.map(p => [p.id, p]))

  const accepted: string[] = []
  const toInsert: RunEvent[] = []
  const newRuns = new Map<string, typeof tables.runs.$inferInsert>()
  const refusedRuns = new Map<string, string>()

  // run.started first, so the other events of a run started in the same batch find it.
  const ordered = [...candidates].sort((a, b) => Number(b.event.type === 'run.started') - Number(a.event.type === 'run.started'))
  for (const { event, raw } of ordered) {
    const prior = existingById.get(event.id)
    if (prior) {
      if (prior.shopId === user.shopId && prior.runId === event.runId) accepted.push(event.id)
      else reject(event.id, 'That event id is already used by another event.')
      continue
    }
    const run = runsById.get(event.runId)
    if (run && run.shopId !== user.shopId) { reject(event.id, 'No such run.'); continue }
    if (event.type === 'run.started' && !run && !newRuns.has(event.runId)) {
      const problem = await checkRunStart(user, event)
      if (problem) { refusedRuns.set(event.runId, problem); reject(event.id, problem); continue }
      newRuns.set(event.runId, {
        id: event.runId, shopId: user.shopId, machineId: event.machineId, procedureVersionId: event.procedureVersionId,
        startedBy: user.id, mode: event.mode, startedAt: new Date(event.at),
      })
    }
    else if (!run && !newRuns.has(event.runId)) {
      const why = refusedRuns.get(event.runId)
      reject(event.id, why ? `Its run was not accepted: ${why}` : 'The run this event belongs to has not reached the server; send its start first.')
      continue
    }
    if (event.type === 'hold.overridden' && !['owner', 'trainer'].includes(user.role)) {
      reject(event.id, 'Only a trainer or the owner may override a hold.')
      continue
    }
    if (event.type === 'signoff.given') {
      const signer = personById.get(event.signerId)
      if (!signer || !signer.active || !['owner', 'trainer'].includes(signer.role) || signer.role !== event.signerRole) {
        reject(event.id, 'The person signing must be an active trainer or owner of this shop.')
        continue
      }
      if (!checkSignoffProof(event.signerId, event.runId, raw.proof)) {
        reject(event.id, 'The sign-off was not confirmed with the signer\'s PIN or password.')
        continue
      }
    }
    accepted.push(event.id)
    toInsert.push(event)
  }

  // 4. Store, fold the touched runs again and keep their summary and flags current.
  const touched = [...new Set(toInsert.map(e => e.runId))]
  if (toInsert.length) {
    await withWriteRetry(() => db.transaction(async (tx) => {
      if (newRuns.size) await tx.insert(tables.runs).ignore().values([...newRuns.values()])
      await tx.insert(tables.runEvents).ignore().values(toInsert.map(e => ({
        id: e.id, shopId: user.shopId, runId: e.runId, type: e.type, actorId: e.actorId, deviceId: e.deviceId,
        at: new Date(e.at), payload: payloadOf(e),
      })))
      await refoldRuns(tx as unknown as DB, user.shopId, touched)
      // Owner alerts for overrides stored by this batch, in the same transaction (mail outbox).
      await enqueueOverrideAlerts(tx, user, toInsert)
    }))
  }

  // 5. What the tablet does not have yet of the runs it sent or watches.
  const sentIds = new Set(request.events.map(e => e.id))
  const watched = [...new Set([...runIds, ...(request.watch ?? [])])]
  let cursor = request.since ?? 0
  const events: ServerEvent[] = []
  if (watched.length) {
    const rows = await db.select(storedColumns).from(tables.runEvents)
      .where(and(eq(tables.runEvents.shopId, user.shopId), inArray(tables.runEvents.runId, watched), gt(tables.runEvents.seq, request.since ?? 0)))
      .orderBy(asc(tables.runEvents.seq))
    for (const row of rows) {
      cursor = Math.max(cursor, row.seq)
      if (!sentIds.has(row.id)) events.push(toServerEvent(row))
    }
  }
  return { accepted, rejected, events, cursor }
}

/** Is this person allowed to start this run here? Returns the reason when not. */
async function checkRunStart(user: ShopUser, event: Extract<RunEvent, { type: 'run.started' }>): Promise<string | null> {
  const db = useDB()
  // The machine, in this shop
  const [machine] = await db.select({ retiredAt: tables.machines.retiredAt }).from(tables.machines)
    .where(and(eq(tables.machines.id, event.machineId), eq(tables.machines.shopId, user.shopId))).limit(1)
  if (!machine) return 'No such machine in this shop.'
  if (machine.retiredAt) return 'That machine is retired.'
  // The version, in this shop
  const [version] = await db.select({ procedureId: tables.procedureVersions.procedureId }).from(tables.procedureVersions)
    .where(and(eq(tables.procedureVersions.id, event.procedureVersionId), eq(tables.procedureVersions.shopId, user.shopId))).limit(1)
  if (!version) return 'No such procedure version in this shop.'
  if (event.mode === 'solo') {
    // Is this person qualified to run this procedure unsupervised?
    const [q] = await db.select({ id: tables.qualifications.id }).from(tables.qualifications)
      .where(and(eq(tables.qualifications.userId, user.id), eq(tables.qualifications.procedureId, version.procedureId))).limit(1)
    if (runModeFor(user.role, !!q) !== 'solo') {
      return user.role === 'trainee'
        ? 'A trainee\'s run is always guided.'
        : 'You are not yet qualified to run this procedure unsupervised; start it guided.'
    }
  }
  return null
}

/** Folds runs from their stored events and writes back the run summary and event flags. */
export async function refoldRuns(db: DB, shopId: number, runIds: string[]) {
  if (!runIds.length) return
  const runs = await db.select({ id: tables.runs.id, machineId: tables.runs.machineId, procedureVersionId: tables.runs.procedureVersionId })
    .from(tables.runs).where(and(eq(tables.runs.shopId, shopId), inArray(tables.runs.id, runIds)))
  const versions = await loadVersions(shopId, [...new Set(runs.map(r => r.procedureVersionId))], db)
  const rows = await db.select(storedColumns).from(tables.runEvents)
    .where(and(eq(tables.runEvents.shopId, shopId), inArray(tables.runEvents.runId, runIds)))
  const byRun = new Map<string, StoredRow[]>()
  for (const row of rows) (byRun.get(row.runId) ?? byRun.set(row.runId, []).get(row.runId)!).push(row)

  const folded: FoldedRun[] = []
  for (const run of runs) {
    const steps = versions.get(run.procedureVersionId)?.steps ?? []
    const stored = byRun.get(run.id) ?? []
    // No roles passed: overrides and sign-offs were authorized when they were merged, and a
    // later role change must not turn yesterday's valid override into a flagged one.
    const state = foldRun(steps, stored.map(toRunEvent))
    const procedureId = versions.get(run.procedureVersionId)?.procedureId
    if (procedureId !== undefined) folded.push({ run, procedureId, state, steps })
    const flagById = new Map(state.flagged.map(f => [f.event.id, f.code]))
    // Only rows whose flag changed are written.
    const changes = new Map<string | null, string[]>()
    for (const row of stored) {
      const flag = flagById.get(row.id) ?? null
      if (flag !== row.flag) (changes.get(flag) ?? changes.set(flag, []).get(flag)!).push(row.id)
    }
    for (const [flag, ids] of changes) {
      await db.update(tables.runEvents).set({ flag }).where(inArray(tables.runEvents.id, ids))
    }
    await recordFacing(db, shopId, run, state, steps)
    const current = state.steps[state.currentStepIndex]
    await db.update(tables.runs).set({
      status: state.status === 'finished' ? 'finished' : state.status === 'abandoned' ? 'abandoned' : 'active',
      currentStepKey: current?.key ?? null,
      finishedAt: state.finished ? new Date(state.finished.at) : state.abandoned ? new Date(state.abandoned.at) : null,
    }).where(eq(tables.runs.id, run.id))
  }
  // The Ledger's entries and the runs' spindle time, from the same fold (server/utils/ledger-write.ts)
  await writeRunLedger(db, shopId, folded)
}

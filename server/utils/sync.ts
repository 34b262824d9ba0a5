import mysql from 'mysql2'
import { foldRun } from '#shared/runs'
import { checkRunEvent } from '#shared/runs/event-check'
import type { RunEvent, RunState } from '#shared/runs'
import type { ServerEvent, SyncRejection, SyncRequest, SyncResponse } from '#shared/schemas/sync'
import { isLeadRole, runModeFor, type Role } from '#shared/types/roles'
import { isBelievableTime, unbelievableTime } from '#shared/rules/clock'
import type { ShopUser } from './authz'
import type { FoldedRun } from './ledger-write'
import type { Tx } from './db'

// The server side of offline sync. Each event is checked on its own (one bad event never sinks
// the batch), the good ones are stored in one transaction, ids make replays harmless, and the
// touched runs are folded again with the same shared/runs code the tablets use, so events the
// fold refuses (a late event that passed an open hold…) are stored with a flag for the Ledger.

const BASE_KEYS = new Set(['id', 'runId', 'type', 'at', 'actorId', 'deviceId'])

interface StoredRow { seq: number, id: string, runId: string, type: string, actorId: number, deviceId: string, at: Date, payload: Record<string, unknown>, flag: string | null }
/** A stored event as the fold and the Ledger read it. */
type FoldRow = Omit<StoredRow, 'seq'> & { receivedAt: Date }
/** A run this transaction created, whose stored events the caller already has (foldAhead): the rows and, in the same order, the fold's events. */
interface KnownRun { run: { id: string, machineId: number, procedureVersionId: number }, rows: FoldRow[], events: RunEvent[], state?: RunState }

/**
 * `{ ...payload, ...envelope }` (a key of both keeps the payload's place, the envelope's value),
 * copied key by key: node's V8 builds such a spread literal about fifty times slower, and a
 * merge makes one per stored event (issue 14).
 */
function withEnvelope<T extends object>(payload: Record<string, unknown>, envelope: T): Record<string, unknown> & T {
  const out: Record<string, unknown> = {}
  for (const k of Object.keys(payload)) {
    // Stored JSON may hold an own "__proto__" key: kept as data, as the spread keeps it.
    if (k === '__proto__') Object.defineProperty(out, k, { value: payload[k], enumerable: true, writable: true, configurable: true })
    else out[k] = payload[k]
  }
  for (const k of Object.keys(envelope) as (keyof T & string)[]) out[k] = envelope[k]
  return out as Record<string, unknown> & T
}

export function toServerEvent(row: StoredRow): ServerEvent {
  return withEnvelope(row.payload, { id: row.id, runId: row.runId, type: row.type, at: row.at.toISOString(), actorId: row.actorId, deviceId: row.deviceId, seq: row.seq, flag: row.flag })
}

export function toRunEvent(row: Omit<StoredRow, 'seq'>): RunEvent {
  return withEnvelope(row.payload, { id: row.id, runId: row.runId, type: row.type, at: row.at.toISOString(), actorId: row.actorId, deviceId: row.deviceId }) as unknown as RunEvent
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

/**
 * Merges one batch. `address` is the tablet's (request-origin.ts): wrong PINs in sealed
 * sign-offs count against the signer's sign-off throttle from there.
 */
export async function mergeSync(user: ShopUser, request: SyncRequest, address = 'unknown'): Promise<SyncResponse> {
  const rejected: SyncRejection[] = []
  const reject = (id: unknown, reason: string) => rejected.push({ id: typeof id === 'string' ? id : String(id ?? ''), reason })

  // 1. Each event on its own: shape, author, clock.
  const candidates: { event: RunEvent }[] = []
  const seenInBatch = new Set<string>()
  const now = Date.now()
  for (const raw of request.events) {
    // The zod schema's rules, precompiled for the common case (event-check.ts); zod for the rest
    const parsed = checkRunEvent(raw)
    if (!parsed.ok) {
      reject(raw.id, parsed.issues.map(i => (i.path ? `${i.path}: ${i.message}` : i.message)).join(' '))
      continue
    }
    const event = parsed.event
    // A verdict is the server's to give; whatever the tablet wrote there is dropped.
    delete event.verdict
    if (seenInBatch.has(event.id)) continue
    seenInBatch.add(event.id)
    if (event.actorId !== user.id) {
      reject(event.id, `This event was made by another person (user ${event.actorId}); it is sent when they sign in on this tablet.`)
      continue
    }
    const t = Date.parse(event.at)
    if (!isBelievableTime(t, now)) {
      reject(event.id, unbelievableTime('Event time', event.at))
      continue
    }
    candidates.push({ event })
  }

  // Steps 2 to 5, first trusting that the events of a run this batch starts are new (below); if
  // that turns out wrong nothing was stored, and they are done again with every id looked up.
  // Not for a batch with a sign-off: its seal is opened once (a wrong PIN counts once).
  const trustNewRuns = !candidates.some(c => c.event.type === 'signoff.given')
  try {
    return await mergeChecked(user, request, address, candidates, [...rejected], trustNewRuns)
  }
  catch (error) {
    if (!(error instanceof LookUpFirst)) throw error
    // The only change steps 2 to 5 make to an event, but for a sign-off's seal, is its verdict
    for (const c of candidates) delete c.event.verdict
    return mergeChecked(user, request, address, candidates, [...rejected], false)
  }
}

/**
 * Steps 2 to 5 of mergeSync. `trustNewRuns`: the ids of events whose run this batch starts are
 * not looked up. While that run is not stored, none of its events can be (an event is stored
 * only with its run), so such an id is already stored only under another run, which the run's
 * plain INSERT finds (a duplicate key): then LookUpFirst undoes everything and the caller
 * comes back without trusting. Looking up 500 ids was a tenth of a long run's merge (issue 14).
 */
async function mergeChecked(user: ShopUser, request: SyncRequest, address: string, candidates: { event: RunEvent }[], rejected: SyncRejection[], trustNewRuns: boolean): Promise<SyncResponse> {
  const db = useDB()
  const reject = (id: unknown, reason: string) => rejected.push({ id: typeof id === 'string' ? id : String(id ?? ''), reason })
  // 2.–3. What is already stored: these ids (the same event again is accepted as a replay,
  // another one is not), the runs they belong to, this shop's people and what this person may
  // run solo. The reads do not depend on each other and go out at once (one after another they
  // were a fifth of the merge's time, issue 14).
  const runIds = [...new Set(candidates.map(c => c.event.runId))]
  const startedHere = new Set(trustNewRuns ? candidates.filter(c => c.event.type === 'run.started').map(c => c.event.runId) : [])
  const ids = candidates.filter(c => !startedHere.has(c.event.runId)).map(c => c.event.id)
  // The runs the tablet watches besides these: only this shop's are read back (step 5).
  const batchRuns = new Set(runIds)
  const watchOnly = [...new Set(request.watch ?? [])].filter(id => !batchRuns.has(id))
  const starts = candidates.map(c => c.event).filter((e): e is Extract<RunEvent, { type: 'run.started' }> => e.type === 'run.started')
  // The reads of every batch are written with mysql2's escaping (drizzle's builder took longer to
  // write them than MariaDB to answer them) and sent together, one round trip on one connection
  // (issue 14: each round trip costs about a millisecond beyond MariaDB's own time).
  const reads: string[] = []
  const read = (statement: string, values: Parameters<typeof mysql.format>[1]) => reads.push(mysql.format(statement, values)) - 1
  // The procedures this person may run solo
  const qualificationsAt = read('select procedure_id as procedureId from qualifications where user_id = ?', [user.id])
  // The events stored already
  const existingAt = ids.length ? read(STORED_IDS, [ids]) : -1
  // The runs these events belong to, with their procedure
  const runsAt = runIds.length
    ? read(`select r.id, r.shop_id as shopId, r.procedure_version_id as procedureVersionId, r.started_by as startedBy, r.mode, v.procedure_id as procedureId
        from runs r join procedure_versions v on v.id = r.procedure_version_id where r.id in (?)`, [runIds])
    : -1
  // This shop's people (active is 1 or 0 here)
  const peopleAt = read('select id, name, role, active, pin_hash as pinHash, password_hash as passwordHash from users where shop_id = ?', [user.shopId])
  // Which of the other watched runs are this shop's
  const watchedAt = watchOnly.length ? read('select id from runs where shop_id = ? and id in (?)', [user.shopId, watchOnly]) : -1
  // A run's start is checked (machine, version, mode) alongside, for the few starts a batch holds;
  // the answer is used only when the run turns out not to be stored yet.
  const startsAt = new Map(starts.length <= 3 ? starts.map(e => [e.id, read(...startCheckStatement(user, e))]) : [])
  const results = await useStatementsAtOnce(({ send }) => send(reads))
  const rowsAt = <T>(at: number) => (at < 0 ? [] : results[at] as T[])
  const existing = rowsAt<StoredId>(existingAt)
  const runRows = rowsAt<{ id: string, shopId: number, procedureVersionId: number, startedBy: number, mode: 'guided' | 'solo', procedureId: number }>(runsAt)
  const people = rowsAt<{ id: number, name: string, role: Role, active: number, pinHash: string | null, passwordHash: string }>(peopleAt)
  const qualifications = rowsAt<{ procedureId: number }>(qualificationsAt)
  const watchedRows = rowsAt<{ id: string }>(watchedAt)
  const runsById = new Map(runRows.map(r => [r.id, r]))
  // A run this batch starts that is stored already (the batch sent again): its ids are looked up after all.
  const startedStored = candidates.filter(c => startedHere.has(c.event.runId) && runsById.has(c.event.runId)).map(c => c.event.id)
  if (startedStored.length) existing.push(...await storedIds(db, startedStored))
  const existingById = new Map(existing.map(e => [e.id, e]))
  const personById = new Map(people.map(p => [p.id, { ...p, active: p.active === 1 }]))
  // The Ledger names people of this shop only (ledger-write.ts): read here once, not again per run
  const peopleIds = new Set(people.map(p => p.id))
  const qualifiedFor = new Set(qualifications.map(q => q.procedureId))
  // Who may act on the runs already stored (run-actors.ts), and how many events each holds. A
  // run not stored yet has no events stored either (an event is stored only with its run).
  const [crews, sizes] = await Promise.all([
    loadRunCrews(db, user.shopId, runRows.filter(r => r.shopId === user.shopId)),
    runSizes(runIds.filter(id => runsById.has(id))),
  ])
  const batchNonces = new Set<string>()
  const nonces: (typeof tables.signoffNonces.$inferInsert)[] = []
  const failedSignoffs: Parameters<typeof enqueueSignoffFailedAlerts>[2] = []

  const accepted: string[] = []
  const toInsert: RunEvent[] = []
  const newRuns = new Map<string, typeof tables.runs.$inferInsert>()
  const refusedRuns = new Map<string, string>()

  // run.started first, so the other events of a run started in the same batch find it.
  const ordered = [...candidates].sort((a, b) => Number(b.event.type === 'run.started') - Number(a.event.type === 'run.started'))
  for (const { event } of ordered) {
    const prior = existingById.get(event.id)
    if (prior) {
      if (prior.shopId === user.shopId && prior.runId === event.runId) accepted.push(event.id)
      else reject(event.id, 'That event id is already used by another event.')
      continue
    }
    const run = runsById.get(event.runId)
    if (run && run.shopId !== user.shopId) { reject(event.id, 'No such run.'); continue }
    if (event.type === 'run.started' && !run && !newRuns.has(event.runId)) {
      const checked = startsAt.get(event.id)
      const problem = checked === undefined
        ? await checkRunStart(user, event, qualifiedFor)
        : startProblem(user, event, rowsAt<StartCheckRow>(checked)[0], qualifiedFor)
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
    if (event.type === 'hold.overridden' && !isLeadRole(user.role)) {
      reject(event.id, 'Only a trainer or the owner may override a hold.')
      continue
    }
    const crew = crews.get(event.runId)
    const notAllowed = crew ? actorProblem(crew, user, qualifiedFor, event) : null
    if (notAllowed) {
      // Kept on the record, not counted (the fold flags it): visible to the owner either way.
      event.verdict = { status: 'refused', code: 'actor-not-allowed', reason: notAllowed }
      if (event.type === 'signoff.given') delete event.seal
    }
    else if (event.type === 'run.handed-over') {
      const to = personById.get(event.toUserId)
      if (!to || !to.active) { reject(event.id, 'A run can be handed over only to an active member of this shop.'); continue }
      crew?.handedTo.add(event.toUserId)
    }
    else if (event.type === 'signoff.given') {
      const signer = personById.get(event.signerId)
      if (!signer || !signer.active || !isLeadRole(signer.role) || signer.role !== event.signerRole) {
        reject(event.id, 'The person signing must be an active trainer or owner of this shop.')
        continue
      }
      // The sealed PIN or password, bound to this very event (signoff-verify.ts)
      const target = { runId: event.runId, stepKey: event.stepKey ?? null, signerId: event.signerId, eventId: event.id, at: event.at }
      const verdict = await verdictForSeal(event.seal, target, signer, address, nonce => batchNonces.has(nonce) || usedNonce(nonce))
      if (verdict.outcome === 'reject') { reject(event.id, verdict.reason); continue }
      batchNonces.add(verdict.nonce)
      nonces.push({ nonce: verdict.nonce, shopId: user.shopId, eventId: event.id, signerId: signer.id })
      // The seal holds the secret: it is opened here and never stored.
      delete event.seal
      if (verdict.outcome === 'failed') {
        event.verdict = { status: 'refused', code: 'signoff-failed', reason: verdict.reason }
        failedSignoffs.push({ event, reason: verdict.reason, signerName: signer.name })
      }
      else event.verdict = { status: 'verified' }
    }
    const overSize = sizeProblem(sizes, event)
    if (overSize) { reject(event.id, overSize); continue }
    accepted.push(event.id)
    toInsert.push(event)
  }

  // 5. (written here, sent after step 4) What the tablet does not have yet of the runs it sent or
  // watches: only this shop's, those of the batch stored before or now and the watched ones found
  // above. The statement, or null when there is nothing to read back.
  const readBack = (stored: ReadonlySet<string>, storedSeq: ReadonlyMap<string, number>) => {
    const storedRuns = new Set(toInsert.filter(e => stored.has(e.id)).map(e => e.runId))
    const watched = [
      ...runIds.filter(id => runsById.get(id)?.shopId === user.shopId || (newRuns.has(id) && storedRuns.has(id))),
      ...watchedRows.map(r => r.id),
    ]
    if (!watched.length) return null
    // The tablet's own events come back only when the server added its verdict to them. Those
    // this batch stored without one are known by their sequence numbers (ranges of the index
    // stepped over, their rows never read); the others by id, their stored JSON looked into.
    const bySeq = new Set(toInsert.filter(e => !e.verdict && storedSeq.has(e.id)).map(e => e.id))
    const ownSeqs = [...bySeq].map(id => storedSeq.get(id)!)
    const own = request.events.map(e => e.id).filter((id): id is string => typeof id === 'string' && !bySeq.has(id))
    const since = request.since ?? 0
    // One statement, so the cursor and the rows come from the same snapshot: the newest of these
    // runs' events (the cursor), beside the rows themselves. The derived table gives one row even
    // when no event is new. Escaped by mysql2 (issue 14). The run index is named: left to itself
    // MariaDB filtered by the shop's whole (shop, time) index, some 20 ms at 45,000 events.
    const newer = (t: string) => mysql.format(`${t}.run_id in (?) and ${t}.seq > ?`, [watched, since])
    const mine = [
      mysql.format(' and r.shop_id = ?', [user.shopId]),
      seqsLeftOut(ownSeqs),
      own.length ? mysql.format(' and (r.id not in (?) or json_exists(r.payload, \'$.verdict\'))', [own]) : '',
    ].join('')
    return `select latest.top, r.seq, r.id, r.run_id as runId, r.type, r.actor_id as actorId, r.device_id as deviceId, r.at, r.payload, r.flag
      from (select max(n.seq) as top from run_events n force index (run_events_run_idx) where ${newer('n')}) latest
      left join run_events r force index (run_events_run_idx) on ${newer('r')}${mine}
      order by r.seq`
  }

  // 4. Store run by run, each in a savepoint of one transaction. An event counts as accepted only
  // once its row is stored (or the same id already was); one MariaDB refuses, or one that makes
  // its run unstorable, is rejected on its own with a reason and the rest go on.
  const stored = new Set<string>()
  // The sequence numbers of rows this batch stored, where the INSERT returned them
  const storedSeq = new Map<string, number>()
  // Step 5's rows when step 4 read them back with its COMMIT (storeStartedRun)
  let readRows: ReadBackRow[] | null | undefined
  if (toInsert.length) {
    const runsToStore = [...new Set(toInsert.map(e => e.runId))]
    const onlyRun = runsToStore.length === 1 ? runsToStore[0]! : undefined
    const newRun = onlyRun === undefined ? undefined : newRuns.get(onlyRun)
    if (newRun && startedHere.has(newRun.id) && !nonces.length && !failedSignoffs.length) {
      // A batch that starts its run and stores nothing else: its transaction in three round trips
      const outcome = await withWriteRetry(() => storeStartedRun(user, newRun, toInsert, peopleIds,
        seqs => readBack(new Set(toInsert.map(e => e.id)), seqs)))
      for (const e of toInsert) stored.add(e.id)
      for (const [id, seq] of outcome.seqs) storedSeq.set(id, seq)
      readRows = outcome.rows
    }
    else {
      // alone: a batch of one run is first stored without a savepoint of its own (two round trips
      // fewer, issue 14); if that run cannot be stored whole, the transaction is undone and the
      // batch stored again the careful way, each run in its savepoint.
      const store = (alone: boolean) => withWriteRetry(() => db.transaction(async (tx) => {
        // Outcomes are kept per try: a write conflict retried (withWriteRetry) starts them afresh.
        const ok = new Set<string>()
        const seqs = new Map<string, number>()
        const refused: SyncRejection[] = []
        // Each seal's nonce, once. Two batches racing with one seal cannot both count it for
        // different events: the seal also names its event, whose id is unique.
        if (nonces.length) await tx.insert(tables.signoffNonces).values(nonces).onDuplicateKeyUpdate({ set: { nonce: sql`nonce` } })
        for (const runId of runsToStore) {
          const newRun = newRuns.get(runId)
          const one = await storeRunEvents(tx as unknown as DB, user, newRun, toInsert.filter(e => e.runId === runId), peopleIds, alone, !!newRun && startedHere.has(runId))
          for (const id of one.stored) ok.add(id)
          for (const [id, seq] of one.seqs) seqs.set(id, seq)
          refused.push(...one.rejected)
        }
        // The override's alert also goes out for stored sign-offs whose signature failed its check
        await enqueueSignoffFailedAlerts(tx, user, failedSignoffs.filter(f => ok.has(f.event.id)))
        return { ok, seqs, refused }
      }))
      let outcome: Awaited<ReturnType<typeof store>>
      try {
        outcome = await store(onlyRun !== undefined)
      }
      catch (error) {
        if (!(error instanceof StoreAgain)) throw error
        outcome = await store(false)
      }
      for (const id of outcome.ok) stored.add(id)
      for (const [id, seq] of outcome.seqs) storedSeq.set(id, seq)
      for (const r of outcome.refused) reject(r.id, r.reason)
    }
  }
  const inserted = new Set(toInsert.map(e => e.id))
  const storedOrKnown = accepted.filter(id => stored.has(id) || !inserted.has(id))
  accepted.length = 0
  accepted.push(...storedOrKnown)

  // 5. What the tablet does not have yet of the runs it sent or watches (the statement above)
  if (readRows === undefined) {
    const statement = readBack(stored, storedSeq)
    readRows = statement ? (await db.execute(sql.raw(statement)) as unknown as [ReadBackRow[]])[0] : null
  }
  let cursor = request.since ?? 0
  const events: ServerEvent[] = []
  if (readRows) {
    cursor = Math.max(cursor, Number(readRows[0]?.top ?? 0))
    for (const row of readRows) {
      if (row.id === null) continue
      // As drizzle reads them: a timestamp comes as UTC text, the JSON column as text
      const payload = (typeof row.payload === 'string' ? JSON.parse(row.payload) : row.payload) as Record<string, unknown>
      events.push(toServerEvent({ seq: row.seq, id: row.id, runId: row.runId, type: row.type, actorId: row.actorId, deviceId: row.deviceId, at: utcTimestamp(row.at), payload, flag: row.flag }))
    }
  }
  return { accepted, rejected, events, cursor }
}

/** A row of step 5's read-back: the newest sequence number of the runs (top), beside each new row (or nulls when none is new). */
type ReadBackRow = { top: number | null, seq: number, id: string | null, runId: string, type: string, actorId: number, deviceId: string, at: string, payload: unknown, flag: string | null }

type StoredId = { id: string, runId: string, shopId: number }
/** Which of these event ids are stored, and where. Written with mysql2's escaping: drizzle's builder spent longer on 500 ids than MariaDB (issue 14). */
const STORED_IDS = 'select id, run_id as runId, shop_id as shopId from run_events where id in (?)'
const storedIds = (db: DB, ids: string[]) => queryEscaped<StoredId>(db, STORED_IDS, [ids])

/** Was this seal nonce stored with an earlier sign-off? */
async function usedNonce(nonce: string) {
  const [row] = await useDB().select({ nonce: tables.signoffNonces.nonce }).from(tables.signoffNonces).where(eq(tables.signoffNonces.nonce, nonce)).limit(1)
  return !!row
}

// A run is a procedure followed once: a few hundred events. The caps keep one run (and every
// later read and sync of it) small; the last events of a run always fit in a reserve above them.
export const MAX_RUN_EVENTS = 2000
export const MAX_RUN_NOTES = 500
const RUN_RESERVE = 20
const CLOSING_TYPES = new Set(['run.finished', 'run.abandoned', 'run.withdrawn', 'signoff.given'])

async function runSizes(runIds: string[]) {
  const sizes = new Map<string, { events: number, notes: number }>()
  if (!runIds.length) return sizes
  // Events and notes stored per run
  const rows = await useDB().select({
    runId: tables.runEvents.runId,
    events: count(),
    notes: sql<number>`sum(${tables.runEvents.type} = 'note.added')`,
  }).from(tables.runEvents).where(inArray(tables.runEvents.runId, runIds)).groupBy(tables.runEvents.runId)
  for (const r of rows) sizes.set(r.runId, { events: Number(r.events), notes: Number(r.notes ?? 0) })
  return sizes
}

/** Counts the event against its run's caps; the reason when the run is full. */
function sizeProblem(sizes: Map<string, { events: number, notes: number }>, event: RunEvent): string | null {
  const size = sizes.get(event.runId) ?? sizes.set(event.runId, { events: 0, notes: 0 }).get(event.runId)!
  const cap = CLOSING_TYPES.has(event.type) ? MAX_RUN_EVENTS + RUN_RESERVE : MAX_RUN_EVENTS
  if (size.events >= cap) return `This run already holds ${size.events} events, the most one run may hold; finish it and start a new run.`
  if (event.type === 'note.added' && size.notes >= MAX_RUN_NOTES) return `This run already has ${MAX_RUN_NOTES} notes, the most one run may have; put longer remarks in one note.`
  size.events++
  if (event.type === 'note.added') size.notes++
  return null
}

// Drizzle's builder spends about 20 ms turning 500 rows into one INSERT, as long as MariaDB takes
// to store them (issue 14); mysql2's own escaping (format) writes the same statement directly.
// Times as drizzle writes a timestamp column: UTC, milliseconds kept.
// A time already in UTC with milliseconds (what tablets send) is cut as it is; any other offset or
// precision goes through Date.
const UTC_MS = /^\d{4}-\d\d-\d\dT\d\d:\d\d:\d\d\.\d{3}Z$/
const sqlTime = (iso: string) => (UTC_MS.test(iso) ? iso : new Date(iso).toISOString()).slice(0, -1).replace('T', ' ')
function insertEventsSql(shopId: number, events: RunEvent[], json: Map<string, string>, passDuplicates: boolean) {
  const rows = events.map(e => [e.id, shopId, e.runId, e.type, e.actorId, e.deviceId, sqlTime(e.at), json.get(e.id)])
  // These events' rows; with passDuplicates a duplicate id changes nothing, else it refuses the statement
  // The plain form returns each row's sequence number and arrival time (MariaDB's RETURNING)
  return mysql.format(`insert into run_events (id, shop_id, run_id, type, actor_id, device_id, at, payload) values ?${passDuplicates ? ' on duplicate key update id = id' : ' returning id, seq, received_at as receivedAt'}`, [rows])
}

/** A new run's row (mysql2's escaping: drizzle's builder took longer to write it than MariaDB to store it). */
const insertRunSql = (run: typeof tables.runs.$inferInsert) => mysql.format('insert into runs (id, shop_id, machine_id, procedure_version_id, started_by, mode, started_at) values (?, ?, ?, ?, ?, ?, ?)',
  [run.id, run.shopId, run.machineId, run.procedureVersionId, run.startedBy, run.mode, sqlTime(run.startedAt.toISOString())])

/** What the plain INSERT returned of each row it stored (insertEventsSql). */
type Returned = Map<string, { seq: number, receivedAt: Date }>

/**
 * The rows of a run this batch starts, as a read would return them (the same JSON round trip
 * and millisecond time as insertEventsSql, no flag yet), its fold's events as toRunEvent would
 * make them from those rows, and the fold itself: made while MariaDB stores the rows. Used only
 * when this transaction created the run's row and one plain INSERT (no duplicate passed over)
 * stored every event: the run is invisible to every other merge until this one commits, so it
 * holds exactly these rows (issue 14: reading the run's rows back cost a tenth of the merge).
 * Their arrival times come from that INSERT (arrived).
 */
async function foldAhead(shopId: number, run: typeof tables.runs.$inferInsert, events: RunEvent[], json: Map<string, string>): Promise<KnownRun> {
  // (from memory but for a version this server has not folded yet, read outside this
  // transaction: a version's steps never change)
  const steps = (await loadVersionSteps(shopId, [run.procedureVersionId])).get(run.procedureVersionId)?.steps
  const rows: FoldRow[] = []
  const folded: RunEvent[] = []
  for (const ev of events) {
    const payload = JSON.parse(json.get(ev.id)!) as Record<string, unknown>
    const row: FoldRow = { id: ev.id, runId: ev.runId, type: ev.type, actorId: ev.actorId, deviceId: ev.deviceId, at: new Date(ev.at), payload, flag: null, receivedAt: new Date(Number.NaN) }
    rows.push(row)
    folded.push(toRunEvent(row))
  }
  return {
    run: { id: run.id, machineId: run.machineId, procedureVersionId: run.procedureVersionId },
    rows, events: folded, state: steps ? foldRun(steps, folded) : undefined,
  }
}

/** foldAhead's run with each row's arrival time as the INSERT returned it; undefined when it did not return every row. */
function arrived(ahead: KnownRun, returned: Returned): Map<string, KnownRun> | undefined {
  for (const row of ahead.rows) {
    const receivedAt = returned.get(row.id)?.receivedAt
    if (!receivedAt || Number.isNaN(receivedAt.getTime())) return undefined
    row.receivedAt = receivedAt
  }
  return new Map([[ahead.run.id, ahead]])
}

/** What refoldRuns writes back to a run's row. */
export type RunSummary = Pick<typeof tables.runs.$inferInsert, 'status' | 'currentStepKey' | 'finishedAt'>

/** Why a run's new events could not be stored; the message goes back to the tablet. */
class Unstorable extends Error {}

/** The batch's one run could not be stored whole without a savepoint: undo and store again. */
class StoreAgain extends Error {}

/** A run trusted to be new (mergeChecked's trustNewRuns) was not stored as one: undo, look every id up, merge again. */
class LookUpFirst extends Error {}

// Lock waits, deadlocks and a lost connection pass: the batch is tried again later, whole.
const transient = transientDatabaseError

function unstorableReason(error: unknown) {
  if (error instanceof Unstorable) return error.message
  // Never MariaDB's own words to the tablet (they may quote other rows); the server's log has
  // them, for whoever looks after the database. The event stays on the tablet.
  const cause = (error as { cause?: { code?: unknown, message?: unknown } })?.cause ?? error as { code?: unknown, message?: unknown }
  console.error(`[jogwise] sync: the database refused an event: ${String(cause?.code ?? '')} ${String(cause?.message ?? error).slice(0, 300)}`)
  return 'The server could not store this event (the database refused it); it stays on this tablet with this note.'
}

/**
 * Stores one run's new events and folds the run again, all inside a savepoint. Only a duplicate
 * id is passed over (the same event sent twice at once); any other refusal rejects that event.
 * When the run cannot be stored as a whole, each event is tried alone, in order, so a good
 * event is never held back by a bad one beside it.
 */
// unchecked: the run is new to this batch and its events' ids were not looked up
// (mergeChecked's trustNewRuns): they are stored by one plain INSERT with the run's new row, or
// LookUpFirst undoes the transaction.
async function storeRunEvents(tx: DB, user: ShopUser, newRun: typeof tables.runs.$inferInsert | undefined, events: RunEvent[], peopleIds?: ReadonlySet<number>, alone = false, unchecked = false) {
  const stored: string[] = []
  const seqs = new Map<string, number>()
  const rejected: SyncRejection[] = []
  // Each event's stored JSON, written once for the INSERT and the fold both
  const json = new Map(events.map(e => [e.id, JSON.stringify(payloadOf(e))]))
  const attempt = async (batch: RunEvent[], withoutSavepoint = false) => {
    const done: RunEvent[] = []
    let returned: Returned | undefined
    let ahead: KnownRun | undefined
    const within = (work: (sp: Tx) => Promise<void>) => (withoutSavepoint ? work(tx as unknown as Tx) : tx.transaction(work))
    await within(async (sp) => {
      const db = sp as unknown as DB
      // The run's row. Another merge of the same new run may have stored it first; then this one
      // adds to it, and the run's rows are read back below rather than assumed.
      let created = false
      if (newRun) {
        try {
          await db.execute(sql.raw(insertRunSql(newRun)))
          created = true
        }
        catch (error) {
          if (!duplicateKey(error)) throw error
          // Another merge stored this run first: its events may be stored already.
          if (unchecked) throw new LookUpFirst()
        }
      }
      const rowOf = (e: RunEvent) => ({
        id: e.id, shopId: user.shopId, runId: e.runId, type: e.type, actorId: e.actorId, deviceId: e.deviceId,
        at: new Date(e.at), payload: payloadOf(e),
      })
      // The run's rows in one statement (a round trip per event was most of the merge's time,
      // issue 14). Only when MariaDB refuses it are the events tried one by one below, so the
      // one it refuses is named and the others are stored. No savepoint of its own: a statement
      // MariaDB refuses is undone whole by InnoDB (its trigger's writes too), and the errors that
      // undo the whole transaction instead (deadlock, lost connection) are thrown on below.
      // In a run created here no id can be stored already (ids stored before were sorted out
      // above), so the plain INSERT is tried first: when it goes through, every row is new. A
      // duplicate id (the same event sent twice at once) refuses it; the second form passes over it.
      let together = false
      if (batch.length > 1 || unchecked) {
        for (const passDuplicates of created ? [false, true] : [true]) {
          try {
            // These events' rows
            const statement = db.execute(sql.raw(insertEventsSql(user.shopId, batch, json, passDuplicates))) as unknown as Promise<[unknown]>
            // While MariaDB stores a new run's rows, the run is folded from the same events (issue 14)
            if (newRun && created && !passDuplicates) {
              statement.catch(() => {}) // (awaited below; this only keeps it from counting as unhandled meanwhile)
              ahead = await foldAhead(user.shopId, newRun, batch, json)
            }
            const [rows] = await statement
            done.push(...batch)
            together = true
            if (!passDuplicates && Array.isArray(rows)) returned = new Map((rows as { id: string, seq: number, receivedAt: string }[]).map(r => [r.id, { seq: Number(r.seq), receivedAt: utcTimestamp(r.receivedAt) }]))
            break
          }
          catch (error) {
            if (transient(error)) throw error
            // An id stored already (another run's), or a row MariaDB refuses: the careful way
            if (unchecked) throw new LookUpFirst()
            if (!passDuplicates && duplicateKey(error)) continue
            break
          }
        }
      }
      if (!together) {
        for (const e of batch) {
          try {
            await db.transaction(async (one) => {
              // This event's row; a duplicate id changes nothing
              await (one as unknown as DB).insert(tables.runEvents).values(rowOf(e)).onDuplicateKeyUpdate({ set: { id: sql`id` } })
            })
            done.push(e)
          }
          catch (error) {
            if (transient(error)) throw error
            rejected.push({ id: e.id, reason: unstorableReason(error) })
          }
        }
      }
      if (!done.length) return
      // A run this transaction created, its events stored by one plain INSERT, is folded from
      // these events as stored instead of being read back (issue 14, foldAhead).
      const known = ahead && returned ? arrived(ahead, returned) : undefined
      await refoldRuns(db, user.shopId, [done[0]!.runId], done.map(e => e.id), known, peopleIds)
      // Owner alerts for the overrides stored here, in the same transaction (mail outbox).
      await enqueueOverrideAlerts(sp, user, done.filter(e => e.verdict?.status !== 'refused'))
    })
    stored.push(...done.map(e => e.id))
    if (returned) for (const [id, r] of returned) seqs.set(id, r.seq)
  }
  try {
    await attempt(events, alone)
  }
  catch (error) {
    if (transient(error)) throw error
    // A run trusted new that could not be stored whole: the batch again, every id looked up
    if (unchecked) throw error instanceof LookUpFirst ? error : new LookUpFirst()
    // Without a savepoint what this run wrote before the refusal cannot be undone alone.
    if (alone) throw new StoreAgain()
    rejected.length = 0
    if (events.length === 1) {
      rejected.push({ id: events[0]!.id, reason: unstorableReason(error) })
      return { stored, seqs, rejected }
    }
    for (const e of events) {
      try { await attempt([e]) }
      catch (one) {
        if (transient(one)) throw one
        rejected.push({ id: e.id, reason: unstorableReason(one) })
      }
    }
  }
  return { stored, seqs, rejected }
}

/**
 * A batch that starts its run and holds nothing else to store (no sign-off, no other run): one
 * transaction in three round trips where storeRunEvents takes eight (issue 14: on a shop's
 * server each round trip costs about a millisecond beyond MariaDB's own time).
 * 1. BEGIN, the run's row and its events' rows, sent at once; the run is folded meanwhile
 *    (foldAhead) from the events as they are stored.
 * 2. The override alerts, if any (they read the shop's owners).
 * 3. The flags, the run's summary and the Ledger's entries, as statement text (refoldRuns'
 *    deferred), then COMMIT and step 5's read-back (`readBack`, given the rows' sequence numbers),
 *    sent at once.
 * The ids were not looked up (mergeChecked's trustNewRuns): if the run or any event id is stored
 * already, or MariaDB refuses any statement, everything is rolled back and LookUpFirst sends the
 * batch the careful way. A write conflict is thrown on for withWriteRetry.
 */
async function storeStartedRun(user: ShopUser, newRun: typeof tables.runs.$inferInsert, events: RunEvent[], peopleIds: ReadonlySet<number>,
  readBack: (seqs: ReadonlyMap<string, number>) => string | null): Promise<{ seqs: Map<string, number>, rows: ReadBackRow[] | null }> {
  return useStatementsAtOnce(async ({ send, db }) => {
    try {
      const json = new Map(events.map(e => [e.id, JSON.stringify(payloadOf(e))]))
      const opening = send([
        'begin',
        // The run's row, then its events' rows (they return their sequence numbers and arrival times)
        insertRunSql(newRun),
        insertEventsSql(user.shopId, events, json, false),
      ])
      opening.catch(() => {}) // (awaited below; this only keeps it from counting as unhandled meanwhile)
      const ahead = await foldAhead(user.shopId, newRun, events, json)
      const rows = (await opening)[2] as { id: string, seq: number, receivedAt: string }[]
      const returned: Returned = new Map(rows.map(r => [r.id, { seq: Number(r.seq), receivedAt: utcTimestamp(r.receivedAt) }]))
      const known = arrived(ahead, returned)
      if (!known) throw new LookUpFirst()
      const deferred: string[] = []
      await refoldRuns(db, user.shopId, [newRun.id], events.map(e => e.id), known, peopleIds, deferred)
      // Owner alerts for the overrides stored here, in the same transaction (mail outbox).
      await enqueueOverrideAlerts(db as unknown as Tx, user, events.filter(e => e.verdict?.status !== 'refused'))
      const seqs = new Map([...returned].map(([id, r]) => [id, r.seq]))
      const back = readBack(seqs)
      const closing = await send([...deferred, 'commit', ...(back ? [back] : [])])
      return { seqs, rows: back ? closing.at(-1) as ReadBackRow[] : null }
    }
    catch (error) {
      // A lock wait, a write conflict, a lost connection: thrown on (withWriteRetry, or the tablet
      // sends the batch again). Anything else (the run or an event id stored already by another
      // merge, a row or a number MariaDB refuses): undone, and the batch goes the careful way.
      if (transient(error) || error instanceof LookUpFirst) throw error
      throw new LookUpFirst()
    }
  })
}

/**
 * Is this person allowed to start this run here? Returns the reason when not. `qualifiedFor`:
 * the procedures this person may run solo (the caller has read them).
 *
 * A run follows the version that is current when it starts. One started on an older version,
 * or on a retired procedure, is refused, unless the tablet started it (its own clock) before
 * the newer version was published or the procedure retired: it was offline and could not know.
 */
async function checkRunStart(user: ShopUser, event: Extract<RunEvent, { type: 'run.started' }>, qualifiedFor: ReadonlySet<number>): Promise<string | null> {
  const [found] = await queryEscaped<StartCheckRow>(useDB(), ...startCheckStatement(user, event))
  return startProblem(user, event, found, qualifiedFor)
}

/** What startCheckStatement reads: the machine's retirement, the version's procedure and its retirement, and the first newer version. */
type StartCheckRow = { retiredAt: string | null, procedureId: number | null, procedureRetiredAt: string | null, newerVersion: number | null, newerAt: string | null }

/**
 * The machine, in this shop, with the version (in this shop), its procedure and the first
 * version published after it, if any: one statement (issue 14), written with mysql2's escaping
 * (drizzle's builder took longer to write it than MariaDB to answer). Without a newer version
 * the left join gives one row of nulls; with some, the earliest comes first.
 */
function startCheckStatement(user: ShopUser, event: Extract<RunEvent, { type: 'run.started' }>): [string, number[]] {
  return [`select m.retired_at as retiredAt, v.procedure_id as procedureId, p.retired_at as procedureRetiredAt,
      newer.version as newerVersion, newer.created_at as newerAt
    from machines m
      left join procedure_versions v on v.id = ? and v.shop_id = ?
      left join procedures p on p.id = v.procedure_id
      left join procedure_versions newer on newer.procedure_id = v.procedure_id and newer.id > ?
    where m.id = ? and m.shop_id = ?
    order by newer.created_at limit 1`, [event.procedureVersionId, user.shopId, event.procedureVersionId, event.machineId, user.shopId]]
}

/** checkRunStart's verdict from startCheckStatement's row (undefined: no such machine here). */
function startProblem(user: ShopUser, event: Extract<RunEvent, { type: 'run.started' }>, found: StartCheckRow | undefined, qualifiedFor: ReadonlySet<number>): string | null {
  if (!found) return 'No such machine in this shop.'
  if (found.retiredAt) return 'That machine is retired.'
  if (found.procedureId === null) return 'No such procedure version in this shop.'
  const startedAt = Date.parse(event.at)
  if (found.procedureRetiredAt && utcTimestamp(found.procedureRetiredAt).getTime() <= startedAt) {
    return 'This procedure was retired before the run started; it can no longer be run.'
  }
  if (found.newerAt && utcTimestamp(found.newerAt).getTime() <= startedAt) {
    return `Version ${found.newerVersion} of this procedure was published before the run started; start the run again on the current version.`
  }
  // Is this person qualified to run this procedure unsupervised?
  if (event.mode === 'solo' && runModeFor(user.role, qualifiedFor.has(found.procedureId)) !== 'solo') {
    return user.role === 'trainee'
      ? 'A trainee\'s run is always guided.'
      : 'You are not yet qualified to run this procedure unsupervised; start it guided.'
  }
  return null
}

// Derived numbers (readings in mm, spindle minutes) must be finite and of a size a DOUBLE column
// and the Ledger can hold; the API bounds make this unreachable, so it is a last guard.
const MAX_DERIVED = 1e15 * 60
function refuseUnstorableNumbers(value: unknown, depth = 0): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value) || Math.abs(value) > MAX_DERIVED) throw new Unstorable('A number in this run is too large to store; check the reading and enter it again.')
  }
  else if (value && typeof value === 'object' && depth < 12) {
    // (for…in makes no array per object: a long run's state has thousands, issue 14)
    if (Array.isArray(value)) for (const v of value) refuseUnstorableNumbers(v, depth + 1)
    else for (const key in value) refuseUnstorableNumbers((value as Record<string, unknown>)[key], depth + 1)
  }
}

/** Folds runs from their stored events and writes back the run summary and event flags. */
// arrivedIds: the events this batch stored, so the Ledger can say which of them changed the record.
// peopleIds: the ids of this shop's people when the caller has just read them (ledger-write.ts).
// deferred: where the writes go as statement text when the caller sends them with its COMMIT
// (storeStartedRun); used only when the caller knows every run.
export async function refoldRuns(db: DB, shopId: number, runIds: string[], arrivedIds: readonly string[] = [], known?: Map<string, KnownRun>, peopleIds?: ReadonlySet<number>, deferred?: string[]) {
  if (!runIds.length) return
  const toRead = runIds.filter(id => !known?.has(id))
  const runRows = toRead.length
    ? await db.select({
        id: tables.runs.id, machineId: tables.runs.machineId, procedureVersionId: tables.runs.procedureVersionId,
        origin: tables.runs.origin, enteredBy: tables.runs.enteredBy, enteredAt: tables.runs.enteredAt,
      }).from(tables.runs).where(and(eq(tables.runs.shopId, shopId), inArray(tables.runs.id, toRead)))
    : []
  const runs = runRows.map(({ origin, enteredBy, enteredAt, ...r }) => ({
    ...r, paper: origin === 'paper' ? { enteredBy, enteredAt: enteredAt?.toISOString() ?? null } : null,
  }))
  // A run this batch started on a tablet (never a paper run, which is stored on its own route)
  for (const id of runIds) if (known?.has(id)) runs.push({ ...known.get(id)!.run, paper: null })
  const versions = await loadVersionSteps(shopId, [...new Set(runs.map(r => r.procedureVersionId))], db)
  // Read once for the fold and the Ledger both (receivedAt is the Ledger's); runs whose rows
  // the caller knows are not read again.
  const rows: FoldRow[] = toRead.length
    ? await db.select({ ...storedColumns, receivedAt: tables.runEvents.receivedAt }).from(tables.runEvents)
      .where(and(eq(tables.runEvents.shopId, shopId), inArray(tables.runEvents.runId, toRead)))
    : []
  const byRun = new Map<string, FoldRow[]>()
  for (const row of rows) (byRun.get(row.runId) ?? byRun.set(row.runId, []).get(row.runId)!).push(row)
  for (const id of runIds) {
    const k = known?.get(id)
    if (k) { rows.push(...k.rows); byRun.set(id, k.rows) }
  }

  const folded: FoldedRun[] = []
  const summaries = new Map<string, RunSummary>()
  for (const run of runs) {
    const steps = versions.get(run.procedureVersionId)?.steps ?? []
    const stored = byRun.get(run.id) ?? []
    // No roles passed: overrides and sign-offs were authorized when they were merged, and a
    // later role change must not turn yesterday's valid override into a flagged one.
    // (folded ahead from the same steps when the caller knows the run, foldAhead)
    const state = known?.get(run.id)?.state ?? foldRun(steps, known?.get(run.id)?.events ?? stored.map(toRunEvent))
    refuseUnstorableNumbers(state)
    const procedureId = versions.get(run.procedureVersionId)?.procedureId
    if (procedureId !== undefined) folded.push({ run, procedureId, state, steps })
    const flagById = new Map(state.flagged.map(f => [f.event.id, f.code]))
    // Only rows whose flag changed are written.
    const changes = new Map<string | null, string[]>()
    for (const row of stored) {
      const flag = flagById.get(row.id) ?? null
      if (flag !== row.flag) (changes.get(flag) ?? changes.set(flag, []).get(flag)!).push(row.id)
    }
    for (const [flag, ids] of changes) await writeNowOrDefer(db.update(tables.runEvents).set({ flag }).where(inArray(tables.runEvents.id, ids)), deferred)
    await recordFacing(db, shopId, run, state, steps)
    const current = state.steps[state.currentStepIndex]
    const summary: RunSummary = {
      status: state.status === 'finished' || state.status === 'abandoned' || state.status === 'withdrawn' ? state.status : 'active',
      currentStepKey: current?.key ?? null,
      finishedAt: state.finished ? new Date(state.finished.at) : state.abandoned ? new Date(state.abandoned.at) : state.withdrawn ? new Date(state.withdrawn.at) : null,
    }
    // A run the Ledger writes (its procedure known) gets its summary in the Ledger's UPDATE of
    // its spindle time: one statement per run (issue 14).
    if (procedureId !== undefined) summaries.set(run.id, summary)
    else await writeNowOrDefer(db.update(tables.runs).set(summary).where(eq(tables.runs.id, run.id)), deferred)
  }
  // The Ledger's entries and the runs' spindle time, from the same fold (server/utils/ledger-write.ts)
  // The runs whose rows the caller knows were created in its transaction (foldAhead)
  await writeRunLedger(db, shopId, folded, arrivedIds, rows, { summaries, peopleIds, newRuns: new Set(known?.keys()), deferred })
}

import { ledgerEntriesOf, spindleMinutesOf, type LedgerEntryDraft, type LedgerEntryKind, type RunState } from '#shared/runs'
import type { ProcedureStep } from '#shared/procedures/schema'
import { ledgerSummary } from '#shared/schemas/ledger'
import { keySortedJson } from '#shared/rules/json'

// Appends to ledger_entries what the fold of each run a sync batch touched says, and keeps
// runs.spindle_minutes current. Called by refoldRuns inside the merge transaction.
//
// The Ledger is append-only (issue 18): a row is never deleted and its content never rewritten.
// - An entry the fold gives for the first time is appended (revision 1).
// - An entry that no longer holds, or now reads differently (an undone reading, an override a
//   backdated run.abandoned no longer lets count, a "went past a hold" a backdated
//   acknowledgement explains away), stays; it gets changed_at and changed_by, the new reading is
//   appended as the next revision, and an entry-changed row says what changed, which event did
//   it, who sent it, when it arrived and what time it claimed.
// - An event dated well before events other tablets had already delivered for its run gets a
//   backdated row, for the owner to look at.

export interface FoldedRun {
  /** paper: set for a run done on a printed sheet and entered later (paper-run.ts). */
  run: { id: string, machineId: number, paper?: { enteredBy: number | null, enteredAt: string | null } | null }
  procedureId: number
  state: RunState
  steps: readonly ProcedureStep[]
}

/**
 * How far before the newest already-delivered event of another tablet an event may claim to be
 * before it is flagged. Tablet clocks drift by seconds; a minute is common practice for
 * tolerating clock skew between devices, no published source.
 */
export const BACKDATE_TOLERANCE_MS = 60_000

type Row = typeof tables.ledgerEntries.$inferInsert
// entered-from-paper is written once by the paper-run route, never from the fold.
const SELF_WRITTEN: readonly LedgerEntryKind[] = ['entry-changed', 'backdated', 'entered-from-paper']

// Key-sorted JSON, so a detail read back from the database compares equal to a fresh one.
const stable = keySortedJson

const keyOf = (eventId: string, kind: string) => `${eventId}:${kind}`

/** A stored event as the Ledger needs it; refoldRuns passes the rows it has just read. */
export interface LedgerEventRow { id: string, runId: string, type: string, actorId: number, deviceId: string, at: Date, receivedAt: Date, payload: Record<string, unknown> }

/**
 * `summaries`: what refoldRuns writes back to each run's row, set in the same UPDATE as its
 * spindle time (one statement per run, issue 14). `peopleIds`: the shop's people, when the
 * caller has just read them. `newRuns`: runs the caller's transaction created, which hold no
 * entries yet (not read for).
 */
export interface LedgerWriteOptions {
  summaries?: ReadonlyMap<string, Pick<typeof tables.runs.$inferInsert, 'status' | 'currentStepKey' | 'finishedAt'>>
  peopleIds?: ReadonlySet<number>
  newRuns?: ReadonlySet<string>
  /**
   * Where the writes go, as statement text, when the caller sends them itself with its COMMIT
   * (sync.ts, useStatementsAtOnce); only when every run is new, so that nothing here reads back
   * what they write.
   */
  deferred?: string[]
}

export async function writeRunLedger(db: DB, shopId: number, folded: FoldedRun[], arrivedIds: readonly string[] = [], runEvents?: LedgerEventRow[], options: LedgerWriteOptions = {}) {
  if (!folded.length) return
  const runIds = folded.map(f => f.run.id)
  const l = tables.ledgerEntries
  const e = tables.runEvents

  // Estimated machine minutes of the plans these runs attached, in this shop
  const planIds = [...new Set(folded.flatMap(f => f.state.steps.flatMap(s => s.plans.map(p => Number(p.planId)))))]
    .filter(n => Number.isInteger(n) && n > 0)
  const planMinutes = new Map<string, number>()
  if (planIds.length) {
    const plans = await db.select({ id: tables.surfacingPlans.id, summary: tables.surfacingPlans.summary }).from(tables.surfacingPlans)
      .where(and(eq(tables.surfacingPlans.shopId, shopId), inArray(tables.surfacingPlans.id, planIds)))
    for (const p of plans) {
      const seconds = Number(p.summary.totalSeconds)
      if (Number.isFinite(seconds)) planMinutes.set(String(p.id), seconds / 60)
    }
  }

  // When each event of these runs arrived, and from which tablet
  const events: LedgerEventRow[] = runEvents ?? await db.select({ id: e.id, runId: e.runId, type: e.type, actorId: e.actorId, deviceId: e.deviceId, at: e.at, receivedAt: e.receivedAt, payload: e.payload })
    .from(e).where(and(eq(e.shopId, shopId), inArray(e.runId, runIds)))
  const eventById = new Map(events.map(x => [x.id, x]))
  const arrived = new Set(arrivedIds)

  // The entries these runs have now (every revision, changed ones included)
  // (none yet for a run this transaction created: nobody else can have written to it)
  const toRead = runIds.filter(id => !options.newRuns?.has(id))
  const existing = toRead.length
    ? await db.select({
      id: l.id, runId: l.runId, eventId: l.eventId, kind: l.kind, actorId: l.actorId, stepKey: l.stepKey, at: l.at,
      counted: l.counted, revision: l.revision, changedAt: l.changedAt, entryKey: l.entryKey, detail: l.detail,
    }).from(l).where(and(eq(l.shopId, shopId), inArray(l.runId, toRead)))
    : []
  const current = new Map<string, typeof existing[number]>()
  const lastRevision = new Map<string, number>()
  for (const r of existing) {
    if (SELF_WRITTEN.includes(r.kind)) continue
    const k = keyOf(r.eventId, r.kind)
    lastRevision.set(k, Math.max(lastRevision.get(k) ?? 0, r.revision))
    if (r.changedAt === null) current.set(k, r)
  }
  const haveKeys = new Set(existing.map(r => r.entryKey))
  // New runs have no entries to change, so none of the writes below is read back
  const deferred = toRead.length ? undefined : options.deferred

  // Sign-offs are entered under the signer; fall back to the sender if that is not a person of
  // this shop (actor_id must name one).
  const people = options.peopleIds ?? new Set((await db.select({ id: tables.users.id }).from(tables.users).where(eq(tables.users.shopId, shopId))).map(p => p.id))

  const inserts: Row[] = []
  const changes: { old: typeof existing[number], now: Row | null, base: { shopId: number, runId: string, machineId: number, procedureId: number } }[] = []
  for (const f of folded) {
    const base = { shopId, runId: f.run.id, machineId: f.run.machineId, procedureId: f.procedureId }
    // Every entry of a paper run says so, with who entered it and when.
    const drafts: LedgerEntryDraft[] = ledgerEntriesOf(f.state, f.steps)
      .map(d => (f.run.paper ? { ...d, detail: { ...d.detail, fromPaper: f.run.paper } } : d))
    const seen = new Set<string>()
    for (const d of drafts) {
      const k = keyOf(d.eventId, d.kind)
      seen.add(k)
      const actorId = people.has(d.actorId) ? d.actorId : (eventById.get(d.eventId)?.actorId ?? d.actorId)
      const old = current.get(k)
      const row: Row = {
        ...base, eventId: d.eventId, kind: d.kind, actorId, stepKey: d.stepKey, at: new Date(d.at), counted: d.counted, detail: d.detail,
        receivedAt: eventById.get(d.eventId)?.receivedAt ?? null,
      }
      if (old && old.actorId === actorId && old.stepKey === d.stepKey && old.at.getTime() === row.at!.getTime()
        && old.counted === d.counted && stable(old.detail) === stable(d.detail)) continue
      const revision = (lastRevision.get(k) ?? 0) + 1
      row.revision = revision
      row.entryKey = `${k}:${revision}`
      inserts.push(row)
      if (old) changes.push({ old, now: row, base })
    }
    for (const [k, old] of current) if (old.runId === f.run.id && !seen.has(k)) changes.push({ old, now: null, base })

    // Backdated: an event of this batch dated well before the newest event another tablet had
    // already delivered for the same run.
    const delivered = events.filter(x => x.runId === f.run.id && !arrived.has(x.id))
    for (const x of events) {
      if (x.runId !== f.run.id || !arrived.has(x.id) || haveKeys.has(`backdated:${x.id}`)) continue
      let newest: typeof events[number] | null = null
      for (const o of delivered) if (o.deviceId !== x.deviceId && (!newest || o.at > newest.at)) newest = o
      if (!newest || newest.at.getTime() - x.at.getTime() <= BACKDATE_TOLERANCE_MS) continue
      const stepKey = typeof x.payload.stepKey === 'string' ? x.payload.stepKey : null
      const seconds = Math.round((newest.at.getTime() - x.at.getTime()) / 1000)
      inserts.push({
        ...base, eventId: x.id, kind: 'backdated', actorId: x.actorId, stepKey, at: x.receivedAt, receivedAt: x.receivedAt,
        entryKey: `backdated:${x.id}`,
        detail: {
          stepTitle: stepKey ? f.steps.find(s => s.key === stepKey)?.title ?? stepKey : null,
          eventType: x.type, claimedAt: x.at.toISOString(), receivedAt: x.receivedAt.toISOString(), deviceId: x.deviceId,
          newestDelivered: { eventId: newest.id, eventType: newest.type, claimedAt: newest.at.toISOString(), receivedAt: newest.receivedAt.toISOString(), deviceId: newest.deviceId },
          secondsBefore: seconds,
          reason: `A ${x.type} event dated ${seconds} s before a ${newest.type} that another tablet had already delivered for this run.`,
        },
      })
    }

    const minutes = spindleMinutesOf(f.state, f.steps, id => planMinutes.get(id) ?? null)
    await writeNowOrDefer(db.update(tables.runs).set({ ...options.summaries?.get(f.run.id), spindleMinutes: minutes }).where(eq(tables.runs.id, f.run.id)), deferred)
  }
  // ignore(): two merges folding the same run at once may both try to add the same entry
  if (inserts.length) await writeNowOrDefer(db.insert(l).ignore().values(inserts), deferred)
  if (!changes.length) return

  // Each changed entry: one entry-changed row naming the cause, then the old row marked; both
  // in one statement each, however many entries changed.
  const newIds = new Map((await db.select({ id: l.id, entryKey: l.entryKey }).from(l)
    .where(inArray(l.entryKey, changes.flatMap(c => (c.now?.entryKey ? [c.now.entryKey] : ['-']))))).map(r => [r.entryKey, r.id]))
  const now = new Date()
  const changedRows: Row[] = changes.map((c) => {
    const cause = causeOf(c.base.runId, events, arrived)
    const was = ledgerSummary(c.old.kind, c.old.detail ?? {})
    const then = c.now ? ledgerSummary(c.now.kind!, c.now.detail ?? {}) : null
    const what = then === null ? 'no longer stands' : c.now!.counted === false && c.old.counted ? 'is no longer counted' : 'now reads differently'
    return {
      ...c.base,
      eventId: cause?.id ?? c.old.eventId, kind: 'entry-changed', actorId: cause?.actorId ?? c.old.actorId, stepKey: c.old.stepKey,
      at: cause?.receivedAt ?? now, receivedAt: cause?.receivedAt ?? null, entryKey: `changed:${c.old.id}`,
      detail: {
        stepTitle: c.old.detail?.stepTitle ?? null,
        changedEntryId: c.old.id, changedKind: c.old.kind, changedEventId: c.old.eventId,
        was, now: then, newEntryId: c.now?.entryKey ? newIds.get(c.now.entryKey) ?? null : null,
        cause: cause ? { eventId: cause.id, eventType: cause.type, actorId: cause.actorId, deviceId: cause.deviceId, claimedAt: cause.at.toISOString(), receivedAt: cause.receivedAt.toISOString() } : null,
        reason: `Entry #${c.old.id} (${was}) ${what}${then !== null && what === 'now reads differently' ? `: ${then}` : ''}${cause ? `, after a ${cause.type} event dated ${cause.at.toISOString()} arrived at ${cause.receivedAt.toISOString()}` : ''}.`,
      },
    }
  })
  await db.insert(l).ignore().values(changedRows)
  // The entry-changed row of each old entry (its key is unique: ours, or another merge's of the
  // same run that got there first), and the old entries marked by it where still unmarked.
  const markers = await db.select({ id: l.id, entryKey: l.entryKey }).from(l)
    .where(inArray(l.entryKey, changedRows.map(r => r.entryKey!)))
  const markerOf = new Map(markers.map(m => [Number(String(m.entryKey).slice('changed:'.length)), m.id]))
  const marks = changes.map(c => c.old.id).filter(id => markerOf.has(id))
  if (!marks.length) return
  await db.update(l).set({
    changedAt: now,
    changedBy: sql`case ${l.id} ${sql.join(marks.map(id => sql`when ${id} then ${markerOf.get(id)!}`), sql` `)} end`,
  }).where(and(inArray(l.id, marks), isNull(l.changedAt)))
}

// The event of this batch that changed the run's meaning: the earliest-dated one that arrived
// (a backdated event is what rewrites history); null when the fold was run again with nothing new.
function causeOf<T extends { id: string, runId: string, at: Date }>(runId: string, events: T[], arrived: Set<string>): T | null {
  let first: T | null = null
  for (const x of events) if (x.runId === runId && arrived.has(x.id) && (!first || x.at < first.at)) first = x
  return first
}

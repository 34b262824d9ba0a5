import type { LengthUnit } from '#shared/machining'
import type { ProcedureStep, Translations } from '#shared/procedures'
import type { RunEvent } from '#shared/runs'
import type { ServerEvent } from '#shared/schemas/sync'

// The tablet's own copy of each run it has opened: the procedure version, the machine and the
// events the server holds. It draws the Run screen at once and offline; the sync queue adds
// every event the server confirms, so a reload offline still shows it.

export interface RunVersion { id: number, procedureId: number, version: number, title: string, summary: string, steps: ProcedureStep[], translations?: Translations }
export interface RunSnapshot {
  runId: string
  machineId: number
  machineName: string
  /** The machine's own length units: checks written in mm or in are shown in these. */
  machineUnits?: LengthUnit
  version: RunVersion
  serverEvents: ServerEvent[]
  /** Names of the people in the run's record, by user id. */
  people?: Record<number, string>
  savedAt: string
}

const snapshotKey = (runId: string) => `run:${runId}`

export const readRunSnapshot = (runId: string) => localStore.get<RunSnapshot>(snapshotKey(runId))

/** Writes a plain copy (IndexedDB cannot clone Vue proxies). */
export const writeRunSnapshot = (snapshot: RunSnapshot) =>
  localStore.set(snapshotKey(snapshot.runId), JSON.parse(JSON.stringify(snapshot)) as RunSnapshot)

/** Adds events the server confirmed to the copies of their runs this tablet keeps. */
export async function addToRunSnapshots(events: ServerEvent[]) {
  const byRun = new Map<string, ServerEvent[]>()
  for (const e of events) byRun.set(e.runId, [...(byRun.get(e.runId) ?? []), e])
  for (const [runId, list] of byRun) {
    const snap = await readRunSnapshot(runId)
    if (!snap) continue
    const known = new Set(snap.serverEvents.map(e => e.id))
    snap.serverEvents.push(...list.filter(e => !known.has(e.id)))
    await writeRunSnapshot(snap)
  }
}

/**
 * Joins two lists of one run's server events by id. The server never deletes an event, so no
 * copy may drop one the other has (an answer the service worker cached at the run's start knows
 * fewer events than this tablet's copy). On the same id `newer` wins (the server may re-flag an
 * event), except that a tablet's stand-in for an accepted event (seq 0) never replaces a copy the
 * server sent. Server order (seq) is kept; stand-ins go last.
 */
export function mergeServerEvents(older: ServerEvent[], newer: ServerEvent[]): ServerEvent[] {
  const byId = new Map<string, ServerEvent>()
  for (const e of older) byId.set(e.id, e)
  for (const e of newer) {
    const had = byId.get(e.id)
    if (!had || !(e.seq === 0 && had.seq > 0)) byId.set(e.id, e)
  }
  const seqOf = (e: ServerEvent) => (e.seq > 0 ? e.seq : Number.MAX_SAFE_INTEGER)
  return [...byId.values()].sort((a, b) => seqOf(a) - seqOf(b))
}

/** A stored event as the fold reads it (without the server's sequence number and flag). */
export function withoutServerFields(e: ServerEvent): RunEvent {
  const { seq: _seq, flag: _flag, ...event } = e
  return event as unknown as RunEvent
}

import { v7 as uuidv7 } from 'uuid'
import type { FieldIssue } from '../schemas/issues'
import type { Role } from '../types/roles'

// The names and bounds of run events, without their zod schemas (events.ts): the Run screen
// makes its events with these and the quick check (event-quick.ts), so zod loads only when an
// event needs a message (issue 14).

// A run is an append-only log of these events. They are made on the tablet (often offline),
// written to IndexedDB first, synced later and merged by the server, so each one carries its
// own UUIDv7 id, the run's id, the device's clock time, who did it and on which device.

export const RUN_MODES = ['guided', 'solo'] as const
export type RunMode = typeof RUN_MODES[number]

/** Roles whose signature counts as a sign-off and who may override a hold (brief: Trainer, Owner). */
export const SIGNER_ROLES = ['trainer', 'owner'] as const satisfies readonly Role[]
export type SignerRole = typeof SIGNER_ROLES[number]

export const RUN_EVENT_TYPES = [
  'run.started',
  'step.done',
  'hold.acknowledged',
  'value.recorded',
  'note.added',
  'photo.attached',
  'plan.attached',
  'hold.overridden',
  'signoff.given',
  'event.undone',
  'run.finished',
  'run.abandoned',
  'run.handed-over',
  'run.withdrawn',
] as const
export type RunEventType = typeof RUN_EVENT_TYPES[number]

// Written by the server only, when it merges the event (a tablet's own value is replaced):
// a sign-off whose signature was checked, or an event kept on the record but not counted
// (a wrong PIN, a person not on the run). The fold flags a refused event with its code.
export const VERDICT_CODES = ['signoff-failed', 'actor-not-allowed'] as const

// No gauge, meter or hour counter at the machine reads beyond this; the bound keeps sums
// and unit conversions of readings (spindle time, thickness) far from overflowing.
export const MAX_READING = 1_000_000_000

/** Thrown by makeEvent: the message names the first field and reason, `issues` has them all. */
export class RunEventError extends Error {
  constructor(readonly issues: FieldIssue[]) {
    const first = issues[0]
    super(first ? (first.path ? `${first.path}: ${first.message}` : first.message) : 'Invalid run event.')
    this.name = 'RunEventError'
  }
}

/** A new event id. UUIDv7 sorts by creation time, which breaks ties between equal clock times. */
export const newEventId = (): string => uuidv7()

/** A new run id, made on the tablet so a run can start offline. */
export const newRunId = (): string => uuidv7()

export interface EventContext {
  runId: string
  actorId: number
  deviceId: string
  /** Defaults to now on this device's clock. */
  at?: Date | string
  /** Defaults to a new UUIDv7. */
  id?: string
}

/** What makeEvent checks: the payload, with the envelope from `ctx` over it. */
export function eventInput(ctx: EventContext, type: RunEventType, payload: object = {}): Record<string, unknown> {
  const at = ctx.at === undefined ? new Date().toISOString() : typeof ctx.at === 'string' ? ctx.at : ctx.at.toISOString()
  return { ...payload, id: ctx.id ?? newEventId(), runId: ctx.runId, at, actorId: ctx.actorId, deviceId: ctx.deviceId, type }
}

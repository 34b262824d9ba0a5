import type { ProcedureStep, StepKind } from '../procedures/schema'
import { rangeStatus } from '../procedures/range'
import { isMeaningfulReason } from '../procedures/text'
import type { Role } from '../types/roles'
import type { RunEvent } from './events'
import { SIGNER_ROLES, type RunMode, type SignerRole } from './event-kinds'
import { byTimeThenId } from '../rules/order'
import { keySortedJson } from '../rules/json'
import { UNDO_RULES } from './undo'

// The state of a run is a pure fold over its event log. The same function runs on the tablet
// (to draw the Run screen, also offline) and on the server (to flag events during the merge),
// so both always agree on what happened.
//
// Why it is shaped this way:
// - Events are sorted by their client time, ties broken by id, before anything else. The
//   result therefore depends only on the set of events, never on the order they arrived in
//   over a flaky network or from two tablets.
// - An event that breaks a rule is never dropped: it is kept in `flagged` with a code and a
//   sentence, so the Ledger can show it (e.g. a late event that passed an open hold).
// - Undo reverts only the most recent effective action, like a stack. That keeps every rule
//   true after an undo without re-checking the whole log: nothing later can depend on an
//   action that is still on top of the stack. Overrides and sign-offs can never be undone.

export const FLAG_CODES = [
  'invalid-event',
  'duplicate',
  'wrong-run',
  'before-start',
  'already-started',
  'after-finish',
  'unknown-step',
  'wrong-step-kind',
  'passed-unacknowledged-hold',
  'passed-unsigned-hold',
  'already-done',
  'already-cleared',
  'not-acknowledged',
  'missing-value',
  'missing-reason',
  'missing-evidence',
  'missing-plan',
  'unit-mismatch',
  'not-allowed-for-role',
  'self-signoff',
  'signoff-required',
  'steps-incomplete',
  'cannot-finish',
  'undo-target-missing',
  'already-undone',
  'undo-of-override-refused',
  'undo-of-signoff-refused',
  'not-undoable',
  'not-own-event',
  'undo-not-last',
  'withdraw-after-work',
  // Set by the server's verdict at merge (events.ts VERDICT_CODES): kept on the record, not counted.
  'signoff-failed',
  'actor-not-allowed',
] as const
export type FlagCode = typeof FLAG_CODES[number]

export type StepStatus = 'pending' | 'done' | 'acknowledged' | 'overridden' | 'signed'
export type RunStatus = 'not-started' | 'active' | 'finished' | 'abandoned' | 'withdrawn'

export interface FoldOptions {
  /**
   * Roles by user id. When given, overrides and sign-offs are checked against it. When left
   * out, the fold trusts the roles the server already checked before storing the events, and
   * uses the signer role written in each sign-off.
   */
  roles?: Partial<Record<number, Role>>
}

/** Who did something, when and where. */
export interface EventRef { eventId: string, actorId: number, deviceId: string, at: string }

export interface RecordedValue extends EventRef {
  stepKey: string
  value: number
  unit: string
  reason: string | null
  /** Which side of the allowed range the reading fell, or null when inside it. */
  outOfRange: 'below' | 'above' | null
  /** False when the reading is out of range and its reason is missing or too thin. */
  reasonOk: boolean
}

export interface OverrideRecord extends EventRef { stepKey: string, reason: string }

export interface SignoffRecord extends EventRef {
  /** Null for a sign-off of the whole run. */
  stepKey: string | null
  signerId: number
  /** The role that made the signature count (from `roles` when given). */
  signerRole: SignerRole
  /**
   * 'awaiting': sealed on a tablet and not yet checked by the server (it counts meanwhile, so
   * a guided run goes on offline; a failed check later flags it). 'verified': checked.
   */
  check: 'awaiting' | 'verified'
}

export interface HandoverRecord extends EventRef { toUserId: number }

export interface PhotoRecord extends EventRef { stepKey: string, uploadId: string | null, note: string | null }
export interface PlanRecord extends EventRef { stepKey: string, planId: string | null, summary: string }
export interface RunNote extends EventRef { stepKey: string | null, text: string }

export interface StepState {
  key: string
  index: number
  kind: StepKind
  title: string
  status: StepStatus
  /** Counts towards finishing: done, or for a hold cleared, or for a guided sign-off signed. */
  complete: boolean
  /** Key of the earlier hold that is not cleared yet, or null when this step may be worked on. */
  blockedBy: string | null
  /** This run needs a trainer's or owner's signature on this step (guided mode). */
  needsSignoff: boolean
  /** For holds: acknowledged (and signed where needed) or overridden. Null for other kinds. */
  holdCleared: boolean | null
  done: EventRef | null
  acknowledged: EventRef | null
  override: OverrideRecord | null
  signoff: SignoffRecord | null
  /** The reading that counts (the latest one not undone), for checks. */
  value: RecordedValue | null
  readings: RecordedValue[]
  photos: PhotoRecord[]
  plans: PlanRecord[]
}

export interface FlaggedEvent {
  event: RunEvent
  code: FlagCode
  /** One sentence for the person who made the event and for the Ledger. */
  message: string
}

export interface RunStart extends EventRef { procedureVersionId: number, machineId: number, mode: RunMode }

export interface RunState {
  runId: string | null
  status: RunStatus
  started: RunStart | null
  mode: RunMode | null
  steps: StepState[]
  /** Index of the first step that is not complete; equals steps.length when all are. */
  currentStepIndex: number
  completedCount: number
  holdsCleared: Record<string, boolean>
  canFinish: boolean
  /** Keys of steps still to complete, plus 'run-signoff' when a guided run without a sign-off step needs one. */
  finishBlockers: string[]
  finished: EventRef | null
  abandoned: (EventRef & { reason: string }) | null
  /** Taken back before anything was done in it (no reason needed). */
  withdrawn: EventRef | null
  /** Something counts in the run: a step done, a hold cleared, a reading, a photo, a plan, a signature. */
  workDone: boolean
  /** Every reading still in effect, in order, with out-of-range flags. */
  values: RecordedValue[]
  notes: RunNote[]
  /** Every override that took effect. Undo never removes one. */
  overrides: OverrideRecord[]
  /** Every sign-off that took effect. Undo never removes one. */
  signoffs: SignoffRecord[]
  /** Every hand-over of the run to another person, in order. */
  handovers: HandoverRecord[]
  /** Events that took effect, in fold order (including undo events and the events they undid). */
  applied: RunEvent[]
  /** Ids of applied events whose effect was undone. */
  undoneIds: string[]
  flagged: FlaggedEvent[]
  /** The most recent action still in effect (not a note): the only one an undo may target. */
  undoTopId: string | null
}

/** Event time in ms; NaN when the text is not a date (such events are flagged). */
const timeOf = (e: RunEvent) => Date.parse(e.at)

// Unreadable times sort last, so the comparison stays consistent.
const sortTime = (e: RunEvent) => {
  const t = timeOf(e)
  return Number.isNaN(t) ? Number.POSITIVE_INFINITY : t
}

/** Fold order: client time, then id. UUIDv7 ids from one device also sort by creation time. */
export function compareEvents(a: RunEvent, b: RunEvent): number {
  return byTimeThenId(sortTime(a), a.id, sortTime(b), b.id)
}

interface Slot {
  step: ProcedureStep
  index: number
  done: EventRef | null
  ack: EventRef | null
  override: OverrideRecord | null
  signoff: SignoffRecord | null
  readings: RecordedValue[]
  photos: PhotoRecord[]
  plans: PlanRecord[]
}

// What became of an event in the walk. Entries start as FLAGGED until the walk applies them.
const FLAGGED = 0
const APPLIED = 1
const UNDONE = 2
interface Entry { event: RunEvent, t: number, fate: typeof FLAGGED | typeof APPLIED | typeof UNDONE }

const byTimeIdTie = (a: { t: number, id: string, tie: string }, b: { t: number, id: string, tie: string }) =>
  a.t !== b.t ? a.t - b.t : a.id < b.id ? -1 : a.id > b.id ? 1 : a.tie < b.tie ? -1 : a.tie > b.tie ? 1 : 0

// Puts the rare flags raised outside the walk among the walk's own, by time, id and content.
function mergeFlags(walk: FlaggedEvent[], extra: { flag: FlaggedEvent, t: number, tie: string }[]): FlaggedEvent[] {
  const all = [
    ...walk.map(flag => ({ flag, t: Date.parse(flag.event.at), id: flag.event.id, tie: '' })),
    ...extra.map(x => ({ flag: x.flag, t: x.t, id: x.flag.event.id, tie: x.tie })),
  ]
  all.sort(byTimeIdTie)
  return all.map(x => x.flag)
}

// Which step kinds each kind of event may act on. Holds are cleared by acknowledging, never
// by "done"; only holds and the sign-off step take a signature.
const DONE_KINDS: readonly StepKind[] = ['instruction', 'check', 'photo', 'planner', 'signoff']
const HOLD_KIND: readonly StepKind[] = ['hold']
const CHECK_KIND: readonly StepKind[] = ['check']
const PHOTO_KIND: readonly StepKind[] = ['photo']
const PLANNER_KIND: readonly StepKind[] = ['planner']
const SIGNABLE_KINDS: readonly StepKind[] = ['hold', 'signoff']

const refOf = (e: RunEvent): EventRef => ({ eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at })
// Records below spell the reference out rather than spread refOf(e) into them: node's V8 builds
// such a spread literal about fifty times slower, and a sync merge folds every event (issue 14).
const label = (s: Slot) => `step ${s.index + 1} "${s.step.title}"`
const isSignerRole = (r: unknown): r is SignerRole => (SIGNER_ROLES as readonly unknown[]).includes(r)

/**
 * Folds a run's events over the steps of the procedure version it follows.
 * Pure: the inputs are not changed, and the same steps and set of events always give the
 * same state.
 */
export function foldRun(steps: readonly ProcedureStep[], events: readonly RunEvent[], options: FoldOptions = {}): RunState {
  const roles = options.roles

  // 1. One copy per id. Exact copies (a replayed sync) vanish; a different event reusing an id
  //    is kept aside and flagged. The copy that counts is chosen by content, not arrival.
  //    Each kept event gets one record that also carries its fate, so the undo lookup below
  //    needs no second map (a 10,000-event fold allocates as little as it can).
  const entries = new Map<string, Entry>()
  let clashes: Map<string, RunEvent[]> | null = null
  for (const e of events) {
    const prev = entries.get(e.id)
    if (prev === undefined) entries.set(e.id, { event: e, t: sortTime(e), fate: FLAGGED })
    else {
      clashes ??= new Map()
      const list = clashes.get(e.id)
      if (list) list.push(e)
      else clashes.set(e.id, [prev.event, e])
    }
  }
  // Flags raised outside the walk (clashing copies, unreadable times), sorted in at the end.
  const extraFlags: { flag: FlaggedEvent, t: number, tie: string }[] = []
  if (clashes) {
    for (const [id, copies] of clashes) {
      const ranked = copies.map(event => ({ event, t: sortTime(event), tie: keySortedJson(event) }))
      ranked.sort((a, b) => (a.t !== b.t ? a.t - b.t : a.tie < b.tie ? -1 : a.tie > b.tie ? 1 : 0))
      entries.set(id, { event: ranked[0]!.event, t: ranked[0]!.t, fate: FLAGGED })
      let last = ranked[0]!.tie
      for (const c of ranked.slice(1)) {
        if (c.tie === last) continue
        last = c.tie
        extraFlags.push({
          flag: { event: c.event, code: 'duplicate', message: `Another, different event already uses the id ${id}; this copy was not applied.` },
          t: c.t,
          tie: c.tie,
        })
      }
    }
  }

  // 2. Fold order. Events whose time cannot be read are flagged rather than guessed at.
  const ordered: Entry[] = []
  for (const entry of entries.values()) {
    if (entry.t === Number.POSITIVE_INFINITY) {
      extraFlags.push({ flag: { event: entry.event, code: 'invalid-event', message: `The event time "${entry.event.at}" is not a valid date and time.` }, t: entry.t, tie: '' })
    }
    else ordered.push(entry)
  }
  ordered.sort((a, b) => byTimeThenId(a.t, a.event.id, b.t, b.event.id))

  // 3. Walk the log.
  const slots: Slot[] = steps.map((step, index) => ({
    step, index, done: null, ack: null, override: null, signoff: null, readings: [], photos: [], plans: [],
  }))
  const slotByKey = new Map(slots.map(s => [s.step.key, s]))
  const signoffStep = slots.find(s => s.step.kind === 'signoff')

  let runId: string | null = null
  let started: RunStart | null = null
  let finished: EventRef | null = null
  let abandoned: (EventRef & { reason: string }) | null = null
  let withdrawn: EventRef | null = null
  let runSignoff: SignoffRecord | null = null
  const values: RecordedValue[] = []
  let notes: RunNote[] = []
  const overrides: OverrideRecord[] = []
  const signoffs: SignoffRecord[] = []
  const handovers: HandoverRecord[] = []
  const applied: RunEvent[] = []
  const undone: string[] = []
  // Ids of effective actions (everything but notes), oldest first; undo may only take the top.
  const stack: string[] = []

  const guided = () => started?.mode === 'guided'
  const holdNeedsSignoff = (s: Slot) => s.step.kind === 'hold' && guided() && s.step.needsTrainerSignoff
  const holdCleared = (s: Slot) => s.override !== null || (s.ack !== null && (!holdNeedsSignoff(s) || s.signoff !== null))
  const isComplete = (s: Slot): boolean => {
    switch (s.step.kind) {
      case 'hold': return holdCleared(s)
      case 'signoff': return guided() ? s.signoff !== null : (s.done !== null || s.signoff !== null)
      default: return s.done !== null
    }
  }
  const earlierIncomplete = (s: Slot) => slots.slice(0, s.index).filter(o => !isComplete(o))

  // The first hold not yet cleared. Cached because most events do not change any hold.
  let gateCache: Slot | null | undefined
  const gate = (): Slot | null => {
    if (gateCache === undefined) gateCache = slots.find(s => s.step.kind === 'hold' && !holdCleared(s)) ?? null
    return gateCache
  }
  const holdsChanged = () => { gateCache = undefined }

  const finishProblem = (): string | null => {
    const open = slots.filter(s => !isComplete(s))
    if (open.length > 0) return `${open.length} step(s) are not complete, starting with ${label(open[0]!)}.`
    if (guided() && !signoffStep && runSignoff === null) return 'A guided run needs a trainer\'s or owner\'s sign-off before it can finish.'
    return null
  }

  // Helpers acting on the event being folded (`e`), made once rather than per event.
  // Flags raised here come out in fold order, so they need no sorting later.
  const flagged: FlaggedEvent[] = []
  let cur!: Entry
  let e!: RunEvent
  const flag = (code: FlagCode, message: string) => {
    flagged.push({ event: e, code, message })
  }
  const apply = (onStack: boolean) => {
    applied.push(e)
    cur.fate = APPLIED
    if (onStack) stack.push(e.id)
  }
  // Shared checks for events that act on one step: it exists and is the right kind.
  // Returns the slot, or null after flagging.
  const target = (key: string, kinds: readonly StepKind[] | null, what: string): Slot | null => {
    const s = slotByKey.get(key)
    if (!s) {
      flag('unknown-step', `The procedure version has no step with key "${key}".`)
      return null
    }
    if (kinds && !kinds.includes(s.step.kind)) {
      flag('wrong-step-kind', `${what} does not apply to ${label(s)}, which is a ${s.step.kind} step.`)
      return null
    }
    return s
  }
  // No uncleared hold may stand before the step an event acts on.
  const passesGate = (s: Slot, what: string): boolean => {
    const g = gate()
    if (g && g.index < s.index) {
      if (g.ack) flag('passed-unsigned-hold', `${what} on ${label(s)} came before a trainer signed hold ${label(g)}; it was not applied.`)
      else flag('passed-unacknowledged-hold', `${what} on ${label(s)} came before hold ${label(g)} was acknowledged; it was not applied.`)
      return false
    }
    return true
  }

  // One handler per event type, made once. The table's type names every event type, so a new
  // type does not compile until it has a handler here (and an undo rule in undo.ts). Each
  // handler acts on the event being folded; `return` ends its work on that event.
  const handlers: { [T in RunEvent['type']]: (e: Extract<RunEvent, { type: T }>) => void } = {
    'run.started': () => {
      flag('already-started', 'The run had already started; a second start event was not applied.')
    },

    'step.done': (e) => {
      const s = target(e.stepKey, DONE_KINDS, 'Marking done')
      if (!s || !passesGate(s, 'Marking done')) return
      if (isComplete(s)) {
        flag('already-done', `${label(s)} was already complete.`)
        return
      }
      if (s.step.kind === 'signoff') {
        if (guided()) {
          flag('signoff-required', `In a guided run ${label(s)} needs a trainer's or owner's sign-off, not a tap on done.`)
          return
        }
        const open = earlierIncomplete(s)
        if (open.length > 0) {
          flag('steps-incomplete', `${label(s)} can only be done after every earlier step; ${label(open[0]!)} is not complete.`)
          return
        }
      }
      if (s.step.kind === 'check') {
        const v = s.readings.at(-1)
        if (!v) {
          flag('missing-value', `${label(s)} needs a recorded value before it can be done.`)
          return
        }
        if (!v.reasonOk) {
          flag('missing-reason', `The reading ${v.value} ${v.unit} on ${label(s)} is ${v.outOfRange} the allowed range and needs a written reason before the step can be done.`)
          return
        }
      }
      if (s.step.kind === 'photo' && s.photos.length === 0) {
        flag('missing-evidence', `${label(s)} needs a photo (or a photo note) before it can be done.`)
        return
      }
      if (s.step.kind === 'planner' && s.plans.length === 0) {
        flag('missing-plan', `${label(s)} needs an attached plan before it can be done.`)
        return
      }
      s.done = refOf(e)
      apply(true)
    },

    'hold.acknowledged': (e) => {
      const s = target(e.stepKey, HOLD_KIND, 'Acknowledging')
      if (!s || !passesGate(s, 'Acknowledging')) return
      if (s.override) {
        flag('already-cleared', `Hold ${label(s)} was already overridden.`)
        return
      }
      if (s.ack) {
        flag('already-done', `Hold ${label(s)} was already acknowledged.`)
        return
      }
      s.ack = refOf(e)
      holdsChanged()
      apply(true)
    },

    'value.recorded': (e) => {
      const s = target(e.stepKey, CHECK_KIND, 'Recording a value')
      if (!s || !passesGate(s, 'Recording a value')) return
      if (s.done) {
        flag('already-done', `${label(s)} was already done; undo it before recording a new value.`)
        return
      }
      const step = s.step as Extract<ProcedureStep, { kind: 'check' }>
      if (e.unit !== step.unit) {
        flag('unit-mismatch', `${label(s)} is measured in ${step.unit}, but the value was recorded in ${e.unit}.`)
        return
      }
      const outOfRange = rangeStatus(step, e.value)
      const reading: RecordedValue = {
        eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at,
        stepKey: s.step.key,
        value: e.value,
        unit: e.unit,
        reason: e.reason ?? null,
        outOfRange,
        reasonOk: outOfRange === null || isMeaningfulReason(e.reason),
      }
      s.readings.push(reading)
      values.push(reading)
      apply(true)
    },

    'photo.attached': (e) => {
      const s = target(e.stepKey, PHOTO_KIND, 'Attaching a photo')
      if (!s || !passesGate(s, 'Attaching a photo')) return
      if (s.done) {
        flag('already-done', `${label(s)} was already done.`)
        return
      }
      s.photos.push({ eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at, stepKey: s.step.key, uploadId: e.uploadId ?? null, note: e.note ?? null })
      apply(true)
    },

    'plan.attached': (e) => {
      const s = target(e.stepKey, PLANNER_KIND, 'Attaching a plan')
      if (!s || !passesGate(s, 'Attaching a plan')) return
      if (s.done) {
        flag('already-done', `${label(s)} was already done.`)
        return
      }
      s.plans.push({ eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at, stepKey: s.step.key, planId: e.planId ?? null, summary: e.summary })
      apply(true)
    },

    'hold.overridden': (e) => {
      const s = target(e.stepKey, HOLD_KIND, 'An override')
      if (!s) return
      if (roles && !isSignerRole(roles[e.actorId])) {
        flag('not-allowed-for-role', `Only a trainer or the owner may override a hold; user ${e.actorId} is ${roles[e.actorId] ?? 'not a member of this shop'}.`)
        return
      }
      if (!isMeaningfulReason(e.reason)) {
        flag('missing-reason', `An override of ${label(s)} needs a written reason that says why.`)
        return
      }
      if (!passesGate(s, 'An override')) return
      if (holdCleared(s)) {
        flag('already-cleared', `Hold ${label(s)} was already cleared; the override was not needed.`)
        return
      }
      s.override = { eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at, stepKey: s.step.key, reason: e.reason.trim() }
      overrides.push(s.override)
      holdsChanged()
      apply(true)
    },

    'signoff.given': (e) => {
      const role = roles ? roles[e.signerId] : e.signerRole
      if (!isSignerRole(role)) {
        flag('not-allowed-for-role', `Only a trainer or the owner may sign off; user ${e.signerId} is ${role ?? 'not a member of this shop'}.`)
        return
      }
      if (guided() && e.signerId === started?.actorId) {
        flag('self-signoff', 'In a guided run the sign-off must come from someone other than the person doing the run.')
        return
      }
      const signerId = e.signerId
      // A stored verdict says checked; a seal without one is still on its way to the server.
      const check = e.verdict?.status === 'verified' || e.seal === undefined ? 'verified' : 'awaiting'
      const record = (stepKey: string | null): SignoffRecord => ({ eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at, stepKey, signerId, signerRole: role, check })
      if (e.stepKey === undefined) {
        const open = slots.filter(s => !isComplete(s))
        if (open.length > 0) {
          flag('steps-incomplete', `The run can only be signed off once every step is complete; ${label(open[0]!)} is not.`)
          return
        }
        if (runSignoff) {
          flag('already-done', 'The run was already signed off.')
          return
        }
        runSignoff = record(null)
        signoffs.push(runSignoff)
        apply(true)
        return
      }
      const s = target(e.stepKey, SIGNABLE_KINDS, 'A sign-off')
      if (!s || !passesGate(s, 'A sign-off')) return
      if (s.step.kind === 'hold') {
        if (s.override) {
          flag('already-cleared', `Hold ${label(s)} was already overridden.`)
          return
        }
        if (!s.ack) {
          flag('not-acknowledged', `Hold ${label(s)} must be acknowledged before it is signed.`)
          return
        }
        if (s.signoff) {
          flag('already-done', `Hold ${label(s)} was already signed.`)
          return
        }
      }
      else {
        if (isComplete(s)) {
          flag('already-done', `${label(s)} was already complete.`)
          return
        }
        const open = earlierIncomplete(s)
        if (open.length > 0) {
          flag('steps-incomplete', `${label(s)} can only be signed after every earlier step; ${label(open[0]!)} is not complete.`)
          return
        }
      }
      s.signoff = record(s.step.key)
      signoffs.push(s.signoff)
      holdsChanged()
      apply(true)
    },

    'note.added': (e) => {
      if (e.stepKey !== undefined && !slotByKey.has(e.stepKey)) {
        flag('unknown-step', `The procedure version has no step with key "${e.stepKey}".`)
        return
      }
      // Notes are allowed anywhere, even past a hold: a remark about a hazard must never be refused.
      notes.push({ eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at, stepKey: e.stepKey ?? null, text: e.text })
      apply(false)
    },

    'event.undone': (e) => {
      // Only events earlier in fold order have a fate yet; later ones count as missing.
      const t = entries.get(e.targetId)
      const known = t !== undefined && (t.t < cur.t || (t.t === cur.t && t.event.id < e.id))
      if (!known || t.fate === FLAGGED) {
        flag('undo-target-missing', known
          ? 'The event to undo was itself flagged and never took effect.'
          : 'The event to undo is not in the record before this undo.')
        return
      }
      if (t.fate === UNDONE) {
        flag('already-undone', 'That event was already undone.')
        return
      }
      const tt = t.event.type
      if (tt === 'hold.overridden') {
        flag('undo-of-override-refused', 'An override stays on the record for good and cannot be undone.')
        return
      }
      if (tt === 'signoff.given') {
        flag('undo-of-signoff-refused', 'A sign-off stays on the record for good and cannot be undone.')
        return
      }
      if (UNDO_RULES[tt] !== 'undoable') {
        flag('not-undoable', `A ${tt} event cannot be undone.`)
        return
      }
      if (t.event.actorId !== e.actorId) {
        flag('not-own-event', 'Only the person who made an entry can undo it.')
        return
      }
      if (tt === 'note.added') {
        notes = notes.filter(n => n.eventId !== t.event.id)
      }
      else {
        if (stack.at(-1) !== t.event.id) {
          flag('undo-not-last', 'Only the most recent action can be undone, and something else happened after it.')
          return
        }
        stack.pop()
        revert(t.event)
      }
      t.fate = UNDONE
      undone.push(t.event.id)
      apply(false)
    },

    'run.finished': (e) => {
      const problem = finishProblem()
      if (problem) {
        flag('cannot-finish', `The run cannot finish yet: ${problem}`)
        return
      }
      finished = refOf(e)
      apply(false)
    },

    'run.abandoned': (e) => {
      if (!isMeaningfulReason(e.reason)) {
        flag('missing-reason', 'Abandoning a run needs a written reason that says why.')
        return
      }
      abandoned = { eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at, reason: e.reason.trim() }
      apply(false)
    },

    'run.withdrawn': (e) => {
      if (stack.length || overrides.length || signoffs.length) {
        flag('withdraw-after-work', 'A run can be withdrawn only before anything is done in it; stop it with a reason instead.')
        return
      }
      withdrawn = refOf(e)
      apply(false)
    },

    'run.handed-over': (e) => {
      // Who may hand over is the server's rule (sync.ts); the fold only keeps the record.
      handovers.push({ eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at, toUserId: e.toUserId })
      apply(false)
    },
  }

  for (let n = 0; n < ordered.length; n++) {
    cur = ordered[n]!
    e = cur.event

    // The server kept this event on the record but did not let it count (its verdict).
    if (e.verdict?.status === 'refused') {
      flag(e.verdict.code, e.verdict.reason)
      continue
    }

    if (!started) {
      if (e.type === 'run.started') {
        runId = e.runId
        started = { eventId: e.id, actorId: e.actorId, deviceId: e.deviceId, at: e.at, procedureVersionId: e.procedureVersionId, machineId: e.machineId, mode: e.mode }
        holdsChanged()
        apply(false)
      }
      else flag('before-start', 'This event is earlier than the start of the run, or the run has no start event.')
      continue
    }
    if (e.runId !== runId) {
      flag('wrong-run', `This event belongs to run ${e.runId}, not to run ${runId}.`)
      continue
    }
    if (finished || abandoned || withdrawn) {
      flag('after-finish', `The run had already ${finished ? 'finished' : abandoned ? 'been abandoned' : 'been withdrawn'} when this event was made.`)
      continue
    }

    const handle = handlers[e.type] as ((event: RunEvent) => void) | undefined
    if (handle) handle(e)
    else flag('invalid-event', `Unknown event type "${String((e as { type?: unknown }).type)}".`)
  }

  // Reverts the action on top of the stack. Because it is on top, nothing applied later
  // depends on it, so taking it away leaves a state that the remaining events could have made.
  function revert(t: RunEvent) {
    if (!('stepKey' in t) || t.stepKey === undefined) return
    const s = slotByKey.get(t.stepKey)
    if (!s) return
    switch (t.type) {
      case 'step.done':
        s.done = null
        break
      case 'hold.acknowledged':
        s.ack = null
        holdsChanged()
        break
      case 'value.recorded':
        s.readings.pop()
        values.pop()
        break
      case 'photo.attached':
        s.photos.pop()
        break
      case 'plan.attached':
        s.plans.pop()
        break
    }
  }

  // 4. Shape the answer.
  const g = gate()
  const stepStates: StepState[] = slots.map((s) => {
    const cleared = s.step.kind === 'hold' ? holdCleared(s) : null
    let status: StepStatus = 'pending'
    if (s.step.kind === 'hold') status = s.override ? 'overridden' : s.signoff ? 'signed' : s.ack ? 'acknowledged' : 'pending'
    else if (s.step.kind === 'signoff') status = s.signoff ? 'signed' : s.done ? 'done' : 'pending'
    else if (s.done) status = 'done'
    return {
      key: s.step.key,
      index: s.index,
      kind: s.step.kind,
      title: s.step.title,
      status,
      complete: isComplete(s),
      blockedBy: g && g.index < s.index ? g.step.key : null,
      needsSignoff: guided() && (holdNeedsSignoff(s) || s.step.kind === 'signoff'),
      holdCleared: cleared,
      done: s.done,
      acknowledged: s.ack,
      override: s.override,
      signoff: s.signoff,
      value: s.readings.at(-1) ?? null,
      readings: s.readings,
      photos: s.photos,
      plans: s.plans,
    }
  })

  const firstOpen = stepStates.findIndex(s => !s.complete)
  const finishBlockers = stepStates.filter(s => !s.complete).map(s => s.key)
  if (started && guided() && !signoffStep && runSignoff === null) finishBlockers.push('run-signoff')
  const holdsClearedMap: Record<string, boolean> = {}
  for (const s of stepStates) if (s.holdCleared !== null) holdsClearedMap[s.key] = s.holdCleared

  const allFlagged = extraFlags.length === 0 ? flagged : mergeFlags(flagged, extraFlags)

  return {
    runId,
    status: !started ? 'not-started' : finished ? 'finished' : abandoned ? 'abandoned' : withdrawn ? 'withdrawn' : 'active',
    started,
    mode: started?.mode ?? null,
    steps: stepStates,
    currentStepIndex: firstOpen === -1 ? stepStates.length : firstOpen,
    completedCount: stepStates.filter(s => s.complete).length,
    holdsCleared: holdsClearedMap,
    canFinish: started !== null && !finished && !abandoned && !withdrawn && finishProblem() === null,
    finishBlockers,
    finished,
    abandoned,
    withdrawn,
    workDone: stack.length > 0 || overrides.length > 0 || signoffs.length > 0,
    values,
    notes,
    overrides,
    signoffs,
    handovers,
    applied,
    undoneIds: undone,
    flagged: allFlagged,
    undoTopId: stack.at(-1) ?? null,
  }
}

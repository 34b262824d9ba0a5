import type { ProcedureStep } from '../procedures/schema'
import { describeRange } from '../procedures/range'
import type { RunEvent } from './events'
import type { EventRef, RunState } from './fold'
import type { LedgerEntryKind } from './ledger-kinds'
import { byTimeThenId } from '../rules/order'

export * from './ledger-kinds'

// What a run contributes to the Ledger, read off the fold's state. Pure, so the sync merge can
// compare it with the entries already written after every batch (server/utils/ledger-write.ts
// appends what is new and marks what stopped being true; it never deletes) and the rules can be
// tested without a database.

export interface LedgerEntryDraft {
  /** The event the entry is about; with kind, the entry's identity. */
  eventId: string
  kind: LedgerEntryKind
  actorId: number
  stepKey: string | null
  at: string
  /** False for an event the fold did not count (refused, or undone); detail.notCounted says why. */
  counted: boolean
  detail: Record<string, unknown>
}

// The fold's codes for an event that acted past a hold that was not cleared yet.
const PAST_HOLD_CODES = new Set(['passed-unacknowledged-hold', 'passed-unsigned-hold'])

/**
 * The Ledger entries of one run:
 * - override: every hold override the fold accepted (undo can never remove one);
 * - late-past-hold: every event the fold refused because it acted past an open hold (typically
 *   made offline on another tablet and synced after the hold's state was known);
 * - out-of-range: every reading still in effect that lies outside the check's allowed range;
 * - skipped-check: a check step with no reading in effect while work was recorded on a later
 *   step (the fold only blocks steps behind holds, so a person can move past a check without
 *   measuring). The entry hangs on the earliest such later action; checks passed by the same
 *   action share one entry (detail.steps). Filling in the reading later removes it. Checks
 *   never reached (an abandoned run) are not skipped: nothing was done past them.
 * - hold-acknowledged, signed-off: every acknowledgement and sign-off stored for the run;
 * - an override, acknowledgement or sign-off the fold did not count (two tablets on one run,
 *   a run already ended, an undone acknowledgement…) is still an entry, with counted false and
 *   the reason in detail.notCounted: the owner sees everything that was sent, not only what won.
 */
export function ledgerEntriesOf(state: RunState, steps: readonly ProcedureStep[]): LedgerEntryDraft[] {
  const out: LedgerEntryDraft[] = []
  const stepByKey = new Map(steps.map(s => [s.key, s]))
  const titleOf = (key: string | null) => (key ? stepByKey.get(key)?.title ?? key : null)

  const signalWordOf = (key: string | null) => {
    const step = key ? stepByKey.get(key) : undefined
    return step?.kind === 'hold' ? step.signalWord : null
  }
  // The language of the text on screen, when the tablet said (issue 16).
  const langOf = (p: Record<string, any>) => (typeof p.lang === 'string' ? { lang: p.lang } : {})
  const undone = new Set(state.undoneIds)
  // Overrides, acknowledgements and sign-offs: the counted ones, then the refused ones.
  const routine = (e: RunEvent, notCounted: { code: string, message: string } | null) => {
    const p = e as RunEvent & Record<string, any>
    const stepKey = typeof p.stepKey === 'string' ? p.stepKey : null
    const base = { eventId: e.id, actorId: e.actorId, stepKey, at: e.at, counted: notCounted === null }
    const why = notCounted ? { notCounted: notCounted.message, notCountedCode: notCounted.code } : {}
    if (e.type === 'hold.overridden') {
      out.push({ ...base, kind: 'override', detail: { stepTitle: titleOf(stepKey), reason: String(p.reason ?? '').trim(), signalWord: signalWordOf(stepKey), ...why } })
    }
    else if (e.type === 'hold.acknowledged') {
      out.push({ ...base, kind: 'hold-acknowledged', detail: { stepTitle: titleOf(stepKey), signalWord: signalWordOf(stepKey), ...langOf(p), ...why } })
    }
    else if (e.type === 'signoff.given') {
      // The signer is the person who signed; the person whose tablet sent it is kept beside.
      out.push({
        ...base, kind: 'signed-off', actorId: typeof p.signerId === 'number' ? p.signerId : e.actorId,
        detail: { stepTitle: stepKey ? titleOf(stepKey) : 'The whole run', signerId: p.signerId ?? null, signerRole: p.signerRole ?? null, sentBy: e.actorId, ...langOf(p), ...why },
      })
    }
  }
  for (const e of state.applied) {
    routine(e, undone.has(e.id) ? { code: 'undone', message: 'Undone by the person who made it.' } : null)
  }
  // A clashing copy of another event's id is not an event of its own.
  for (const f of state.flagged) if (f.code !== 'duplicate') routine(f.event, { code: f.code, message: f.message })

  for (const f of state.flagged) {
    if (!PAST_HOLD_CODES.has(f.code)) continue
    const stepKey = 'stepKey' in f.event && typeof f.event.stepKey === 'string' ? f.event.stepKey : null
    out.push({
      eventId: f.event.id, kind: 'late-past-hold', actorId: f.event.actorId, stepKey, at: f.event.at, counted: true,
      detail: { stepTitle: titleOf(stepKey), eventType: f.event.type, code: f.code, reason: f.message },
    })
  }

  // signoff-failed: a sign-off whose signature the server could not verify at merge.
  for (const f of state.flagged) {
    if (f.code !== 'signoff-failed' || f.event.type !== 'signoff.given') continue
    const stepKey = f.event.stepKey ?? null
    out.push({
      eventId: f.event.id, kind: 'signoff-failed', actorId: f.event.actorId, stepKey, at: f.event.at, counted: true,
      detail: { stepTitle: titleOf(stepKey), signerId: f.event.signerId, signerRole: f.event.signerRole, reason: f.message },
    })
  }

  for (const v of state.values) {
    if (v.outOfRange === null) continue
    const step = stepByKey.get(v.stepKey)
    out.push({
      eventId: v.eventId, kind: 'out-of-range', actorId: v.actorId, stepKey: v.stepKey, at: v.at, counted: true,
      detail: {
        stepTitle: titleOf(v.stepKey), value: v.value, unit: v.unit, side: v.outOfRange,
        range: step?.kind === 'check' ? describeRange(step) : null, reason: v.reason,
        // The bounds themselves too, for readers that format them their own way (the digest).
        ...(step?.kind === 'check' && step.min !== undefined ? { min: step.min } : {}),
        ...(step?.kind === 'check' && step.max !== undefined ? { max: step.max } : {}),
      },
    })
  }

  // Skipped checks: walk the steps; an open check is "passed" by the earliest action on any later step.
  const skippedBy = new Map<string, { ref: EventRef, stepKey: string, action: string, steps: { stepKey: string, stepTitle: string }[] }>()
  state.steps.forEach((s, i) => {
    if (s.kind !== 'check' || s.value !== null || s.complete) return
    let first: { ref: EventRef, stepKey: string, action: string } | null = null
    for (const later of state.steps.slice(i + 1)) {
      for (const a of actionsOn(later)) if (!first || earlier(a.ref, first.ref)) first = { ...a, stepKey: later.key }
    }
    if (!first) return
    const entry = skippedBy.get(first.ref.eventId) ?? { ...first, steps: [] }
    entry.steps.push({ stepKey: s.key, stepTitle: s.title })
    skippedBy.set(first.ref.eventId, entry)
  })
  for (const [eventId, e] of skippedBy) {
    out.push({
      eventId, kind: 'skipped-check', actorId: e.ref.actorId, stepKey: e.steps[0]!.stepKey, at: e.ref.at, counted: true,
      detail: {
        stepTitle: e.steps[0]!.stepTitle, steps: e.steps, passedBy: { stepKey: e.stepKey, stepTitle: titleOf(e.stepKey), action: e.action },
        reason: `No reading recorded for ${e.steps.map(s => `"${s.stepTitle}"`).join(', ')} before work on "${titleOf(e.stepKey)}".`,
      },
    })
  }
  return out.sort((a, b) => byTimeThenId(a.at, a.eventId, b.at, b.eventId) || (a.kind < b.kind ? -1 : a.kind > b.kind ? 1 : 0))
}

function actionsOn(s: RunState['steps'][number]): { ref: EventRef, action: string }[] {
  const out: { ref: EventRef, action: string }[] = []
  if (s.done) out.push({ ref: s.done, action: 'step.done' })
  if (s.acknowledged) out.push({ ref: s.acknowledged, action: 'hold.acknowledged' })
  if (s.override) out.push({ ref: s.override, action: 'hold.overridden' })
  if (s.signoff) out.push({ ref: s.signoff, action: 'signoff.given' })
  for (const r of s.readings) out.push({ ref: r, action: 'value.recorded' })
  for (const p of s.photos) out.push({ ref: p, action: 'photo.attached' })
  for (const p of s.plans) out.push({ ref: p, action: 'plan.attached' })
  return out
}

// Fold order: time, then id.
function earlier(a: EventRef, b: EventRef) {
  const ta = Date.parse(a.at)
  const tb = Date.parse(b.at)
  return ta !== tb ? ta < tb : a.eventId < b.eventId
}

// Units a check may use for spindle time, in hours.
const SPINDLE_HOUR_UNITS = new Set(['h', 'hr', 'hrs', 'hour', 'hours', 'spindle h', 'spindle hours'])

/**
 * Spindle minutes a run recorded:
 * - for each planner step, the last plan still attached (a re-plan replaces the earlier one,
 *   as for the spoilboard facing) counts its estimated machine time, once that step is done:
 *   only then was the program handed to the machine (`planMinutes` looks up the stored plan;
 *   null when it is unknown, which counts as nothing);
 * - plus every check reading in effect whose unit is hours and whose label or title names the
 *   spindle (e.g. "Spindle hours run", unit h), for work cut outside the planner.
 */
export function spindleMinutesOf(state: RunState, steps: readonly ProcedureStep[], planMinutes: (planId: string) => number | null): number {
  let minutes = 0
  for (const s of state.steps) {
    if (s.kind !== 'planner' || !s.done) continue
    const planId = s.plans.at(-1)?.planId
    const m = planId ? planMinutes(planId) : null
    if (m !== null && Number.isFinite(m) && m > 0) minutes += m
  }
  for (const step of steps) {
    if (step.kind !== 'check' || !isSpindleHourCheck(step)) continue
    const v = state.steps.find(s => s.key === step.key)?.value
    if (v && Number.isFinite(v.value) && v.value > 0) minutes += v.value * 60
  }
  return Math.round(minutes * 1000) / 1000
}

export function isSpindleHourCheck(step: ProcedureStep): boolean {
  return step.kind === 'check' && SPINDLE_HOUR_UNITS.has(step.unit.trim().toLowerCase()) && /spindle/i.test(`${step.label} ${step.title}`)
}

import { foldRun, makeEvent, type RunEvent, type RunState } from '../runs'
import { describeRange, rangeStatus, type ProcedureStep } from '../procedures/schema'
import { reasonProblem } from '../procedures/text'
import type { FieldIssue } from '../schemas/issues'
import type { PaperRun } from '../schemas/paper-run'

// A run done on paper becomes the same events a tablet would have sent, so the fold, the run
// record, the Ledger, the CSV and the due list read it like any other run. Pure: the server
// builds and folds them before storing anything, and the form can say the same things first.

/** Device id of every event entered from a paper sheet. */
export const PAPER_DEVICE_ID = 'paper-sheet'

export interface PaperSigner { id: number, role: 'trainer' | 'owner' }

export type PaperEventsResult = { ok: true, events: RunEvent[], state: RunState } | { ok: false, issues: FieldIssue[] }

const label = (s: ProcedureStep, i: number) => `step ${i + 1} "${s.title}"`

/** Checks the sheet against the version's steps; issues name the field and the step. */
export function paperRunProblems(input: PaperRun, steps: readonly ProcedureStep[]): FieldIssue[] {
  const issues: FieldIssue[] = []
  const byKey = new Map(steps.map(s => [s.key, s]))
  input.ticked.forEach((key, i) => {
    if (!byKey.has(key)) issues.push({ path: `ticked.${i}`, message: `This version has no step "${key}".` })
  })
  input.readings.forEach((r, i) => {
    const step = byKey.get(r.stepKey)
    if (!step) issues.push({ path: `readings.${i}.stepKey`, message: `This version has no step "${r.stepKey}".` })
    else if (step.kind !== 'check') issues.push({ path: `readings.${i}.stepKey`, message: `"${step.title}" is not a measured check; it takes no reading.` })
    else if (rangeStatus(step, r.value) !== null) {
      const problem = reasonProblem(r.reason)
      if (problem) issues.push({ path: `readings.${i}.reason`, message: `${r.value} ${step.unit} is outside ${describeRange(step)}; the reason ${problem}.` })
    }
  })
  if (input.outcome === 'finished') {
    const ticked = new Set(input.ticked)
    const read = new Set(input.readings.map(r => r.stepKey))
    steps.forEach((s, i) => {
      if (s.kind === 'check' && !read.has(s.key)) issues.push({ path: 'readings', message: `${label(s, i)} has no reading; enter it, or record the run as stopped.` })
      else if (s.kind === 'signoff' && input.signerId === undefined && (input.mode === 'guided' || !ticked.has(s.key))) {
        issues.push({ path: 'signerId', message: `${label(s, i)} needs the person who signed it.` })
      }
      else if (s.kind !== 'check' && s.kind !== 'signoff' && !ticked.has(s.key)) {
        issues.push({ path: 'ticked', message: `${label(s, i)} is not ticked; tick it as on the sheet, or record the run as stopped.` })
      }
    })
  }
  return issues
}

/**
 * The events of a paper run, spread evenly between its start and finish (the sheet has no
 * times per step), folded to make sure they give the run the sheet describes.
 */
export function paperRunEvents(input: PaperRun, steps: readonly ProcedureStep[], signer: PaperSigner | null): PaperEventsResult {
  const problems = paperRunProblems(input, steps)
  if (problems.length) return { ok: false, issues: problems }
  const ticked = new Set(input.ticked)
  const readings = new Map(input.readings.map(r => [r.stepKey, r]))
  const guided = input.mode === 'guided'
  // What happened, in order; times are given below.
  type Draft = (at: string) => RunEvent
  const drafts: Draft[] = []
  const by = (actorId: number) => (at: string) => ({ runId: input.runId, actorId, deviceId: PAPER_DEVICE_ID, at })
  const op = by(input.operatorId)
  const sign = (stepKey?: string) => {
    if (!signer) return
    drafts.push(at => makeEvent(by(signer.id)(at), 'signoff.given', { ...(stepKey ? { stepKey } : {}), signerId: signer.id, signerRole: signer.role }))
  }
  drafts.push(at => makeEvent(op(at), 'run.started', { procedureVersionId: input.procedureVersionId, machineId: input.machineId, mode: input.mode }))
  for (const s of steps) {
    const r = readings.get(s.key)
    if (s.kind === 'check') {
      if (!r) continue
      drafts.push(at => makeEvent(op(at), 'value.recorded', { stepKey: s.key, value: r.value, unit: s.unit, ...(r.reason ? { reason: r.reason } : {}) }))
      drafts.push(at => makeEvent(op(at), 'step.done', { stepKey: s.key }))
      continue
    }
    if (s.kind === 'signoff') {
      if (signer) sign(s.key)
      else if (ticked.has(s.key)) drafts.push(at => makeEvent(op(at), 'step.done', { stepKey: s.key }))
      continue
    }
    if (!ticked.has(s.key)) continue
    if (s.kind === 'hold') {
      drafts.push(at => makeEvent(op(at), 'hold.acknowledged', { stepKey: s.key }))
      if (guided && s.needsTrainerSignoff) sign(s.key)
      continue
    }
    if (s.kind === 'photo') drafts.push(at => makeEvent(op(at), 'photo.attached', { stepKey: s.key, note: 'Done on the paper sheet; see the photo of the sheet.' }))
    if (s.kind === 'planner') drafts.push(at => makeEvent(op(at), 'plan.attached', { stepKey: s.key, summary: 'Planned for a run done on paper; see the sheet.' }))
    drafts.push(at => makeEvent(op(at), 'step.done', { stepKey: s.key }))
  }
  if (input.note) drafts.push(at => makeEvent(op(at), 'note.added', { text: input.note! }))
  if (input.outcome === 'finished') {
    // The sheet's sign-off box: the whole run, when no step of its own is a sign-off.
    if (!steps.some(s => s.kind === 'signoff')) sign()
    drafts.push(at => makeEvent(op(at), 'run.finished'))
  }
  else drafts.push(at => makeEvent(op(at), 'run.abandoned', { reason: input.stopReason ?? '' }))

  const start = Date.parse(input.startedAt)
  const span = Date.parse(input.finishedAt) - start
  let last = -Infinity
  const events = drafts.map((make, i) => {
    // The start and the end at the sheet's times, the rest evenly between, each later than the one before.
    const t = Math.max(last + 1, i === drafts.length - 1 ? start + span : start + Math.floor(span * i / Math.max(1, drafts.length - 1)))
    last = t
    return make(new Date(t).toISOString())
  })
  const state = foldRun(steps, events)
  const refused = state.flagged.map(f => ({ path: '', message: f.message }))
  if (refused.length) return { ok: false, issues: refused }
  if (input.outcome === 'finished' && state.status !== 'finished') return { ok: false, issues: [{ path: '', message: 'These ticks do not finish the run; record it as stopped.' }] }
  return { ok: true, events, state }
}

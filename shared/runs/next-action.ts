import type { ProcedureStep } from '../procedures/schema'
import type { RunEvent } from './events'
import type { RunState } from './fold'
import { isUndoable } from './undo'

// What the Run screen offers as its one primary action. The screen never works out rules
// itself (STYLE.md): it asks the fold's state what comes next and appends the matching event.

export type RunAction =
  | 'acknowledge-hold' // the current hold waits for a press-and-hold acknowledgement
  | 'needs-signoff' //    a trainer or owner must sign this step (or the whole run)
  | 'record-value' //     a check waits for its reading
  | 'explain-value' //    the reading is out of range: record it again with a reason
  | 'attach-photo'
  | 'attach-plan'
  | 'mark-done'
  | 'finish'
  | 'none' //             not started, finished or abandoned

export interface NextAction {
  action: RunAction
  /** The step the action is for; null for 'finish', 'none' and a whole-run sign-off. */
  stepIndex: number | null
  stepKey: string | null
  step: ProcedureStep | null
  /** Why there is nothing to do, when action is 'none'. */
  idle: 'not-started' | 'finished' | 'abandoned' | 'withdrawn' | null
  /** The current step is a hold not yet cleared, so a trainer or owner may override it. */
  canOverride: boolean
  /** What the undo button would undo for this person, or null to hide it. */
  lastUndoable: RunEvent | null
}

/**
 * The most recent entry `actorId` may undo: their own latest action if nothing else happened
 * after it, or one of their own notes, whichever is later. Without an actor id, anyone's.
 */
export function lastUndoable(state: RunState, actorId?: number): RunEvent | null {
  if (state.status !== 'active') return null
  const liveNotes = new Set(state.notes.map(n => n.eventId))
  for (let i = state.applied.length - 1; i >= 0; i--) {
    const e = state.applied[i]!
    if (actorId !== undefined && e.actorId !== actorId) continue
    if (!isUndoable(e.type)) continue
    if (e.type === 'note.added' ? liveNotes.has(e.id) : e.id === state.undoTopId) return e
  }
  return null
}

/** The one primary action for the Run screen, and what undo would take back. */
export function nextAction(state: RunState, steps: readonly ProcedureStep[], options: { actorId?: number } = {}): NextAction {
  const undo = lastUndoable(state, options.actorId)
  const idle = (why: NextAction['idle']): NextAction =>
    ({ action: 'none', stepIndex: null, stepKey: null, step: null, idle: why, canOverride: false, lastUndoable: undo })
  if (state.status === 'not-started') return idle('not-started')
  if (state.status === 'finished') return idle('finished')
  if (state.status === 'abandoned') return idle('abandoned')
  if (state.status === 'withdrawn') return idle('withdrawn')

  const i = state.currentStepIndex
  const s = state.steps[i]
  const step = steps[i]
  if (!s || !step) {
    // Every step is complete; only a guided run without a sign-off step may still need a signature.
    const action = state.canFinish ? 'finish' : 'needs-signoff'
    return { action, stepIndex: null, stepKey: null, step: null, idle: null, canOverride: false, lastUndoable: undo }
  }

  const at = (action: RunAction): NextAction =>
    ({ action, stepIndex: i, stepKey: s.key, step, idle: null, canOverride: s.kind === 'hold' && !s.holdCleared, lastUndoable: undo })
  switch (s.kind) {
    case 'hold': return at(s.acknowledged ? 'needs-signoff' : 'acknowledge-hold')
    case 'check':
      if (!s.value) return at('record-value')
      return at(s.value.reasonOk ? 'mark-done' : 'explain-value')
    case 'photo': return at(s.photos.length === 0 ? 'attach-photo' : 'mark-done')
    case 'planner': return at(s.plans.length === 0 ? 'attach-plan' : 'mark-done')
    case 'signoff': return at(s.needsSignoff ? 'needs-signoff' : 'mark-done')
    default: return at('mark-done')
  }
}

import type { RunEvent } from './events'

/**
 * What an undo may take back, written once for the fold (which refuses the rest with a reason)
 * and the Run screen's undo button. A Record over every event type, so a new event type does not
 * compile until its rule is chosen here.
 * - `undoable`: the person's own latest action (or one of their notes) can be taken back.
 * - `kept-for-good`: an override or a sign-off stays on the record for good, and says so.
 * - `never`: the run's own milestones and undos themselves.
 */
export const UNDO_RULES: Record<RunEvent['type'], 'undoable' | 'kept-for-good' | 'never'> = {
  'step.done': 'undoable',
  'hold.acknowledged': 'undoable',
  'value.recorded': 'undoable',
  'photo.attached': 'undoable',
  'plan.attached': 'undoable',
  'note.added': 'undoable',
  'hold.overridden': 'kept-for-good',
  'signoff.given': 'kept-for-good',
  'run.started': 'never',
  'run.finished': 'never',
  'run.abandoned': 'never',
  'run.withdrawn': 'never',
  'run.handed-over': 'never',
  'event.undone': 'never',
}

export const isUndoable = (type: RunEvent['type']) => UNDO_RULES[type] === 'undoable'

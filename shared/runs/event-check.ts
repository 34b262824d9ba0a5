import {
  EventUndoneSchema, HoldAcknowledgedSchema, NoteAddedSchema, parseRunEvent, PhotoAttachedSchema, PlanAttachedSchema,
  RunFinishedSchema, RunHandedOverSchema, RunStartedSchema, RunWithdrawnSchema, StepDoneSchema, ValueRecordedSchema,
  type RunEventResult,
} from './events'
import { QUICK_PATTERNS, QUICK_TYPES, quickRunEvent } from './event-quick'

// The sync merge checks every event of a batch; zod spent about a sixth of the merge's time on
// it (issue 14). The quick check (event-quick.ts) takes the common, well-formed case first; here
// the server confirms that it still matches the schemas before trusting it: a type whose schema
// has a field the quick check does not know (one added later), in another order, or whose
// string formats differ, is left to zod entirely.

const SCHEMAS: Record<string, unknown> = {
  'run.started': RunStartedSchema,
  'step.done': StepDoneSchema,
  'hold.acknowledged': HoldAcknowledgedSchema,
  'value.recorded': ValueRecordedSchema,
  'note.added': NoteAddedSchema,
  'photo.attached': PhotoAttachedSchema,
  'plan.attached': PlanAttachedSchema,
  'event.undone': EventUndoneSchema,
  'run.finished': RunFinishedSchema,
  'run.handed-over': RunHandedOverSchema,
  'run.withdrawn': RunWithdrawnSchema,
}

type Shape = Record<string, { _zod: { pattern?: RegExp } }>
const shapeOf = (schema: unknown) => (schema as { _zod: { def: { shape: Shape } } })._zod.def.shape
// The string formats as the schemas themselves test them (zod keeps each format's pattern).
const SAME_FORMATS = [
  [shapeOf(StepDoneSchema).id?._zod.pattern, QUICK_PATTERNS.uuidv7],
  [shapeOf(StepDoneSchema).runId?._zod.pattern, QUICK_PATTERNS.uuid],
  [shapeOf(StepDoneSchema).at?._zod.pattern, QUICK_PATTERNS.datetime],
  [shapeOf(EventUndoneSchema).targetId?._zod.pattern, QUICK_PATTERNS.uuid],
].every(([theirs, ours]) => theirs?.source === ours!.source && theirs.flags === ours!.flags)

/** The quick check's types whose keys are the schema's, in its order; none if a format differs. */
export const CONFIRMED_TYPES = new Map([...QUICK_TYPES].filter(([type, rules]) => {
  const order = Object.keys(shapeOf(SCHEMAS[type]) ?? {}).filter(k => k !== 'verdict')
  return SAME_FORMATS && !!SCHEMAS[type] && order.join() === [...rules.keys()].join()
}))

/** parseRunEvent, with the quick check first: the same events accepted, the same output and messages. */
export function checkRunEvent(input: unknown): RunEventResult {
  const quick = quickRunEvent(input, CONFIRMED_TYPES)
  return quick ? { ok: true, event: quick } : parseRunEvent(input)
}

import { isWellFormed, MAX_ID } from '../schemas/input'
import { LANGUAGE_CODE } from '../rules/language'
import {
  EventUndoneSchema, HoldAcknowledgedSchema, MAX_READING, NoteAddedSchema, parseRunEvent, PhotoAttachedSchema, PlanAttachedSchema,
  RUN_MODES, RunFinishedSchema, RunHandedOverSchema, RunStartedSchema, RunWithdrawnSchema, StepDoneSchema, ValueRecordedSchema,
  type RunEvent, type RunEventResult,
} from './events'

// The sync merge checks every event of a batch; zod spent about a sixth of the merge's time on
// it (issue 14). This is a precompiled check of the same rules for the common, well-formed
// case: an event whose fields are all known, already trimmed and plainly in range. It only
// ever says "valid, and this is exactly what the schema returns"; anything else (a field it
// does not know, text with spaces around it, a verdict, a type with written reasons or a seal,
// any doubt) goes to parseRunEvent, so every message still comes from the zod schema.

type Rule = (value: unknown) => boolean

const text = (max: number): Rule => v => typeof v === 'string' && v.length >= 1 && v.length <= max && v === v.trim() && isWellFormed(v)
const positiveId: Rule = v => typeof v === 'number' && Number.isInteger(v) && v >= 1 && v <= MAX_ID
const reading: Rule = v => typeof v === 'number' && Number.isFinite(v) && v >= -MAX_READING && v <= MAX_READING
const language: Rule = v => typeof v === 'string' && LANGUAGE_CODE.test(v)
const mode: Rule = v => typeof v === 'string' && (RUN_MODES as readonly string[]).includes(v)
// The string formats as the schemas themselves test them (zod keeps each format's pattern).
const patternOf = (schema: unknown, key: string): RegExp | undefined =>
  (schema as { _zod: { def: { shape: Record<string, { _zod: { pattern?: RegExp } }> } } })._zod.def.shape[key]?._zod.pattern
const matches = (pattern: RegExp | undefined): Rule => v => !!pattern && typeof v === 'string' && pattern.test(v)

const base: Record<string, Rule> = {
  id: matches(patternOf(StepDoneSchema, 'id')),
  runId: matches(patternOf(StepDoneSchema, 'runId')),
  at: matches(patternOf(StepDoneSchema, 'at')),
  actorId: positiveId,
  deviceId: text(64),
}

/** Per type: the schema, and each of its own fields' rule (optional ones marked). */
const TYPES: Record<string, { schema: unknown, fields: Record<string, { rule: Rule, optional?: true }> }> = {
  'run.started': { schema: RunStartedSchema, fields: { procedureVersionId: { rule: positiveId }, machineId: { rule: positiveId }, mode: { rule: mode } } },
  'step.done': { schema: StepDoneSchema, fields: { stepKey: { rule: text(60) } } },
  'hold.acknowledged': { schema: HoldAcknowledgedSchema, fields: { stepKey: { rule: text(60) }, lang: { rule: language, optional: true } } },
  // A reason is taken here only when it is already trimmed and not empty (the schema drops an empty one).
  'value.recorded': { schema: ValueRecordedSchema, fields: { stepKey: { rule: text(60) }, value: { rule: reading }, unit: { rule: text(16) }, reason: { rule: text(1000), optional: true } } },
  'note.added': { schema: NoteAddedSchema, fields: { stepKey: { rule: text(60), optional: true }, text: { rule: text(2000) } } },
  'photo.attached': { schema: PhotoAttachedSchema, fields: { stepKey: { rule: text(60) }, uploadId: { rule: text(64), optional: true }, note: { rule: text(500), optional: true } } },
  'plan.attached': { schema: PlanAttachedSchema, fields: { stepKey: { rule: text(60) }, planId: { rule: text(64), optional: true }, summary: { rule: text(1000) } } },
  'event.undone': { schema: EventUndoneSchema, fields: { targetId: { rule: matches(patternOf(EventUndoneSchema, 'targetId')) } } },
  'run.finished': { schema: RunFinishedSchema, fields: {} },
  'run.handed-over': { schema: RunHandedOverSchema, fields: { toUserId: { rule: positiveId } } },
  'run.withdrawn': { schema: RunWithdrawnSchema, fields: {} },
}

interface Compiled { order: string[], rules: Map<string, { rule: Rule, optional?: true }> }
/**
 * Each type's keys in the schema's own order (the order zod writes them out). A type whose schema
 * has a field this table does not know (one added later) is left to zod entirely.
 */
const COMPILED = new Map<string, Compiled>()
for (const [type, { schema, fields }] of Object.entries(TYPES)) {
  const order = Object.keys((schema as { _zod: { def: { shape: object } } })._zod.def.shape).filter(k => k !== 'verdict')
  const rules = new Map<string, { rule: Rule, optional?: true }>([...Object.entries(base).map(([k, rule]) => [k, { rule }] as const), ['type', { rule: v => v === type }], ...Object.entries(fields)])
  if (order.length === rules.size && order.every(k => rules.has(k))) COMPILED.set(type, { order, rules })
}

/** The event exactly as the schema would return it, when the quick check can vouch for it; else undefined. */
export function quickRunEvent(input: unknown): RunEvent | undefined {
  if (typeof input !== 'object' || input === null || Array.isArray(input) || Object.getPrototypeOf(input) !== Object.prototype) return undefined
  const record = input as Record<string, unknown>
  const compiled = typeof record.type === 'string' ? COMPILED.get(record.type) : undefined
  if (!compiled) return undefined
  let known = 0
  const out: Record<string, unknown> = {}
  for (const key of compiled.order) {
    const value = record[key]
    if (value === undefined) {
      if (Object.hasOwn(record, key) || !compiled.rules.get(key)!.optional) return undefined
      continue
    }
    if (!Object.hasOwn(record, key) || !compiled.rules.get(key)!.rule(value)) return undefined
    out[key] = value
    known++
  }
  // A field the schema does not know (zod would drop it, or refuse it if it is ill-formed text)
  if (Object.keys(record).length !== known) return undefined
  return out as RunEvent
}

/** parseRunEvent, with the quick check first: the same events accepted, the same output and messages. */
export function checkRunEvent(input: unknown): RunEventResult {
  const quick = quickRunEvent(input)
  return quick ? { ok: true, event: quick } : parseRunEvent(input)
}

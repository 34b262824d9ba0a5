import { isWellFormed, MAX_ID } from '../rules/input'
import { LANGUAGE_CODE } from '../rules/language'
import { eventInput, MAX_READING, RUN_MODES, type EventContext, type RunEventType } from './event-kinds'
import type { RunEvent, RunEventOf, RunEventPayload } from './events'

// A precompiled check of the event schemas' rules (events.ts) for the common, well-formed case:
// an event whose fields are all known, already trimmed and plainly in range. It only ever says
// "valid, and this is exactly what the schema returns"; anything else (a field it does not know,
// text with spaces around it, a verdict, a type with written reasons or a seal, any doubt) goes
// to the schema, so every message still comes from zod. It needs no zod itself: the sync merge
// runs it before zod (event-check.ts, which also confirms at start-up that it matches the
// schemas), and the Run screen makes its events with it and loads zod only for an event it
// cannot vouch for (issue 14).

type Rule = (value: unknown) => boolean

// The string formats exactly as zod 4 tests them (its regexes.ts: uuid, uuid version 7, ISO
// date-time with offset); event-check.ts compares them with the schemas' own patterns.
export const QUICK_PATTERNS = {
  uuidv7: /^([0-9a-fA-F]{8}-[0-9a-fA-F]{4}-7[0-9a-fA-F]{3}-[89abAB][0-9a-fA-F]{3}-[0-9a-fA-F]{12})$/,
  uuid: /^([0-9a-fA-F]{8}-[0-9a-fA-F]{4}-[1-8][0-9a-fA-F]{3}-[89abAB][0-9a-fA-F]{3}-[0-9a-fA-F]{12}|00000000-0000-0000-0000-000000000000|ffffffff-ffff-ffff-ffff-ffffffffffff)$/,
  datetime: /^(?:(?:\d\d[2468][048]|\d\d[13579][26]|\d\d0[48]|[02468][048]00|[13579][26]00)-02-29|\d{4}-(?:(?:0[13578]|1[02])-(?:0[1-9]|[12]\d|3[01])|(?:0[469]|11)-(?:0[1-9]|[12]\d|30)|(?:02)-(?:0[1-9]|1\d|2[0-8])))T(?:(?:[01]\d|2[0-3]):[0-5]\d:[0-5]\d(?:\.\d+)?(?:Z|([+-](?:[01]\d|2[0-3]):[0-5]\d)))$/,
}

const text = (max: number): Rule => v => typeof v === 'string' && v.length >= 1 && v.length <= max && v === v.trim() && isWellFormed(v)
const positiveId: Rule = v => typeof v === 'number' && Number.isInteger(v) && v >= 1 && v <= MAX_ID
const reading: Rule = v => typeof v === 'number' && Number.isFinite(v) && v >= -MAX_READING && v <= MAX_READING
const language: Rule = v => typeof v === 'string' && LANGUAGE_CODE.test(v)
const mode: Rule = v => typeof v === 'string' && (RUN_MODES as readonly string[]).includes(v)
const matches = (pattern: RegExp): Rule => v => typeof v === 'string' && pattern.test(v)

interface Field { rule: Rule, optional?: true }

/** The envelope every event shares, in the schemas' order (their `verdict` is the server's). */
const BASE: Record<string, Field> = {
  id: { rule: matches(QUICK_PATTERNS.uuidv7) },
  runId: { rule: matches(QUICK_PATTERNS.uuid) },
  at: { rule: matches(QUICK_PATTERNS.datetime) },
  actorId: { rule: positiveId },
  deviceId: { rule: text(64) },
}

/** Per type, each of its own fields' rule in the schema's order (optional ones marked). */
const TYPES: Partial<Record<RunEventType, Record<string, Field>>> = {
  'run.started': { procedureVersionId: { rule: positiveId }, machineId: { rule: positiveId }, mode: { rule: mode } },
  'step.done': { stepKey: { rule: text(60) } },
  'hold.acknowledged': { stepKey: { rule: text(60) }, lang: { rule: language, optional: true } },
  // A reason is taken here only when it is already trimmed and not empty (the schema drops an empty one).
  'value.recorded': { stepKey: { rule: text(60) }, value: { rule: reading }, unit: { rule: text(16) }, reason: { rule: text(1000), optional: true } },
  'note.added': { stepKey: { rule: text(60), optional: true }, text: { rule: text(2000) } },
  'photo.attached': { stepKey: { rule: text(60) }, uploadId: { rule: text(64), optional: true }, note: { rule: text(500), optional: true } },
  'plan.attached': { stepKey: { rule: text(60) }, planId: { rule: text(64), optional: true }, summary: { rule: text(1000) } },
  'event.undone': { targetId: { rule: matches(QUICK_PATTERNS.uuid) } },
  'run.finished': {},
  'run.handed-over': { toUserId: { rule: positiveId } },
  'run.withdrawn': {},
}

/** Each type's keys in the schema's order (the order zod writes them out), with their rules. */
export const QUICK_TYPES = new Map(Object.entries(TYPES).map(([type, fields]) => [type, new Map<string, Field>([
  ...Object.entries(BASE), ['type', { rule: v => v === type }], ...Object.entries(fields),
])]))

/**
 * The event exactly as the schema would return it, when the quick check can vouch for it; else
 * undefined. `types`: only these types (event-check.ts passes the ones that match the schemas).
 */
export function quickRunEvent(input: unknown, types: ReadonlyMap<string, ReadonlyMap<string, Field>> = QUICK_TYPES): RunEvent | undefined {
  if (typeof input !== 'object' || input === null || Array.isArray(input) || Object.getPrototypeOf(input) !== Object.prototype) return undefined
  const record = input as Record<string, unknown>
  const rules = typeof record.type === 'string' ? types.get(record.type) : undefined
  if (!rules) return undefined
  let known = 0
  const out: Record<string, unknown> = {}
  for (const [key, { rule, optional }] of rules) {
    const value = record[key]
    if (value === undefined) {
      if (Object.hasOwn(record, key) || !optional) return undefined
      continue
    }
    if (!Object.hasOwn(record, key) || !rule(value)) return undefined
    out[key] = value
    known++
  }
  // A field the schema does not know (zod would drop it, or refuse it if it is ill-formed text)
  if (Object.keys(record).length !== known) return undefined
  return out as RunEvent
}

/**
 * makeEvent's event (events.ts), for the tablet: from the quick check when it vouches for the
 * event, else from makeEvent itself, whose zod schemas load only then and name the field and
 * reason when the payload is wrong (RunEventError).
 */
export async function buildEvent<T extends RunEventType>(ctx: EventContext, type: T, payload?: RunEventPayload<T>): Promise<RunEventOf<T>> {
  const input = eventInput(ctx, type, payload)
  const quick = quickRunEvent(input)
  if (quick) return quick as RunEventOf<T>
  const { makeEvent } = await import('./events')
  // The same id and time as the quick check saw.
  return makeEvent({ ...ctx, id: input.id as string, at: input.at as string }, type, ...([payload] as [RunEventPayload<T>]))
}

import { z } from 'zod/mini'
import { toIssues, type FieldIssue } from '../schemas/issues'
import { checkedInput, MAX_ID } from '../schemas/input'
import { LANGUAGE_CODE, LANGUAGE_CODE_MESSAGE } from '../rules/language'
import { reasonProblem } from '../procedures/text'
import { MAX_SEAL_LENGTH } from './signoff-seal'
import { eventInput, MAX_READING, RUN_EVENT_TYPES, RUN_MODES, RunEventError, SIGNER_ROLES, VERDICT_CODES, type EventContext, type RunEventType } from './event-kinds'

export * from './event-kinds'

// zod/mini, as in shared/schemas/input.ts: the Run screen loads these schemas for an event the
// quick check (event-quick.ts) cannot vouch for, and the full zod would weigh far more (issue 14).
const str = (label: string, max: number) =>
  z.string({ error: iss => iss.input === undefined ? `${label} is required.` : `${label} must be text.` }).check(
    z.trim(),
    z.minLength(1, `${label} is required.`),
    z.maxLength(max, `${label} must be at most ${max} characters.`),
  )

const positiveId = (label: string) =>
  z.number({ error: `${label} must be a number.` }).check(z.int(`${label} must be a whole number.`), z.positive(`${label} must be a positive number.`),
    z.lte(MAX_ID, `${label} is not a known id.`))

// A reason that goes on the record: an override, an abandoned run.
const reason = (label: string) => str(label, 1000).check(z.superRefine((value, ctx) => {
  const problem = reasonProblem(value)
  if (problem) ctx.addIssue({ code: 'custom', message: `${label} ${problem}.` })
}))

const stepKey = str('Step key', 60)

// Written by the server only (event-kinds.ts).
export const VerdictSchema = z.discriminatedUnion('status', [
  z.object({ status: z.literal('verified') }),
  z.object({ status: z.literal('refused'), code: z.enum(VERDICT_CODES), reason: z.string().check(z.maxLength(1000)) }),
], { error: 'A verdict is set by the server only.' })
export type Verdict = z.infer<typeof VerdictSchema>

const base = {
  id: z.uuidv7({ error: 'Event id must be a UUIDv7 string made on the device.' }),
  runId: z.uuid({ error: 'Run id must be a UUID string.' }),
  at: z.iso.datetime({ offset: true, error: 'Event time must be an ISO 8601 date and time with a time zone, e.g. 2025-03-01T08:15:00.000Z.' }),
  actorId: positiveId('Actor id'),
  deviceId: str('Device id', 64),
  verdict: z.optional(VerdictSchema),
}

export const RunStartedSchema = z.object({
  ...base,
  type: z.literal('run.started'),
  procedureVersionId: positiveId('Procedure version id'),
  machineId: positiveId('Machine id'),
  mode: z.enum(RUN_MODES, { error: 'Mode must be guided or solo.' }),
})

export const StepDoneSchema = z.object({ ...base, type: z.literal('step.done'), stepKey })

// Which language's text was on the screen when the hold was acknowledged or the work signed
// (issue 16): a locale code such as "es". Absent on events from before languages existed.
const lang = z.optional(z.string({ error: 'Language must be text.' }).check(z.regex(LANGUAGE_CODE, LANGUAGE_CODE_MESSAGE)))

export const HoldAcknowledgedSchema = z.object({ ...base, type: z.literal('hold.acknowledged'), stepKey, lang })

export const ValueRecordedSchema = z.object({
  ...base,
  type: z.literal('value.recorded'),
  stepKey,
  value: z.number({ error: iss => typeof iss.input === 'number' ? 'Value must be a finite number.' : 'Value must be a number.' })
    .check(z.gte(-MAX_READING, `Value must be at least -${MAX_READING}.`), z.lte(MAX_READING, `Value must be at most ${MAX_READING}.`)),
  unit: str('Unit', 16),
  // Optional here because an in-range reading needs none; the fold decides whether an
  // out-of-range reading's reason is good enough (reasonProblem).
  reason: z.pipe(z.optional(z.string({ error: 'Reason must be text.' }).check(z.trim(), z.maxLength(1000, 'Reason must be at most 1000 characters.'))),
    z.transform(r => (r === undefined || r === '') ? undefined : r)),
})

export const NoteAddedSchema = z.object({
  ...base,
  type: z.literal('note.added'),
  stepKey: z.optional(stepKey),
  text: str('Note', 2000),
})

export const PhotoAttachedSchema = z.object({
  ...base,
  type: z.literal('photo.attached'),
  stepKey,
  // Missing while the photo waits in IndexedDB for the network; the note stands in meanwhile.
  uploadId: z.optional(str('Upload id', 64)),
  note: z.optional(str('Photo note', 500)),
})

export const PlanAttachedSchema = z.object({
  ...base,
  type: z.literal('plan.attached'),
  stepKey,
  planId: z.optional(str('Plan id', 64)),
  summary: str('Plan summary', 1000),
})

export const HoldOverriddenSchema = z.object({
  ...base,
  type: z.literal('hold.overridden'),
  stepKey,
  reason: reason('Override reason'),
})

export const SignoffGivenSchema = z.object({
  ...base,
  type: z.literal('signoff.given'),
  // Absent for a sign-off of the whole run.
  stepKey: z.optional(stepKey),
  lang,
  signerId: positiveId('Signer id'),
  signerRole: z.enum(SIGNER_ROLES, { error: 'Signer role must be trainer or owner.' }),
  // The signer's secret and what it signs, encrypted to the server's key (signoff-seal.ts).
  // The server opens it at merge and stores the verdict instead; it is never stored.
  seal: z.optional(z.string({ error: 'Seal must be text.' }).check(z.maxLength(MAX_SEAL_LENGTH, 'Seal is too long.'))),
})

export const EventUndoneSchema = z.object({
  ...base,
  type: z.literal('event.undone'),
  targetId: z.uuid({ error: 'Undo target must be the id of an earlier event.' }),
})

export const RunFinishedSchema = z.object({ ...base, type: z.literal('run.finished') })

export const RunAbandonedSchema = z.object({
  ...base,
  type: z.literal('run.abandoned'),
  reason: reason('Reason for abandoning the run'),
})

// The run goes on with another person (another shift, another tablet): from now on their
// events count too. Given by a person on the run or a trainer or the owner.
export const RunHandedOverSchema = z.object({
  ...base,
  type: z.literal('run.handed-over'),
  toUserId: positiveId('The person the run is handed to'),
})

// A run started by mistake (wrong procedure, wrong machine) is taken back before anything was
// done in it: no reason needed, and it shows as withdrawn, not stopped. The fold refuses it once
// any work is on the record.
export const RunWithdrawnSchema = z.object({ ...base, type: z.literal('run.withdrawn') })

export const RunEventSchema = z.discriminatedUnion('type', [
  RunStartedSchema,
  StepDoneSchema,
  HoldAcknowledgedSchema,
  ValueRecordedSchema,
  NoteAddedSchema,
  PhotoAttachedSchema,
  PlanAttachedSchema,
  HoldOverriddenSchema,
  SignoffGivenSchema,
  EventUndoneSchema,
  RunFinishedSchema,
  RunAbandonedSchema,
  RunHandedOverSchema,
  RunWithdrawnSchema,
], {
  error: iss => iss.code === 'invalid_union'
    ? `Event type must be one of ${RUN_EVENT_TYPES.join(', ')}.`
    : 'An event must be an object with id, runId, type, at, actorId and deviceId.',
})

export type RunEvent = z.output<typeof RunEventSchema>
export type RunEventInput = z.input<typeof RunEventSchema>
export type RunEventOf<T extends RunEventType> = Extract<RunEvent, { type: T }>

type BaseKey = keyof typeof base | 'type'
/**
 * The fields that belong to one event type, without the common envelope, as a caller writes
 * them (the schema's input: optional fields may be left out, makeEvent fills and checks them).
 */
export type RunEventPayload<T extends RunEventType> = Omit<Extract<RunEventInput, { type: T }>, BaseKey>

export type RunEventResult = { ok: true, event: RunEvent } | { ok: false, issues: FieldIssue[] }

const checkedRunEvent = checkedInput(RunEventSchema)

/** Validates one event, e.g. each element of a sync batch. */
export function parseRunEvent(input: unknown): RunEventResult {
  const parsed = checkedRunEvent.safeParse(input)
  return parsed.success ? { ok: true, event: parsed.data } : { ok: false, issues: toIssues(parsed.error) }
}

type PayloadArgs<T extends RunEventType> = Record<string, never> extends RunEventPayload<T>
  ? [payload?: RunEventPayload<T>]
  : [payload: RunEventPayload<T>]

/**
 * Builds and validates one event, e.g.
 * `makeEvent(ctx, 'hold.acknowledged', { stepKey: 'isolate-power' })`.
 * Throws RunEventError naming the field when the payload is wrong.
 */
export function makeEvent<T extends RunEventType>(ctx: EventContext, type: T, ...args: PayloadArgs<T>): RunEventOf<T> {
  const parsed = checkedRunEvent.safeParse(eventInput(ctx, type, args[0]))
  if (!parsed.success) throw new RunEventError(toIssues(parsed.error))
  return parsed.data as RunEventOf<T>
}

import { z } from 'zod/mini'
import { toIssues, type FieldIssue } from '../schemas/issues'
import { SIGNAL_WORDS } from './signal-words'
import { longSentence, MAX_SENTENCE_WORDS, plainTextProblem } from './text'
import { STEP_KEY_PATTERN } from './step-key'

export * from './signal-words'
export type { FieldIssue } from '../schemas/issues'

// One procedure version: the ordered steps a run follows. Both the Library editor and the
// server validate with these schemas, so every message names the field and says what to fix.
// zod/mini: the Run screen loads this file (labels, ranges), and the full zod would be most of
// its script weight (issue 14).

export const STEP_KINDS = ['instruction', 'hold', 'check', 'photo', 'planner', 'signoff'] as const
export type StepKind = typeof STEP_KINDS[number]

export const STEP_KIND_LABELS: Record<StepKind, string> = {
  instruction: 'Instruction',
  hold: 'Hold point',
  check: 'Measured check',
  photo: 'Photo evidence',
  planner: 'Surfacing plan',
  signoff: 'Sign-off',
}

export const PROCEDURE_CATEGORIES = ['surfacing', 'setup', 'maintenance', 'daily', 'safety'] as const
export type ProcedureCategory = typeof PROCEDURE_CATEGORIES[number]

export const PROCEDURE_CATEGORY_LABELS: Record<ProcedureCategory, string> = {
  surfacing: 'Surfacing and flattening',
  setup: 'Setup and tooling',
  maintenance: 'Maintenance',
  daily: 'Daily routine',
  safety: 'Safety checks',
}

/** Carried by every procedure and shown on its first screen (brief: Safety). */
export const SUPPLEMENT_NOTICE = 'Jogwise supplements, and never replaces, the machine maker\'s manual, '
  + 'local codes and regulations, and competent shop practice. Where they differ, follow the manual '
  + 'and the rules that apply where you work, and ask your trainer.'

// Kept in small zod-free files, so the Run screen's fold and translations load without the
// step schemas (issue 14).
export { STEP_KEY_PATTERN }
export const MAX_STEPS = 100

interface TextRule {
  min?: number
  max: number
  /** Hold step text to short sentences (body, hazard, avoid). */
  shortSentences?: boolean
}

// A trimmed plain-text field whose every message starts with the field's label.
function text(label: string, rule: TextRule) {
  const min = rule.min ?? 1
  return z.string({ error: iss => iss.input === undefined ? `${label} is required.` : `${label} must be text.` }).check(
    z.trim(),
    z.minLength(min, min <= 1 ? `${label} is required.` : `${label} needs at least ${min} characters.`),
    z.maxLength(rule.max, `${label} must be at most ${rule.max} characters.`),
    z.superRefine((value, ctx) => {
      const plain = plainTextProblem(value)
      if (plain) ctx.addIssue({ code: 'custom', message: `${label} ${plain}.` })
      if (rule.shortSentences) {
        const long = longSentence(value)
        if (long) {
          ctx.addIssue({
            code: 'custom',
            message: `${label}: sentence ${long.position} has ${long.words} words; keep sentences to ${MAX_SENTENCE_WORDS} words or fewer so they read at arm's length.`,
          })
        }
      }
    }),
  )
}

// The same range a reading may have (MAX_READING in shared/runs/events.ts, not imported here
// to keep the procedure schema free of the run code).
const MAX_LIMIT = 1_000_000_000
const finite = (label: string) => z.number({
  error: iss => typeof iss.input === 'number' ? `${label} must be a finite number.` : `${label} must be a number.`,
}).check(z.gte(-MAX_LIMIT, `${label} must be at least -${MAX_LIMIT}.`), z.lte(MAX_LIMIT, `${label} must be at most ${MAX_LIMIT}.`))

const base = {
  key: z.string({ error: iss => iss.input === undefined ? 'Step key is required.' : 'Step key must be text.' }).check(
    z.minLength(1, 'Step key is required.'),
    z.maxLength(60, 'Step key must be at most 60 characters.'),
    z.regex(STEP_KEY_PATTERN, 'Step key may use only lower-case letters, digits and single hyphens (e.g. "isolate-power").')),
  title: text('Step title', { min: 3, max: 100 }),
  body: text('Step text', { max: 800, shortSentences: true }),
  // Extra explanation only trainees see in guided mode; may be empty.
  guidance: z._default(text('Guidance', { min: 0, max: 1500 }), ''),
}

/** Screens an instruction may send the operator to; the Run screen links there for the run's machine. */
export const STEP_SCREENS = ['board', 'feeds'] as const
export type StepScreen = typeof STEP_SCREENS[number]

export const InstructionStepSchema = z.object({
  ...base,
  kind: z.literal('instruction'),
  opens: z.optional(z.enum(STEP_SCREENS, { error: `Screen to open must be one of ${STEP_SCREENS.join(', ')}.` })),
})

export const HoldStepSchema = z.object({
  ...base,
  kind: z.literal('hold'),
  signalWord: z.enum(SIGNAL_WORDS, { error: `Signal word must be one of ${SIGNAL_WORDS.join(', ')}.` }),
  hazard: text('Hazard statement', { min: 10, max: 500, shortSentences: true }),
  avoid: text('How to avoid the hazard', { min: 10, max: 600, shortSentences: true }),
  needsTrainerSignoff: z._default(z.boolean({ error: 'Needs trainer sign-off must be true or false.' }), false),
})

export const CheckStepSchema = z.object({
  ...base,
  kind: z.literal('check'),
  label: text('Measured value label', { max: 80 }),
  unit: text('Unit', { max: 16 }),
  min: z.optional(finite('Lowest allowed value')),
  max: z.optional(finite('Highest allowed value')),
}).check(z.refine(s => s.min === undefined || s.max === undefined || s.min <= s.max, {
  path: ['max'],
  message: 'Highest allowed value must not be less than the lowest allowed value.',
}))

export const PhotoStepSchema = z.object({
  ...base,
  kind: z.literal('photo'),
  subject: text('What to photograph', { min: 3, max: 200 }),
})

export const PlannerStepSchema = z.object({
  ...base,
  kind: z.literal('planner'),
  // Only the surfacing planner exists; the field leaves room for other computed steps.
  planner: z._default(z.literal('surfacing', { error: 'Planner must be "surfacing".' }), 'surfacing'),
})

export const SignoffStepSchema = z.object({
  ...base,
  kind: z.literal('signoff'),
  statement: text('Sign-off statement', { min: 10, max: 400 }),
})

export const ProcedureStepSchema = z.discriminatedUnion('kind', [
  InstructionStepSchema,
  HoldStepSchema,
  CheckStepSchema,
  PhotoStepSchema,
  PlannerStepSchema,
  SignoffStepSchema,
], {
  error: iss => iss.code === 'invalid_union'
    ? `Step kind must be one of ${STEP_KINDS.join(', ')}.`
    : 'Each step must be an object with a kind, key, title and text.',
})

export const ProcedureSchema = z.object({
  title: text('Procedure title', { min: 3, max: 120 }),
  summary: text('Summary', { min: 10, max: 600 }),
  category: z.enum(PROCEDURE_CATEGORIES, { error: `Category must be one of ${PROCEDURE_CATEGORIES.join(', ')}.` }),
  supplementNotice: z._default(text('Supplement notice', { min: 20, max: 600 }), SUPPLEMENT_NOTICE),
  steps: z.array(ProcedureStepSchema, { error: 'Steps must be a list.' }).check(
    z.minLength(1, 'A procedure needs at least one step.'),
    z.maxLength(MAX_STEPS, `A procedure may have at most ${MAX_STEPS} steps.`)),
}, { error: 'A procedure must be an object with a title, summary, category and steps.' }).check(z.superRefine((p, ctx) => {
  // Runs refer to steps by key, so a key used twice would make two steps one.
  const steps = p.steps as unknown[]
  const keyOf = (s: unknown) => (typeof s === 'object' && s !== null && typeof (s as { key?: unknown }).key === 'string')
    ? (s as { key: string }).key
    : undefined
  const kindOf = (s: unknown) => (typeof s === 'object' && s !== null) ? (s as { kind?: unknown }).kind : undefined
  const firstAt = new Map<string, number>()
  steps.forEach((step, i) => {
    const key = keyOf(step)
    if (key === undefined) return
    const seen = firstAt.get(key)
    if (seen === undefined) firstAt.set(key, i)
    else {
      ctx.addIssue({
        code: 'custom',
        path: ['steps', i, 'key'],
        message: `Step key "${key}" is already used by step ${seen + 1}; every key must be unique within the procedure.`,
      })
    }
  })
  // A run ends with someone confirming the work; in guided mode that is the trainer's signature.
  const last = steps.length - 1
  steps.forEach((step, i) => {
    if (kindOf(step) === 'signoff' && i !== last) {
      ctx.addIssue({ code: 'custom', path: ['steps', i, 'kind'], message: 'A sign-off step must be the last step.' })
    }
  })
  if (steps.length > 0 && kindOf(steps[last]) !== 'signoff') {
    ctx.addIssue({ code: 'custom', path: ['steps'], message: 'The last step must be a sign-off step, so every run ends with someone confirming the work.' })
  }
}, {
  // Also run when some fields are wrong, so a duplicate key is reported in the same pass.
  when: payload => typeof payload.value === 'object' && payload.value !== null
    && Array.isArray((payload.value as { steps?: unknown }).steps),
}))

export type ProcedureStep = z.output<typeof ProcedureStepSchema>
export type ProcedureStepInput = z.input<typeof ProcedureStepSchema>
export type InstructionStep = z.output<typeof InstructionStepSchema>
export type HoldStep = z.output<typeof HoldStepSchema>
export type CheckStep = z.output<typeof CheckStepSchema>
export type PhotoStep = z.output<typeof PhotoStepSchema>
export type PlannerStep = z.output<typeof PlannerStepSchema>
export type SignoffStep = z.output<typeof SignoffStepSchema>
export type Procedure = z.output<typeof ProcedureSchema>
export type ProcedureInput = z.input<typeof ProcedureSchema>

export type ProcedureResult = { ok: true, procedure: Procedure } | { ok: false, issues: FieldIssue[] }

/** Validates a procedure version; issues carry paths like `steps.3.hazard`. */
export function parseProcedure(input: unknown): ProcedureResult {
  const parsed = ProcedureSchema.safeParse(input)
  return parsed.success ? { ok: true, procedure: parsed.data } : { ok: false, issues: toIssues(parsed.error) }
}

export { rangeStatus, describeRange } from './range'

// Storage shape: the database keeps the common columns and puts the kind-specific fields in a
// JSON `settings` column (server/database/schema.ts, procedure_steps).
const COMMON_FIELDS = new Set(['key', 'kind', 'title', 'body', 'guidance'])

export interface StepRow {
  key: string
  kind: StepKind
  title: string
  body: string
  guidance: string | null
  settings: Record<string, unknown> | null
}

/** Splits a validated step into its stored columns. */
export function stepToRow(step: ProcedureStep): StepRow {
  const settings: Record<string, unknown> = {}
  for (const [k, v] of Object.entries(step)) if (!COMMON_FIELDS.has(k) && v !== undefined) settings[k] = v
  return {
    key: step.key,
    kind: step.kind,
    title: step.title,
    body: step.body,
    guidance: step.guidance === '' ? null : step.guidance,
    settings: Object.keys(settings).length > 0 ? settings : null,
  }
}

/** Rebuilds and re-validates a stored step, so a bad row is reported instead of trusted. */
export function stepFromRow(row: StepRow): { ok: true, step: ProcedureStep } | { ok: false, issues: FieldIssue[] } {
  const parsed = ProcedureStepSchema.safeParse({
    ...(row.settings ?? {}),
    key: row.key,
    kind: row.kind,
    title: row.title,
    body: row.body,
    guidance: row.guidance ?? '',
  })
  return parsed.success ? { ok: true, step: parsed.data } : { ok: false, issues: toIssues(parsed.error) }
}

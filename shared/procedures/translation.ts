import { z } from 'zod/mini'
import { LANGUAGE_CODE } from '../rules/language'
import type { ProcedureStep } from './schema'
import { STEP_KEY_PATTERN } from './step-key'
import { plainTextProblem } from './text'
import { ORIGINAL_LANGUAGE, stepTexts, type StepTextField } from './localize'

export * from './localize'

// A procedure version's translations (issue 16): per language, the version's title and summary
// and, step by step, the words a person reads. Keys, kinds, ranges, units and signal words are
// the original's and are never translated. Stored beside the version (procedure_versions.
// translations); the original never changes. The schemas are zod/mini and the reading of them
// (localize.ts) is apart, so the Run screen loads no zod for it (issue 14).

// Translations run longer than the English (Spanish by about a quarter), so each limit is
// half again the original's (shared/procedures/schema.ts).
const LIMITS: Record<StepTextField | 'summary' | 'procedureTitle', number> = {
  procedureTitle: 180, summary: 900, title: 150, body: 1200, hazard: 750, avoid: 900, label: 120, subject: 300, statement: 600, guidance: 2200,
}

function translated(label: string, max: number) {
  return z.optional(z.string({ error: `${label} must be text.` }).check(
    z.trim(),
    z.maxLength(max, `${label} must be at most ${max} characters.`),
    z.superRefine((value, ctx) => {
      const plain = plainTextProblem(value)
      if (plain) ctx.addIssue({ code: 'custom', message: `${label} ${plain}.` })
    }),
  ))
}

export const StepTranslationSchema = z.strictObject({
  title: translated('Translated title', LIMITS.title),
  body: translated('Translated text', LIMITS.body),
  hazard: translated('Translated hazard statement', LIMITS.hazard),
  avoid: translated('Translated way to avoid the hazard', LIMITS.avoid),
  label: translated('Translated value label', LIMITS.label),
  subject: translated('Translated photo subject', LIMITS.subject),
  statement: translated('Translated sign-off statement', LIMITS.statement),
  guidance: translated('Translated guidance', LIMITS.guidance),
  /** Carried over from the previous version for an unchanged step; a trainer confirms it. */
  draft: z.optional(z.boolean({ error: 'Draft must be true or false.' })),
}, { error: 'Each step translation must be an object of texts.' })
export type StepTranslation = z.output<typeof StepTranslationSchema>

export const VersionTranslationSchema = z.strictObject({
  title: translated('Translated procedure title', LIMITS.procedureTitle),
  summary: translated('Translated summary', LIMITS.summary),
  steps: z.record(
    z.string().check(
      z.regex(STEP_KEY_PATTERN, 'Step key may use only lower-case letters, digits and single hyphens (e.g. "isolate-power").'),
      z.maxLength(60, 'Step key must be at most 60 characters.'),
    ),
    StepTranslationSchema,
    { error: 'Steps must be an object of translations by step key.' },
  ),
}, { error: 'A translation must be an object with a title, summary and steps.' })
export type VersionTranslation = z.output<typeof VersionTranslationSchema>

export const TranslationsSchema = z.record(
  z.string().check(z.regex(LANGUAGE_CODE, 'Language must be a two- or three-letter code such as "es".')),
  VersionTranslationSchema,
)
export type Translations = z.output<typeof TranslationsSchema>

/** Reads a stored translations column; a language whose entry no longer passes is left out. */
export function readTranslations(stored: unknown): Translations {
  const out: Translations = {}
  if (!stored || typeof stored !== 'object') return out
  for (const [lang, value] of Object.entries(stored)) {
    if (!LANGUAGE_CODE.test(lang)) continue
    const parsed = VersionTranslationSchema.safeParse(value)
    if (parsed.success) out[lang] = parsed.data
  }
  return out
}

/**
 * Titles in `lang` from a version's translations as stored (checked here, readTranslations),
 * each falling back to the original: the procedure's, and a step's by its key.
 */
export function storedTitlesIn(stored: unknown, lang: string) {
  const t = lang === ORIGINAL_LANGUAGE ? undefined : readTranslations(stored)[lang]
  return {
    procedure: (original: string) => t?.title || original,
    step: (key: string, original: string) => t?.steps[key]?.title || original,
  }
}

/**
 * A new version's translations from the previous one's: every step whose key and original
 * texts did not change keeps its translation, marked as a draft for a trainer to confirm;
 * changed and new steps start untranslated. Titles and summaries carry over as they are only
 * when they did not change either.
 */
export function carryTranslations(
  before: { title: string, summary: string, steps: ProcedureStep[], translations: Translations },
  after: { title: string, summary: string, steps: ProcedureStep[] },
): Translations {
  const out: Translations = {}
  const old = new Map(before.steps.map(s => [s.key, s]))
  for (const [lang, tr] of Object.entries(before.translations)) {
    const steps: Record<string, StepTranslation> = {}
    for (const step of after.steps) {
      const prev = old.get(step.key)
      const t = tr.steps[step.key]
      if (!prev || !t || prev.kind !== step.kind) continue
      if (JSON.stringify(stepTexts(prev)) !== JSON.stringify(stepTexts(step))) continue
      steps[step.key] = { ...t, draft: true }
    }
    const entry: VersionTranslation = { steps }
    if (tr.title && before.title === after.title) entry.title = tr.title
    if (tr.summary && before.summary === after.summary) entry.summary = tr.summary
    if (Object.keys(steps).length || entry.title || entry.summary) out[lang] = entry
  }
  return out
}

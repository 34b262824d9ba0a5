import type { ProcedureStep } from './schema'
import type { Translations } from './translation'

// A procedure version in a reader's language (issue 16), without the translation schemas
// (translation.ts): the Run screen reads translations and needs no zod for it (issue 14).

/** The language procedures are written in. A shop writing in another language is a later issue. */
export const ORIGINAL_LANGUAGE = 'en'

/** Every text a step may carry, in reading order. */
export const STEP_TEXT_FIELDS = ['title', 'body', 'hazard', 'avoid', 'label', 'subject', 'statement', 'guidance'] as const
export type StepTextField = typeof STEP_TEXT_FIELDS[number]

/** The texts a step has in the original (empty fields are not asked to be translated). */
export function stepTexts(step: ProcedureStep): Partial<Record<StepTextField, string>> {
  const out: Partial<Record<StepTextField, string>> = {}
  const s = step as Record<string, unknown>
  for (const f of STEP_TEXT_FIELDS) if (typeof s[f] === 'string' && (s[f] as string).trim()) out[f] = s[f] as string
  return out
}

export interface LocalizedStep {
  step: ProcedureStep
  /** 'full': every text in the language; 'partial': some fall back to the original; 'none'. */
  coverage: 'full' | 'partial' | 'none'
  /** The language of the text shown (the original's when nothing is translated). */
  lang: string
  draft: boolean
}

/** The step as a reader of `lang` sees it: translated texts over the original's. */
export function localizeStep(step: ProcedureStep, translations: Translations | null | undefined, lang: string): LocalizedStep {
  if (lang === ORIGINAL_LANGUAGE) return { step, coverage: 'full', lang, draft: false }
  const t = translations?.[lang]?.steps[step.key]
  const texts = stepTexts(step)
  const fields = Object.keys(texts) as StepTextField[]
  const done = fields.filter(f => t?.[f])
  if (!t || done.length === 0) return { step, coverage: 'none', lang: ORIGINAL_LANGUAGE, draft: false }
  const merged = { ...step } as Record<string, unknown>
  for (const f of done) merged[f] = t[f]
  return { step: merged as ProcedureStep, coverage: done.length === fields.length ? 'full' : 'partial', lang, draft: !!t.draft }
}

/** The procedure's title in `lang`, or the original's. */
export function localizedTitle(version: { title: string, translations?: Translations | null }, lang: string) {
  return (lang !== ORIGINAL_LANGUAGE && version.translations?.[lang]?.title) || version.title
}

import type { H3Event } from 'h3'
import { getCookie, getRequestHeader } from 'h3'
import locales from '#jogwise-locales'
import { chooseLanguage, LANGUAGE_COOKIE, translateIssues, translateText, type FieldIssue, type MessageTree } from '#shared/i18n/translate'

/** Every language the app has a file for (i18n/locales), English first. */
export const LANGUAGES: readonly string[] = ['en', ...Object.keys(locales).filter(l => l !== 'en').sort()]

export function isLanguage(value: unknown): value is string {
  return typeof value === 'string' && LANGUAGES.includes(value)
}

/** The language of whoever made the request (shared/i18n/translate.ts chooseLanguage). */
export function callerLanguage(event: H3Event): string {
  return chooseLanguage(LANGUAGES, {
    chosen: (event.context.shopUser as { language?: string | null } | undefined)?.language,
    cookie: getCookie(event, LANGUAGE_COOKIE),
    acceptLanguage: getRequestHeader(event, 'accept-language'),
  })
}

function section(lang: string, name: string): MessageTree {
  return ((locales[lang] ?? locales.en) as Record<string, MessageTree>)[name] ?? {}
}

/** An English server or zod message in `lang` (shared/i18n/translate.ts). */
export function textIn(lang: string, text: string) {
  return translateText(text, section('en', 'errors'), section(lang, 'errors'))
}

export function issuesIn(lang: string, issues: FieldIssue[]) {
  return translateIssues(issues, section('en', 'errors'), section(lang, 'errors'))
}

/** A message by key (`mail.override.subject`) in `lang`, English when that language lacks it. */
export function messageIn(lang: string, key: string, values: Record<string, string | number> = {}, count?: number): string {
  const find = (tree: unknown) => key.split('.').reduce<unknown>((node, part) => (node && typeof node === 'object') ? (node as Record<string, unknown>)[part] : undefined, tree)
  const found = find(locales[lang]) ?? find(locales.en)
  if (typeof found !== 'string') return key
  const template = count === undefined ? found : pluralForm(found, count)
  return template.replace(/\{(\w+)\}/g, (whole, name: string) => name in values ? String(values[name]) : whole)
}

/**
 * The form of "one | many" (or "none | one | many") for `count`, chosen as vue-i18n's default
 * rule does, so a message reads the same on the screen and in mail.
 */
export function pluralForm(message: string, count: number): string {
  const forms = message.split(' | ')
  const n = Math.abs(count)
  const index = forms.length === 2 ? (n === 1 ? 0 : 1) : forms.length > 2 ? Math.min(n, 2) : 0
  return forms[index] ?? forms[0]!
}

import { translateText, type MessageTree } from '#shared/i18n/translate'

// Messages made in English by shared code on the tablet (zod schemas, reasonProblem, makeEvent)
// or kept from a server answer, shown in the screen's language through the same templates as
// the server uses (shared/i18n/translate.ts, the `errors` section of each locale file).
function plain(tree: unknown): MessageTree {
  const out: MessageTree = {}
  if (!tree || typeof tree !== 'object') return out
  for (const [k, v] of Object.entries(tree as Record<string, unknown>)) {
    // A message compiled ahead of time keeps its text in `source` (vue-i18n).
    const text = typeof v === 'string' ? v : (v as { source?: unknown, loc?: { source?: unknown } } | null)?.source ?? (v as { loc?: { source?: unknown } } | null)?.loc?.source
    if (typeof text === 'string') out[k] = text
    else if (v && typeof v === 'object') out[k] = plain(v)
  }
  return out
}

export function useErrorText() {
  const { locale, getLocaleMessage } = useI18n()
  const english = computed(() => plain((getLocaleMessage('en') as Record<string, unknown>).errors))
  const target = computed(() => plain((getLocaleMessage(locale.value) as Record<string, unknown>).errors))
  return (text: string | null | undefined) => {
    if (!text || locale.value === 'en') return text ?? ''
    return translateText(text, english.value, target.value)
  }
}

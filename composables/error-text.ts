import { translateText, type MessageTree } from '#shared/i18n/translate'

// Messages made in English by shared code on the tablet (zod schemas, reasonProblem, makeEvent)
// or kept from a server answer, shown in the screen's language through the same templates as
// the server uses (shared/i18n/translate.ts, the `errors` section of each locale file).
const errorsOf = (tree: MessageTree): MessageTree => {
  const errors = tree.errors
  return errors && typeof errors === 'object' ? errors : {}
}

export function useErrorText() {
  const { locale, getLocaleMessage } = useI18n()
  const english = computed(() => errorsOf(getLocaleMessage('en')))
  const target = computed(() => errorsOf(getLocaleMessage(locale.value)))
  return (text: string | null | undefined) => {
    if (!text || locale.value === 'en') return text ?? ''
    return translateText(text, english.value, target.value)
  }
}

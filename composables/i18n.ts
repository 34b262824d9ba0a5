import { languages } from '#jogwise-languages'
import { renderMessage, type MessageValues } from '#shared/i18n/render'
import { chooseLanguage, flatten, LANGUAGE_COOKIE, type MessageTree } from '#shared/i18n/translate'

// The screens' texts in the person's language. Jogwise's own small layer in place of a full
// i18n library (issue 14: the Run screen carried about 17 KB gzip of one), with the same few
// calls the screens use: t, te, locale, locales, localeCodes, setLocale, getLocaleMessage.
// The messages are the files in i18n/locales, served as data (modules/languages.ts); English
// fills in any key a language lacks, and a key nobody wrote shows as itself.

const LANGUAGE_STATE = 'jogwise-language'
const CODES = languages.map(l => l.code)

/** Every language's messages once loaded, whole and by dotted key (the same for every request). */
const trees = shallowReactive<Record<string, MessageTree>>({})
const flat = shallowReactive<Record<string, Record<string, string>>>({})
const loading = new Map<string, Promise<void>>()

// The server, and the component tests' Nuxt environment, read the files as modules; the browser
// fetches them (the service worker answers offline), so they are never part of a script.
const bundled = import.meta.server || import.meta.test
  ? import.meta.glob<MessageTree>('../i18n/locales/*.json', { import: 'default' })
  : undefined

async function fetchLanguage(code: string): Promise<MessageTree> {
  if (bundled) return bundled[`../i18n/locales/${code}.json`]!()
  return $fetch<MessageTree>(languages.find(l => l.code === code)!.file)
}

/** Loads a language's messages once; a failed load is tried again on the next call. */
export function loadLanguage(code: string): Promise<void> {
  if (trees[code] || !CODES.includes(code)) return Promise.resolve()
  let pending = loading.get(code)
  if (!pending) {
    pending = fetchLanguage(code).then((tree) => {
      trees[code] = tree
      flat[code] = flatten(tree)
    }).finally(() => loading.delete(code))
    loading.set(code, pending)
  }
  return pending
}

/**
 * The language a screen starts in, by the server's own rule (chooseLanguage): the signed-in
 * person's choice, else the tablet's cookie, else the browser's languages, else English.
 */
export function startingLanguage(chosen: string | null | undefined, cookieHeader: string | undefined | null, acceptLanguage: string | undefined | null) {
  return chooseLanguage(CODES, { chosen, cookie: cookieIn(cookieHeader, LANGUAGE_COOKIE), acceptLanguage })
}

/** The message text under a dotted key, in `code` and else in English. */
function textOf(code: string, key: string): string | undefined {
  return flat[code]?.[key] ?? flat.en?.[key]
}

export function useI18n() {
  const locale = useState<string>(LANGUAGE_STATE, () => 'en')

  /** t(key), t(key, values), t(key, values, count) or t(key, count): the count picks the plural form. */
  function t(key: string, values?: MessageValues | number, count?: number): string {
    const text = textOf(locale.value, key)
    if (text === undefined) return key
    return typeof values === 'number' ? renderMessage(text, {}, values) : renderMessage(text, values, count)
  }

  async function setLocale(code: string) {
    if (!CODES.includes(code)) return
    await Promise.all([loadLanguage('en'), loadLanguage(code)])
    locale.value = code
    // Remembered by the tablet for the sign-in screen and for a reload before the profile is read.
    if (import.meta.client) rememberInCookie(LANGUAGE_COOKIE, code)
  }

  return {
    t,
    /** Whether the screen's language has the key (not counting English filling in). */
    te: (key: string) => flat[locale.value]?.[key] !== undefined,
    /** The raw text of a message, for a component that places parts of it (UiMessage). */
    message: (key: string) => textOf(locale.value, key) ?? key,
    locale,
    locales: computed(() => languages),
    localeCodes: computed(() => CODES),
    setLocale,
    getLocaleMessage: (code: string): MessageTree => trees[code] ?? {},
  }
}
